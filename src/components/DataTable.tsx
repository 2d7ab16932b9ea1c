// A table for any list: sortable columns, a filter box, and "Export CSV" of exactly the rows shown.
import clsx from "clsx";
import { useId, useMemo, useState, type ReactNode } from "react";
import { SPREADSHEET_CSV, toCsv, type CsvCell } from "../../shared/csv";
import { downloadCsv } from "../lib/downloadCsv";
import { DownloadIcon } from "./DownloadIcon";

export type CellValue = string | number | boolean | null | undefined;

export interface Column<Row> {
  key: string;
  header: string;
  /** The cell's plain value: used to sort, to filter and in the CSV. */
  value: (row: Row) => CellValue;
  /** How the cell looks on screen; defaults to the value as text. */
  render?: (row: Row) => ReactNode;
  /** Columns sort unless this is false (e.g. a column of buttons). */
  sortable?: boolean;
  /** Leave the column out of the CSV (e.g. action buttons). */
  exportable?: boolean;
  align?: "left" | "right";
  /** Let long text wrap (default: cells stay on one line and the table scrolls sideways). */
  wrap?: boolean;
  /** Let a long header wrap onto two lines, so a column of short numbers stays narrow. */
  headerWrap?: boolean;
  /** Words for the phone sort menu, e.g. { asc: "oldest first", desc: "newest first" }. */
  sortLabels?: { asc: string; desc: string };
  /** On phones rows show as cards; the column marked primary titles each card (default: the first column). */
  primary?: boolean;
}

export interface SortState {
  key: string;
  direction: "asc" | "desc";
}

export interface DataTableProps<Row> {
  /** Names the table for screen readers and in the export; shown above the table unless captionHidden. */
  caption: string;
  captionHidden?: boolean;
  columns: readonly Column<Row>[];
  rows: readonly Row[];
  rowKey: (row: Row) => string | number;
  initialSort?: SortState;
  /** Show the filter box (default true). */
  filterable?: boolean;
  /** Offer "Export CSV" under this file name. */
  exportFileName?: string;
  emptyMessage?: string;
  /** Extra controls beside the filter box. */
  toolbar?: ReactNode;
  /**
   * Phones: "cards" shows each row as a card (columns left out of the CSV, such as actions, go at its
   * foot); "scroll" keeps the table and lets it scroll sideways (better for columns of numbers).
   */
  phoneLayout?: "cards" | "scroll";
}

const collator = new Intl.Collator(undefined, { numeric: true, sensitivity: "base" });

function displayText(value: CellValue): string {
  if (value === null || value === undefined) return "";
  if (typeof value === "boolean") return value ? "Yes" : "No";
  return String(value);
}

function compareValues(a: CellValue, b: CellValue): number {
  if (typeof a === "number" && typeof b === "number") return a - b;
  if (typeof a === "boolean" && typeof b === "boolean") return Number(a) - Number(b);
  return collator.compare(displayText(a), displayText(b));
}

/** Sorted copy; empty cells go last in both directions so they never crowd the top. */
export function sortRows<Row>(rows: readonly Row[], columns: readonly Column<Row>[], sort: SortState | null): Row[] {
  const column = sort && columns.find((c) => c.key === sort.key);
  if (!sort || !column) return [...rows];
  const sign = sort.direction === "asc" ? 1 : -1;
  return [...rows].sort((left, right) => {
    const a = column.value(left);
    const b = column.value(right);
    const aEmpty = a === null || a === undefined || a === "";
    const bEmpty = b === null || b === undefined || b === "";
    if (aEmpty || bEmpty) return aEmpty === bEmpty ? 0 : aEmpty ? 1 : -1;
    return sign * compareValues(a, b);
  });
}

/** Rows where any column's text contains every word of the filter (case-insensitive). */
export function filterRows<Row>(rows: readonly Row[], columns: readonly Column<Row>[], filter: string): Row[] {
  const words = filter.toLowerCase().split(/\s+/).filter(Boolean);
  if (words.length === 0) return [...rows];
  return rows.filter((row) => {
    const text = columns.map((c) => displayText(c.value(row)).toLowerCase()).join("\u0000");
    return words.every((word) => text.includes(word));
  });
}

/** The CSV of the given rows, exportable columns only, headers as shown. */
export function tableToCsv<Row>(columns: readonly Column<Row>[], rows: readonly Row[]): string {
  const exported = columns.filter((c) => c.exportable !== false);
  return toCsv(
    exported.map((c) => c.header),
    rows.map((row) => exported.map((c) => c.value(row) as CsvCell)),
    SPREADSHEET_CSV,
  );
}

