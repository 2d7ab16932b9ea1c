// Recorded completions beside measured passes. Instructors sign learners off in the class log; the manikin
// measures whether the compressions met the targets. The gap between the two is the overview's key message,
// measured like with like: learners recorded as completed against learners who passed at least once.
import { useCallback } from "react";
import type { OverviewAnswer } from "../../../../shared/schemas/insight";
import { Chart, type ChartSize } from "../../../components/Chart";
import { DataTable, type Column } from "../../../components/DataTable";
import { ChartLegend, shapeSwatch } from "../ChartLegend";
import { ink } from "../chartStyle";
import { intervalBarsPlot } from "../charts/intervalPlot";
import { NothingToChart } from "../charts/NothingToChart";
import { formatCount, formatInterval, formatPercent, formatPoints, percentValue, suppressedText } from "../format";
import { Suppressed } from "../Suppressed";

type Rate = OverviewAnswer["passRate"];

const shortLabels: Record<"recorded" | "everPassed" | "firstAttempt" | "measured", string> = {
  recorded: "Recorded",
  everPassed: "At least once",
  firstAttempt: "First attempt",
  measured: "Per attempt",
};

interface MeasureRow {
  key: "recorded" | "everPassed" | "firstAttempt" | "measured";
  label: string;
  counted: string;
  rate: Rate;
}

export const whyGapMatters =
  "Every learner signed off whose compressions did not meet the targets leaves believing their CPR would work, so a wide gap shows where assessment in class needs attention.";

/** Recorded completion against learners who passed at least once: both count learners, so the gap is fair. */
export function gapSentence(recorded: Rate, everPassed: Rate): string | null {
  if (recorded.rate === null || everPassed.rate === null) return null;
  const gap = recorded.rate - everPassed.rate;
  if (Math.abs(gap) < 0.005)
    return `Instructors recorded ${formatPercent(recorded.rate)} of learners as completed, the same as the ${formatPercent(everPassed.rate)} of measured learners who passed on the manikin at least once.`;
  return gap > 0
    ? `Instructors recorded ${formatPercent(recorded.rate)} of learners as completed, but only ${formatPercent(everPassed.rate)} of measured learners passed on the manikin at least once: a gap of ${formatPoints(gap).replace("+", "")}.`
    : `Instructors recorded ${formatPercent(recorded.rate)} of learners as completed, fewer than the ${formatPercent(everPassed.rate)} of measured learners who passed on the manikin at least once (${formatPoints(-gap).replace("+", "")} lower).`;
}

function measureColumns(minCount: number): Column<MeasureRow>[] {
  const hidden = suppressedText(minCount);
  return [
    { key: "label", header: "Measure", value: (r) => r.label },
    { key: "counted", header: "Counted over", value: (r) => r.counted },
    {
      key: "successes",
      header: "Passed or completed",
      value: (r) => r.rate.successes,
      render: (r) => (r.rate.suppressed ? hidden : formatCount(r.rate.successes)),
      align: "right",
    },
    { key: "n", header: "Out of", value: (r) => r.rate.n, render: (r) => (r.rate.suppressed ? hidden : formatCount(r.rate.n)), align: "right" },
    {
      key: "rate",
      header: "Rate (%)",
      value: (r) => percentValue(r.rate.rate),
      render: (r) => (r.rate.suppressed ? hidden : formatPercent(r.rate.rate)),
      align: "right",
    },
    {
      key: "interval",
      header: "95 % interval",
      value: (r) => (r.rate.low === null ? null : formatInterval(r.rate.low, r.rate.high)),
      sortable: false,
      align: "right",
    },
  ];
}

interface AgreementRow {
  instructor: "pass" | "fail";
  measuredPass: number;
  measuredFail: number;
}

const agreementColumns: Column<AgreementRow>[] = [
  // wrapping headers and row names keep this small table near a phone's width
  {
    key: "instructor",
    header: "Instructor's result",
    headerWrap: true,
    wrap: true,
    value: (r) => (r.instructor === "pass" ? "Recorded as passed" : "Recorded as not passed"),
    primary: true,
  },
  { key: "pass", header: "Measured: passed", headerWrap: true, value: (r) => r.measuredPass, align: "right" },
  { key: "fail", header: "Measured: not passed", headerWrap: true, value: (r) => r.measuredFail, align: "right" },
  { key: "total", header: "Total", value: (r) => r.measuredPass + r.measuredFail, align: "right" },
];

