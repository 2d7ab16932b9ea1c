// Class logs as a table: each class links to its page, with what the instructor recorded beside what the
// manikins measured.
import { Link } from "react-router";
import type { ClassRow } from "../../../shared/schemas/insight";
import { DataTable, type Column } from "../../components/DataTable";
import { formatDay } from "../../lib/formatting";
import { formatCount, formatInterval, formatPercent, percentValue } from "./format";
import { courseTypeNames } from "../../../shared/vocabulary";

export const classColumns: Column<ClassRow>[] = [
  {
    key: "id",
    header: "Class",
    value: (c) => c.id,
    render: (c) => (
      <Link to={`/classes/${encodeURIComponent(c.id)}`} className="font-semibold text-dusk-700 underline underline-offset-2 hover:text-dusk-900">
        {c.id}
      </Link>
    ),
    primary: true,
  },
  { key: "date", header: "Date", value: (c) => c.date, render: (c) => formatDay(c.date), sortLabels: { asc: "oldest first", desc: "newest first" } },
  { key: "course", header: "Course", value: (c) => courseTypeNames[c.course] ?? c.course },
  { key: "learners", header: "Learners", value: (c) => c.learners, align: "right" },
  {
    key: "recorded",
    header: "Recorded completions",
    value: (c) => c.passed,
    render: (c) => `${formatCount(c.passed)} (${formatPercent(c.learners === 0 ? null : c.passed / c.learners)})`,
    align: "right",
  },
  { key: "attempts", header: "Attempts", value: (c) => c.attempts, align: "right" },
  {
    key: "rate",
    header: "Measured pass rate (%)",
    value: (c) => percentValue(c.passRate.rate),
    render: (c) => (c.passRate.rate === null ? "no attempts" : formatPercent(c.passRate.rate)),
    align: "right",
  },
  {
    key: "interval",
    header: "95 % interval",
    value: (c) => (c.passRate.low === null ? null : formatInterval(c.passRate.low, c.passRate.high)),
    sortable: false,
    align: "right",
  },
];

export function ClassTable({ classes, caption, exportFileName }: { classes: readonly ClassRow[]; caption: string; exportFileName: string }) {
  return (
    <DataTable
      caption={caption}
      columns={classColumns}
      rows={classes}
      rowKey={(c) => c.id}
      exportFileName={exportFileName}
      initialSort={{ key: "date", direction: "desc" }}
      emptyMessage="No classes in this period."
    />
  );
}
