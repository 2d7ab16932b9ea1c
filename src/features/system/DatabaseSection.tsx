// Program version, schema level and the database's size, then how it grew quarter by quarter.
import { quarterLabel } from "../../../shared/period";
import type { QuarterGrowth, SystemReport } from "../../../shared/schemas/system";
import { DataTable, type Column } from "../../components/DataTable";
import { StatCard } from "../../components/StatCard";
import { formatBytes, formatCount } from "../imports/labels";

const growthColumns: Column<QuarterGrowth>[] = [
  { key: "quarter", header: "Quarter", value: (q) => q.quarter, render: (q) => quarterLabel(q.quarter), primary: true },
  { key: "classes", header: "Classes", value: (q) => q.classes, render: (q) => formatCount(q.classes), align: "right" },
  { key: "attempts", header: "Attempts", value: (q) => q.attempts, render: (q) => formatCount(q.attempts), align: "right" },
  {
    key: "streams",
    header: "Compression streams",
    headerWrap: true,
    value: (q) => q.compressionStreams,
    render: (q) => formatCount(q.compressionStreams),
    align: "right",
  },
];

export function DatabaseSection({ report }: { report: SystemReport }) {
  const { migration, database } = report;
  return (
    <section aria-labelledby="system-database" className="flex flex-col gap-4">
      <h2 id="system-database" className="text-title">
        Program and database
      </h2>
      <div className="grid grid-cols-1 gap-4 sm:grid-cols-3">
        <StatCard label="Quarterbeat version" value={report.version} />
        <StatCard
          label="Schema migration"
          value={migration.appliedCount}
          unit={migration.appliedCount === 1 ? "migration" : "migrations"}
          footnote={migration.current ? `Up to date: ${migration.applied}` : `Behind: ${migration.applied ?? "none"} applied, ${migration.latest} shipped`}
        />
        <StatCard
          label="Database size"
          value={formatBytes(database.fileBytes)}
          footnote={`${formatCount(database.pageCount)} pages of ${formatCount(database.pageSize)} bytes, ${formatCount(database.freePages)} free; write-ahead log ${formatBytes(database.walBytes)}`}
        />
      </div>
      <p className="text-small text-muted break-all">Database file: {database.file}</p>
      <DataTable
        caption="Stored data per quarter"
        columns={growthColumns}
        rows={report.growth}
        rowKey={(q) => q.quarter}
        initialSort={{ key: "quarter", direction: "desc" }}
        filterable={false}
        exportFileName="quarterbeat-growth-per-quarter.csv"
        emptyMessage="No classes or attempts are stored yet."
        phoneLayout="scroll"
      />
    </section>
  );
}
