// A page of attempts: the numbers that decide the result, the result with its errors in words, and a mark
// where a compression stream can be looked at.
import { Link, useLocation } from "react-router";
import type { AttemptRow } from "../../../shared/schemas/insight";
import { formatLength, type LengthUnit } from "../../../shared/units";
import { DataTable, type Column } from "../../components/DataTable";
import { TargetBadge } from "../../components/TargetBadge";
import { dateTime, errorLabel } from "./labels";
import { dimensionNames, feedbackNames, patientTypeNames } from "../../../shared/vocabulary";

export function attemptColumns(unit: LengthUnit, from: string): Column<AttemptRow>[] {
  const pct = (value: number) => Math.round(value);
  return [
    {
      key: "id",
      header: "Attempt",
      value: (a) => a.id,
      primary: true,
      render: (a) => (
        <Link to={`/attempts/${encodeURIComponent(a.id)}`} state={{ from }} className="font-semibold text-dusk-700 underline underline-offset-2 hover:text-dusk-900">
          {a.id}
        </Link>
      ),
    },
    { key: "startedAt", header: "Started", value: (a) => a.startedAt, render: (a) => dateTime(a.startedAt), sortLabels: { asc: "oldest first", desc: "newest first" } },
    {
      key: "passed",
      header: "Result",
      value: (a) => (a.passed ? "Passed" : "Not passed"),
      render: (a) => <TargetBadge status={a.passed ? "on_target" : "too_low"} label={a.passed ? "Passed" : "Not passed"} />,
    },
    { key: "score", header: "Score", value: (a) => Math.round(a.score), align: "right" },
    { key: "errors", header: "Errors", value: (a) => (a.errors.length ? a.errors.map(errorLabel).join("; ") : ""), wrap: true, render: (a) => (a.errors.length ? <ErrorList errors={a.errors} /> : <span className="text-muted">None</span>) },
    {
      key: "stream",
      header: "Stream",
      value: (a) => (a.hasStream ? "Yes" : "No"),
      render: (a) =>
        a.hasStream ? (
          <span className="inline-flex items-center gap-1 rounded-full border border-dusk-300 bg-dusk-50 px-2 py-0.5 text-caption font-semibold text-dusk-800">
            <svg viewBox="0 0 16 10" className="h-2.5 w-4" aria-hidden="true">
              <path d="M1 5h2l1.5-4 2 8 2-8 2 8 1.5-4h3" fill="none" stroke="currentColor" strokeWidth="1.4" strokeLinejoin="round" />
            </svg>
            Stream
          </span>
        ) : (
          <span className="text-muted">Summary</span>
        ),
    },
    { key: "depth", header: `Mean depth (${unit})`, value: (a) => Number(formatLength(a.metrics.depthMm, unit).split(" ")[0]), align: "right" },
    { key: "depthOk", header: "Depth on target (%)", value: (a) => pct(a.metrics.depthOkPct), align: "right" },
    { key: "rate", header: "Rate (/min)", value: (a) => Math.round(a.metrics.rateCpm), align: "right" },
    { key: "rateOk", header: "Rate on target (%)", value: (a) => pct(a.metrics.rateOkPct), align: "right" },
    { key: "recoilOk", header: "Full recoil (%)", value: (a) => pct(a.metrics.recoilOkPct), align: "right" },
    { key: "handsOn", header: "Hands-on (%)", value: (a) => pct(a.metrics.handsOnPct), align: "right" },
    { key: "longestPause", header: "Longest pause (s)", value: (a) => Number(a.metrics.longestPauseS.toFixed(1)), align: "right" },
    { key: "learner", header: "Learner", value: (a) => a.learner },
    { key: "site", header: "Site", value: (a) => a.site?.code ?? null },
    { key: "instructor", header: "Instructor", value: (a) => a.instructor?.code ?? null },
    { key: "manikin", header: "Manikin", value: (a) => a.manikin?.assetId ?? null },
    { key: "profile", header: dimensionNames.patientType, value: (a) => patientTypeNames[a.profile] },
    { key: "feedback", header: dimensionNames.feedback, value: (a) => feedbackNames[a.feedback] },
  ];
}

function ErrorList({ errors }: { errors: AttemptRow["errors"] }) {
  return (
    <ul className="flex flex-col gap-0.5 sm:min-w-56">
      {errors.map((e) => (
        <li key={e}>{errorLabel(e)}</li>
      ))}
    </ul>
  );
}

export function AttemptsTable({ rows, unit, caption, toolbar }: { rows: readonly AttemptRow[]; unit: LengthUnit; caption: string; toolbar?: React.ReactNode }) {
  const location = useLocation();
  return (
    <DataTable
      caption={caption}
      columns={attemptColumns(unit, `${location.pathname}${location.search}`)}
      rows={rows}
      rowKey={(a) => a.id}
      exportFileName="attempts"
      emptyMessage="No attempts match these filters."
      toolbar={toolbar}
    />
  );
}
