// A plain table for the report's small figure tables: no filter or export (the report has its own CSV),
// prints cleanly, scrolls sideways on a phone. Figures (right-aligned) stay on one line, so an interval never
// breaks before its "%".
import clsx from "clsx";
import type { ReactNode } from "react";

export interface ReportColumn<Row> {
  header: string;
  cell: (row: Row) => ReactNode;
  align?: "left" | "right";
}

export function ReportTable<Row>({
  caption,
  columns,
  rows,
  rowKey,
}: {
  caption: string;
  columns: readonly ReportColumn<Row>[];
  rows: readonly Row[];
  rowKey: (row: Row) => string;
}) {
  return (
    <div
      role="region"
      aria-label={caption}
      tabIndex={0}
      className="relative overflow-x-auto rounded-card border border-line bg-surface print:overflow-visible print:border-line-strong"
    >
      <table className="w-full border-collapse text-left text-small">
        <caption className="sr-only">{caption}</caption>
        <thead>
          <tr className="border-b border-line-strong">
            {columns.map((column, i) => (
              <th key={i} scope="col" className={clsx("px-3 py-2 font-semibold text-muted first:pl-4 last:pr-4", column.align === "right" && "text-right")}>
                {column.header}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {rows.map((row) => (
            <tr key={rowKey(row)} className="border-b border-line last:border-b-0">
              {columns.map((column, i) =>
                i === 0 ? (
                  <th key={i} scope="row" className="px-3 py-2 text-left font-medium first:pl-4">
                    {column.cell(row)}
                  </th>
                ) : (
                  <td key={i} className={clsx("px-3 py-2 last:pr-4", column.align === "right" && "text-right whitespace-nowrap tabular-nums")}>
                    {column.cell(row)}
                  </td>
                ),
              )}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
