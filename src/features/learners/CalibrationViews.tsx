// An instructor's pass/fail against the measurement: their 2×2 table, the shares of measured failures they
// passed and measured passes they failed (Wilson 95 % intervals), kappa with its interval and in words, and
// where they sit among instructors. The instructor's own view names nobody else; the quality lead's lists all.
import type { CalibrationAnswer, CalibrationRow } from "../../../shared/schemas/learners";
import { calibrationNames } from "../../../shared/vocabulary";
import { rangeLabel } from "../../../shared/period";
import { DataTable, type Column } from "../../components/DataTable";
import { formatCount, formatFixed, formatInterval, formatPercent, kappaWords, percentValue } from "../insight/format";

function formatKappa(kappa: number | null, interval: [number, number] | null): string {
  if (kappa === null) return "–";
  return `${formatFixed(kappa, 2)}${interval ? ` (${formatFixed(interval[0], 2)} to ${formatFixed(interval[1], 2)})` : ""}`;
}

function ordinal(n: number): string {
  const tens = n % 100;
  if (tens >= 11 && tens <= 13) return `${n}th`;
  return `${n}${["th", "st", "nd", "rd"][n % 10] ?? "th"}`;
}

/** Whom the sentences speak of: the signed-in instructor ("you") or, for the quality lead, an instructor by code. */
export interface Subject {
  you: boolean;
  code: string;
}
const YOU: Subject = { you: true, code: "" };

/** The 2×2 table of one instructor's judgement against the measurement. */
export function CalibrationTable({ row, subject = YOU }: { row: CalibrationRow; subject?: Subject }) {
  const who = subject.you ? "You" : subject.code;
  const cell = "border border-line px-3 py-2 text-right tabular-nums";
  const head = "border border-line bg-surface px-3 py-2 text-left font-semibold";
  // column headings over right-aligned counts stand right-aligned too
  const columnHead = "border border-line bg-surface px-3 py-2 text-right font-semibold";
  return (
    <table className="border-collapse text-small">
      <caption className="mb-1 text-left font-semibold">
        {subject.you ? "Your" : `${subject.code}'s`} judgement against the measurement ({formatCount(row.judged)} attempts {subject.you ? "you" : "they"}{" "}
        marked)
      </caption>
      <thead>
        <tr>
          <td className="border border-line px-3 py-2" />
          <th scope="col" className={columnHead}>
            Measured pass
          </th>
          <th scope="col" className={columnHead}>
            Measured fail
          </th>
        </tr>
      </thead>
      <tbody>
        <tr>
          <th scope="row" className={head}>
            {who} passed
          </th>
          <td className={cell}>{formatCount(row.both_pass)}</td>
          <td className={cell}>{formatCount(row.instructor_pass_measured_fail)}</td>
        </tr>
        <tr>
          <th scope="row" className={head}>
            {who} failed
          </th>
          <td className={cell}>{formatCount(row.instructor_fail_measured_pass)}</td>
          <td className={cell}>{formatCount(row.both_fail)}</td>
        </tr>
      </tbody>
    </table>
  );
}

/** One instructor's calibration in sentences, with where they sit among the ranked instructors. */
export function CalibrationWords({ row, ranked, subject = YOU }: { row: CalibrationRow; ranked: number; subject?: Subject }) {
  const who = subject.you ? "you" : subject.code;
  const measuredFail = row.instructor_pass_measured_fail + row.both_fail;
  const measuredPass = row.both_pass + row.instructor_fail_measured_pass;
  return (
    <ul className="flex list-disc flex-col gap-1 pl-5">
      <li>
        Of {formatCount(measuredFail)} attempts the manikin measured as failing, {who} passed {formatCount(row.instructor_pass_measured_fail)}:{" "}
        <strong>{formatPercent(row.lenient_share)}</strong> (95 % interval {formatInterval(row.lenient_ci95?.[0], row.lenient_ci95?.[1])}).
      </li>
      <li>
        Of {formatCount(measuredPass)} attempts measured as passing, {who} failed {formatCount(row.instructor_fail_measured_pass)}:{" "}
        <strong>{formatPercent(row.strict_share)}</strong> (95 % interval {formatInterval(row.strict_ci95?.[0], row.strict_ci95?.[1])}).
      </li>
      <li>
        Kappa {formatKappa(row.kappa, row.kappa_ci95)}: {kappaWords(row.kappa)} beyond chance.
      </li>
      {row.lenient_rank !== null && (
        <li>
          Among {ranked} instructors {who} {subject.you ? "pass" : "passes"} the {row.lenient_rank === 1 ? "largest" : `${ordinal(row.lenient_rank)} largest`}{" "}
          share of measured failures.
        </li>
      )}
    </ul>
  );
}

