// What a validation (or import) found: the counts, the codes it would create, and every refused row with
// its row number, column and reason, as the server reported them.
import { delimiterLabels } from "../../../shared/import/delimiter";
import type { ImportSummary } from "../../../shared/import/api";
import { DataTable, type Column } from "../../components/DataTable";
import { Notice } from "../../components/Notice";
import { formatCount, plural } from "./labels";
import { DownloadIcon } from "../../components/DownloadIcon";

type Issue = ImportSummary["issues"][number] & { key: number };

const issueColumns: Column<Issue>[] = [
  {
    key: "row",
    header: "Row",
    value: (issue) => issue.row,
    render: (issue) => (issue.row === null ? "Header" : formatCount(issue.row)),
    align: "right",
    sortLabels: { asc: "first rows first", desc: "last rows first" },
  },
  {
    key: "column",
    header: "Column",
    value: (issue) => issue.column ?? "",
    render: (issue) => (issue.column ? <span className="font-mono">{issue.column}</span> : <span className="text-muted">whole row</span>),
  },
  { key: "reason", header: "Reason", value: (issue) => issue.reason, wrap: true, primary: true },
];

export interface ValidationReportProps {
  summary: ImportSummary;
  /** The server's download of every refused row with its reason, when there are any. */
  rejectedCsvUrl: string | null;
}

/** The headline sentence for a summary. */
export function summarySentence(summary: ImportSummary): string {
  const things = summary.unit === "attempts" ? "attempts" : "rows";
  const good = summary.inserted + summary.updated + summary.unchanged;
  if (summary.status === "imported") {
    return summary.rejected > 0
      ? `Imported ${plural(good, summary.unit === "attempts" ? "attempt" : "row")}; ${plural(summary.rejected, "refused row")} kept in the import history to fix.`
      : `Imported every one of the ${formatCount(good)} ${things}.`;
  }
  if (summary.status === "unchanged") return `Nothing changed: all ${formatCount(good)} ${things} are already stored as in this file. No batch was recorded.`;
  if (summary.status === "validated" && summary.inserted + summary.updated === 0 && summary.rejected === 0) {
    return `Nothing would change: all ${formatCount(good)} ${things} are already stored as in this file.`;
  }
  if (summary.status === "validated") return `All ${formatCount(good)} ${things} can be imported. Nothing has been written yet.`;
  if (good === 0) return `No ${things} can be imported as the file stands. Nothing has been written.`;
  return `${plural(summary.rejected, "row")} of ${formatCount(summary.rowsRead)} ${summary.rejected === 1 ? "has" : "have"} problems. Nothing has been written yet.`;
}

export function ValidationReport({ summary, rejectedCsvUrl }: ValidationReportProps) {
  const dry = summary.dryRun;
  const attempts = summary.unit === "attempts";
  const issues: Issue[] = summary.issues.map((issue, key) => ({ ...issue, key }));
  const newCodes = [
    ...summary.newCodes.sites.map((code) => `site ${code}`),
    ...summary.newCodes.instructors.map((code) => `instructor ${code}`),
    ...summary.newCodes.manikins.map((code) => `manikin ${code}`),
  ];

  const counts: { label: string; value: number; note?: string }[] = [
    { label: "Rows read", value: summary.rowsRead, note: attempts && summary.attemptsRead !== null ? `${plural(summary.attemptsRead, "attempt")}` : undefined },
    { label: dry ? "Would be added" : "Added", value: summary.inserted, note: attempts ? "attempts" : "rows" },
    { label: dry ? "Would be updated" : "Updated", value: summary.updated, note: attempts ? "attempts" : "rows" },
    { label: "Unchanged", value: summary.unchanged, note: attempts ? "attempts, already the same" : "rows, already the same" },
    {
      label: "Refused",
      value: summary.rejected,
      note: attempts && summary.attemptsRejected !== null ? `rows (${plural(summary.attemptsRejected, "attempt")})` : "rows",
    },
    { label: "New codes", value: newCodes.length },
  ];

  return (
    <div className="flex flex-col gap-4">
      <p className="text-lead font-semibold">{summarySentence(summary)}</p>
      {summary.delimiter && <p className="text-small text-muted">Columns separated by {delimiterLabels[summary.delimiter]}.</p>}

      <dl className="grid grid-cols-2 gap-3 sm:grid-cols-3 lg:grid-cols-6">
        {counts.map((count) => (
          <div
            key={count.label}
            className={`rounded-card border bg-surface p-3 shadow-card ${count.label === "Refused" && count.value > 0 ? "border-danger-line" : "border-line"}`}
          >
            <dt className="text-small font-semibold text-muted">{count.label}</dt>
            <dd className="text-headline tabular-nums">{formatCount(count.value)}</dd>
            {count.note && <dd className="text-caption text-muted">{count.note}</dd>}
          </div>
        ))}
      </dl>

      {newCodes.length > 0 && (
        <Notice tone="info">
          {dry ? "These codes are not known yet and would be created" : "These codes were new and have been created"}: {newCodes.join(", ")}. A typing slip in a
          code creates a new site, instructor or manikin, so check them.
        </Notice>
      )}

      {summary.warnings.length > 0 && (
        <div className="rounded-control border border-line bg-surface px-4 py-3 text-small">
          <p className="font-semibold">Warnings (these do not stop the import)</p>
          <ul className="mt-1 list-disc pl-5">
            {summary.warnings.map((warning, i) => (
              <li key={i}>{warning}</li>
            ))}
          </ul>
        </div>
      )}

      {summary.issuesTotal > 0 && (
        <section aria-labelledby="issues-heading" className="flex flex-col gap-2">
          <div className="flex flex-wrap items-end justify-between gap-3">
            <div>
              <h4 id="issues-heading" className="text-lead font-semibold">
                Problems found ({formatCount(summary.issuesTotal)})
              </h4>
              <p className="text-small text-muted">
                Row 1 is the first data row after the header; a spreadsheet shows it as line 2. “Header” means the header row itself.
              </p>
            </div>
            {rejectedCsvUrl && (
              <a
                href={rejectedCsvUrl}
                download
                className="inline-flex min-h-11 items-center gap-2 rounded-control border border-line-strong bg-surface px-4 font-medium text-dusk-800 hover:bg-dusk-50"
              >
                <DownloadIcon />
                Download the refused rows (CSV)
              </a>
            )}
          </div>
          {summary.issuesTotal > summary.issues.length && (
            <p className="text-small">
              Showing the first {formatCount(summary.issues.length)} of {formatCount(summary.issuesTotal)} problems. The download holds every refused row.
            </p>
          )}
          <DataTable
            caption="Problems found"
            captionHidden
            columns={issueColumns}
            rows={issues}
            rowKey={(issue) => issue.key}
            filterable={issues.length > 10}
            emptyMessage="No problems."
          />
        </section>
      )}
    </div>
  );
}