export function DataTable<Row>({
  caption,
  captionHidden = false,
  columns,
  rows,
  rowKey,
  initialSort,
  filterable = true,
  exportFileName,
  emptyMessage = "Nothing to show.",
  toolbar,
  phoneLayout = "cards",
}: DataTableProps<Row>) {
  const cards = phoneLayout === "cards";
  const [sort, setSort] = useState<SortState | null>(initialSort ?? null);
  const [filter, setFilter] = useState("");
  const filterId = useId();
  const countId = useId();
  const sortId = useId();

  const shown = useMemo(() => sortRows(filterRows(rows, columns, filter), columns, sort), [rows, columns, filter, sort]);

  function toggleSort(key: string) {
    setSort((current) => (current?.key === key ? { key, direction: current.direction === "asc" ? "desc" : "asc" } : { key, direction: "asc" }));
  }

  const showToolbar = filterable || exportFileName || toolbar || cards;
  const emptyText = rows.length === 0 ? emptyMessage : "No rows match the filter.";

  return (
    <div className="flex flex-col gap-3">
      {showToolbar && (
        <div className="flex flex-wrap items-end gap-3">
          {filterable && (
            <div className="flex min-w-[min(100%,16rem)] flex-1 flex-col gap-1 sm:max-w-sm">
              <label htmlFor={filterId} className="text-small font-semibold">
                Filter {captionInSentence(caption)}
              </label>
              <input
                id={filterId}
                type="search"
                value={filter}
                onChange={(event) => setFilter(event.target.value)}
                aria-describedby={countId}
                placeholder="Type to filter rows"
                className="min-h-11 w-full rounded-control border border-line-strong bg-surface px-3 text-body placeholder:text-muted"
              />
            </div>
          )}
          {cards && <PhoneSortSelect id={sortId} columns={columns} sort={sort} onChange={setSort} rows={rows} />}
          {toolbar}
          {exportFileName && (
            <button
              type="button"
              onClick={() => downloadCsv(exportFileName, tableToCsv(columns, shown))}
              disabled={shown.length === 0}
              className="inline-flex min-h-11 items-center gap-2 rounded-control border border-line-strong bg-surface px-4 font-medium text-dusk-800 hover:bg-dusk-50 disabled:opacity-60"
            >
              <DownloadIcon />
              Export CSV
            </button>
          )}
        </div>
      )}
      <p id={countId} className="text-caption text-muted" aria-live="polite">
        {filter ? `Showing ${shown.length} of ${rows.length} rows` : `${rows.length} ${rows.length === 1 ? "row" : "rows"}`}
      </p>
      <div
        // relative: keeps visually hidden text inside the scroll box so it cannot widen the page
        className={clsx("relative overflow-x-auto rounded-card border border-line bg-surface shadow-card", cards && "hidden sm:block")}
        role="region"
        aria-label={caption}
        tabIndex={0}
      >
        <table className="w-full border-collapse text-left text-small">
          <caption className={clsx("px-4 pt-3 text-left text-body font-semibold", captionHidden && "sr-only")}>{caption}</caption>
          <thead>
            <tr className="border-b border-line-strong">
              {columns.map((column) => {
                const sortable = column.sortable !== false;
                const active = sort?.key === column.key;
                return (
                  <th
                    key={column.key}
                    scope="col"
                    aria-sort={active ? (sort.direction === "asc" ? "ascending" : "descending") : sortable ? "none" : undefined}
                    className={clsx(
                      "px-3 py-2 font-semibold text-muted first:pl-4 last:pr-4",
                      column.headerWrap ? "min-w-20" : "whitespace-nowrap",
                      column.align === "right" && "text-right",
                    )}
                  >
                    {sortable ? (
                      <button
                        type="button"
                        onClick={() => toggleSort(column.key)}
                        className={clsx(
                          "inline-flex items-center gap-1 rounded-sm hover:text-ink",
                          active && "text-ink",
                          column.align === "right" && "flex-row-reverse",
                        )}
                      >
                        {column.header}
                        <SortMark direction={active ? sort.direction : null} />
                      </button>
                    ) : (
                      column.header
                    )}
                  </th>
                );
              })}
            </tr>
          </thead>
          <tbody>
            {shown.length === 0 ? (
              <tr>
                <td colSpan={columns.length} className="px-4 py-6 text-muted">
                  {emptyText}
                </td>
              </tr>
            ) : (
              shown.map((row) => (
                <tr key={rowKey(row)} className="border-b border-line last:border-b-0 hover:bg-paper">
                  {columns.map((column) => (
                    <td
                      key={column.key}
                      className={clsx(
                        "px-3 py-2 align-middle first:pl-4 last:pr-4",
                        column.align === "right" && "text-right tabular-nums",
                        !column.wrap && "whitespace-nowrap",
                      )}
                    >
                      {column.render ? column.render(row) : displayText(column.value(row))}
                    </td>
                  ))}
                </tr>
              ))
            )}
          </tbody>
        </table>
      </div>
      {cards && <CardList caption={caption} columns={columns} rows={shown} rowKey={rowKey} emptyText={emptyText} />}
    </div>
  );
}