export function OwnCalibration({ answer }: { answer: CalibrationAnswer }) {
  const row = answer.rows[0];
  if (!row || row.judged === 0) {
    return <p>You marked no attempts pass or fail in {rangeLabel(answer.period)}, so there is nothing to compare with the measurement.</p>;
  }
  const others = answer.others.filter((o) => o.lenient_share !== null).map((o) => o.lenient_share!);
  return (
    <div className="flex flex-col gap-4">
      <CalibrationTable row={row} />
      <CalibrationWords row={row} ranked={answer.ranked} />
      <p className="text-small text-muted">
        {others.length > 0
          ? `Other instructors (not named) passed between ${formatPercent(Math.min(...others))} and ${formatPercent(Math.max(...others))} of the measured failures they judged.`
          : "No other instructor's figures can be shown for this period."}
        {answer.othersHidden > 0 ? ` ${answer.othersHidden} instructor${answer.othersHidden === 1 ? "" : "s"} judged too few attempts to be shown.` : ""} Only
        you and the network's quality lead and coordinator see this page's figures for you.
      </p>
    </div>
  );
}

const allColumns: Column<CalibrationRow>[] = [
  { key: "instructor", header: "Instructor", value: (r) => `${r.instructor.code} · ${r.instructor.name}`, primary: true },
  { key: "judged", header: "Judged", value: (r) => r.judged, render: (r) => formatCount(r.judged), align: "right" },
  { key: "both_pass", header: "Both pass", headerWrap: true, value: (r) => r.both_pass, align: "right" },
  { key: "pass_fail", header: "Passed, measured fail", headerWrap: true, value: (r) => r.instructor_pass_measured_fail, align: "right" },
  { key: "fail_pass", header: "Failed, measured pass", headerWrap: true, value: (r) => r.instructor_fail_measured_pass, align: "right" },
  { key: "both_fail", header: "Both fail", headerWrap: true, value: (r) => r.both_fail, align: "right" },
  {
    key: "lenient",
    header: calibrationNames.lenient,
    headerWrap: true,
    value: (r) => percentValue(r.lenient_share),
    render: (r) => formatPercent(r.lenient_share),
    align: "right",
  },
  { key: "lenient_ci", header: "95 % interval", headerWrap: true, value: (r) => formatInterval(r.lenient_ci95?.[0], r.lenient_ci95?.[1]), align: "right" },
  {
    key: "strict",
    header: calibrationNames.strict,
    headerWrap: true,
    value: (r) => percentValue(r.strict_share),
    render: (r) => formatPercent(r.strict_share),
    align: "right",
  },
  { key: "strict_ci", header: "95 % interval ", headerWrap: true, value: (r) => formatInterval(r.strict_ci95?.[0], r.strict_ci95?.[1]), align: "right" },
  { key: "kappa", header: calibrationNames.kappa, value: (r) => r.kappa, render: (r) => formatKappa(r.kappa, r.kappa_ci95), align: "right" },
  { key: "kappa_words", header: "In words", value: (r) => kappaWords(r.kappa) },
];

export function AllCalibration({ answer }: { answer: CalibrationAnswer }) {
  const ranked = [...answer.rows].filter((r) => r.lenient_rank !== null).sort((a, b) => a.lenient_rank! - b.lenient_rank!);
  const most = ranked[0];
  return (
    <div className="flex flex-col gap-3">
      {most && (
        <p>
          Most lenient in {rangeLabel(answer.period)}: <strong>{most.instructor.code}</strong> passed {formatPercent(most.lenient_share)} of measured failures
          (95 % interval {formatInterval(most.lenient_ci95?.[0], most.lenient_ci95?.[1])}).
        </p>
      )}
      <DataTable
        caption="Each instructor's judgement against the measurement"
        columns={allColumns}
        rows={answer.rows}
        rowKey={(r) => r.instructor.id}
        exportFileName="instructor-calibration"
        initialSort={{ key: "lenient", direction: "desc" }}
        emptyMessage="No instructor marked an attempt in this period."
      />
    </div>
  );
}

/** One instructor's calibration on their page, for those who see every instructor. */
export function InstructorCalibration({ answer, instructorId }: { answer: CalibrationAnswer; instructorId: number }) {
  const row = answer.rows.find((r) => r.instructor.id === instructorId);
  if (!row || row.judged === 0) return <p>This instructor marked no attempts pass or fail in {rangeLabel(answer.period)}.</p>;
  const subject = { you: false, code: row.instructor.code };
  return (
    <div className="flex flex-col gap-3">
      <CalibrationTable row={row} subject={subject} />
      <CalibrationWords row={row} ranked={answer.ranked} subject={subject} />
    </div>
  );
}
