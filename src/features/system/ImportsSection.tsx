// The newest import batches, as the Imports page's history records them.
import type { ImportBatch } from "../../../shared/import/api";
import { DataTable, type Column } from "../../components/DataTable";
import { formatCount, formatDateTime, importedBy, kindLabels } from "../imports/labels";

const columns: Column<ImportBatch>[] = [
  {
    key: "when",
    header: "Imported",
    value: (b) => b.createdAt,
    render: (b) => formatDateTime(b.createdAt),
    sortLabels: { asc: "oldest first", desc: "newest first" },
  },
  { key: "file", header: "File", value: (b) => b.fileName, primary: true, wrap: true },
  { key: "kind", header: "Kind", value: (b) => kindLabels[b.kind] },
  { key: "by", header: "By", value: (b) => importedBy(b) },
  { key: "status", header: "Status", value: (b) => (b.status === "undone" ? "Undone" : "Applied") },
  { key: "read", header: "Rows read", value: (b) => b.rowsRead, render: (b) => formatCount(b.rowsRead), align: "right" },
  { key: "inserted", header: "Inserted", value: (b) => b.inserted, render: (b) => formatCount(b.inserted), align: "right" },
  { key: "updated", header: "Updated", value: (b) => b.updated, render: (b) => formatCount(b.updated), align: "right" },
  { key: "rejected", header: "Rejected", value: (b) => b.rejected, render: (b) => formatCount(b.rejected), align: "right" },
];

export function ImportsSection({ imports }: { imports: ImportBatch[] }) {
  return (
    <section aria-labelledby="system-imports" className="flex flex-col gap-3">
      <h2 id="system-imports" className="text-title">
        Last imports
      </h2>
      <DataTable
        caption="Last import batches"
        captionHidden
        columns={columns}
        rows={imports}
        rowKey={(b) => b.id}
        initialSort={{ key: "when", direction: "desc" }}
        filterable={false}
        emptyMessage="Nothing has been imported yet."
      />
    </section>
  );
}