function cellContent<Row>(column: Column<Row>, row: Row): ReactNode {
  return column.render ? column.render(row) : displayText(column.value(row));
}

/** A value column left empty ("") for this row: a table shows the blank cell, a card leaves the line out. */
function notApplicable<Row>(column: Column<Row>, row: Row): boolean {
  return column.render === undefined && column.value(row) === "";
}

/** Phones: one card per row, titled by the primary column, the other columns as label–value pairs. */
function CardList<Row>({
  caption,
  columns,
  rows,
  rowKey,
  emptyText,
}: {
  caption: string;
  columns: readonly Column<Row>[];
  rows: readonly Row[];
  rowKey: (row: Row) => string | number;
  emptyText: string;
}) {
  const primary = columns.find((c) => c.primary) ?? columns[0];
  const footer = columns.filter((c) => c !== primary && c.exportable === false);
  const details = columns.filter((c) => c !== primary && c.exportable !== false);
  if (rows.length === 0) return <p className="rounded-card border border-line bg-surface p-4 text-muted sm:hidden">{emptyText}</p>;
  return (
    <ul aria-label={caption} className="flex flex-col gap-3 sm:hidden">
      {rows.map((row) => (
        <li key={rowKey(row)} className="rounded-card border border-line bg-surface p-4 shadow-card">
          <p className="font-semibold">{cellContent(primary, row)}</p>
          <dl className="mt-2 grid grid-cols-[minmax(6rem,auto)_1fr] gap-x-4 gap-y-1 text-small">
            {details
              .filter((column) => !notApplicable(column, row))
              .map((column) => (
                <div key={column.key} className="contents">
                  <dt className="text-muted">{column.header}</dt>
                  <dd className="min-w-0 break-words">{cellContent(column, row)}</dd>
                </div>
              ))}
          </dl>
          {footer.map((column) => (
            <div key={column.key} className="mt-3 border-t border-line pt-3">
              {cellContent(column, row)}
            </div>
          ))}
        </li>
      ))}
    </ul>
  );
}

/** Values that sort as dates: "2026-07-14", "2026-07-14T09:30:00Z". */
const ISO_DATE_START = /^\d{4}-\d{2}-\d{2}/;

/** Phones have no column headers to click, so sorting is a select there. */
export function PhoneSortSelect<Row>({
  id,
  columns,
  sort,
  onChange,
  rows = [],
}: {
  id: string;
  columns: readonly Column<Row>[];
  sort: SortState | null;
  onChange: (sort: SortState | null) => void;
  /** Read to word a column of dates as oldest or newest first rather than A to Z. */
  rows?: readonly Row[];
}) {
  const sortable = columns.filter((c) => c.sortable !== false);
  if (sortable.length === 0) return null;
  const labels = (c: Column<Row>) => {
    if (c.sortLabels) return c.sortLabels;
    if (c.align === "right") return { asc: "lowest first", desc: "highest first" };
    const first = rows.map((row) => c.value(row)).find((value) => value !== null && value !== undefined && value !== "");
    return typeof first === "string" && ISO_DATE_START.test(first) ? { asc: "oldest first", desc: "newest first" } : { asc: "A to Z", desc: "Z to A" };
  };
  return (
    <div className="flex w-full flex-col gap-1 sm:hidden">
      <label htmlFor={id} className="text-small font-semibold">
        Sort by
      </label>
      <select
        id={id}
        value={sort ? `${sort.key}:${sort.direction}` : ""}
        onChange={(event) => {
          const [key, direction] = event.target.value.split(":");
          onChange(key ? { key, direction: direction === "desc" ? "desc" : "asc" } : null);
        }}
        className="min-h-11 w-full rounded-control border border-line-strong bg-surface px-3 text-body"
      >
        <option value="">As listed</option>
        {sortable.flatMap((c) => [
          <option key={`${c.key}:asc`} value={`${c.key}:asc`}>
            {c.header}, {labels(c).asc}
          </option>,
          <option key={`${c.key}:desc`} value={`${c.key}:desc`}>
            {c.header}, {labels(c).desc}
          </option>,
        ])}
      </select>
    </div>
  );
}

function SortMark({ direction }: { direction: "asc" | "desc" | null }) {
  return (
    <svg viewBox="0 0 10 14" className="h-3.5 w-2.5 shrink-0" aria-hidden="true">
      <path d="M5 1 9 5.5H1z" fill="currentColor" opacity={direction === "asc" ? 1 : 0.3} />
      <path d="M5 13 1 8.5h8z" fill="currentColor" opacity={direction === "desc" ? 1 : 0.3} />
    </svg>
  );
}

/** A caption in the middle of a sentence: "Files of 2026 Q4" → "files of 2026 Q4" (codes and quarters keep their capitals). */
function captionInSentence(caption: string): string {
  return /^[A-Z][^A-Z]/.test(caption) ? caption.charAt(0).toLowerCase() + caption.slice(1) : caption;
}