export function RecordedVsMeasured({ answer }: { answer: OverviewAnswer }) {
  const min = answer.suppressionMinCount;
  const rows: MeasureRow[] = [
    { key: "recorded", label: "Instructor-recorded completion", counted: "learners in class logs", rate: answer.recordedCompletion },
    { key: "everPassed", label: "Passed at least once", counted: "learners measured", rate: answer.learnerOutcomes.everPassed },
    { key: "firstAttempt", label: "Passed on the first attempt", counted: "learners measured", rate: answer.learnerOutcomes.firstAttempt },
    { key: "measured", label: "Measured pass rate", counted: "manikin attempts", rate: answer.passRate },
  ];
  const plot = useCallback(
    (data: readonly MeasureRow[], size: ChartSize) =>
      intervalBarsPlot(
        data.map((r) => ({
          label: r.label,
          shortLabel: shortLabels[r.key],
          rate: r.rate.rate,
          low: r.rate.low,
          high: r.rate.high,
          fill: r.key === "recorded" ? ink.soft : ink.main,
        })),
        size,
        220,
      ),
    [],
  );
  const sentence = gapSentence(answer.recordedCompletion, answer.learnerOutcomes.everPassed);
  const table = answer.agreement.table;
  const agreementRows: AgreementRow[] = table
    ? [
        { instructor: "pass", measuredPass: table[0][0], measuredFail: table[0][1] },
        { instructor: "fail", measuredPass: table[1][0], measuredFail: table[1][1] },
      ]
    : [];
  const signedOffButFailed = table ? table[0][1] : null;

  return (
    <section aria-labelledby="gap-heading" className="flex flex-col gap-4">
      <h2 id="gap-heading" className="text-title">
        Recorded completions against measured passes
      </h2>
      <div className="rounded-card border-l-4 border-marigold-500 bg-surface p-4 shadow-card">
        {sentence ? (
          <p className="text-lead font-semibold">{sentence}</p>
        ) : (
          <p className="text-lead font-semibold">
            The gap cannot be shown: <Suppressed minCount={min} />.
          </p>
        )}
        <p className="mt-1">
          <strong>Why it matters:</strong> {whyGapMatters}
        </p>
        <p className="mt-1 text-small text-muted">
          Completions count learners in the class logs, so they are set beside learners who passed at least once on the manikin. The measured pass rate counts
          attempts, and a learner may make several.
        </p>
      </div>
      <div className="grid grid-cols-1 gap-4 2xl:grid-cols-2">
        {rows.every((r) => r.rate.rate === null) ? (
          <NothingToChart
            title="Recorded completion and measured pass rate"
            text={`The figures are hidden (${suppressedText(min)}) or have nothing counted.`}
          />
        ) : (
          <Chart
            title="Recorded completion and measured pass rate"
            description={`${sentence ?? "Not enough attempts to compare."} The whiskers are the 95 % intervals: the range the true rate is likely to lie in, given how many were counted.`}
            data={rows}
            columns={measureColumns(min)}
            rowKey={(r) => r.key}
            plot={plot}
            exportFileName="recorded-and-measured"
            legend={
              <ChartLegend
                items={[
                  { label: "Recorded completion", swatch: shapeSwatch("bar", ink.soft) },
                  { label: "Measured on the manikin", swatch: shapeSwatch("bar", ink.main) },
                  { label: "95 % interval", swatch: <path d="M3 6h18M3 2v8M21 2v8" stroke={ink.text} strokeWidth="1.5" fill="none" /> },
                ]}
              />
            }
          />
        )}
        <div className="flex flex-col gap-3 rounded-card border border-line bg-surface p-4 shadow-card">
          <h3 className="text-lead font-semibold">Same attempt, two results</h3>
          {answer.agreement.suppressed ? (
            <p>
              The comparison is hidden: <Suppressed minCount={min} />.
            </p>
          ) : agreementRows.length === 0 || !answer.agreement.pairs ? (
            <p className="text-muted">No attempt carries an instructor's result in this period.</p>
          ) : (
            <>
              <p className="text-small text-muted">
                Attempts where the instructor also recorded a pass or fail: {formatCount(answer.agreement.pairs)}.
                {signedOffButFailed !== null &&
                  ` ${formatCount(signedOffButFailed)} of them (${formatPercent(signedOffButFailed / answer.agreement.pairs)}) were recorded as passed but did not meet the targets.`}
              </p>
              <DataTable
                caption="Instructor's result against the measured result"
                columns={agreementColumns}
                rows={agreementRows}
                rowKey={(r) => r.instructor}
                filterable={false}
                exportFileName="instructor-and-measured-results"
                phoneLayout="scroll"
              />
            </>
          )}
        </div>
      </div>
    </section>
  );
}
