// One page of attempts, already filtered and sorted by the server. Wide screens get a table whose first
// column (the attempt) stays in view while the rest scrolls; its headers sort the whole result. Phones get a
// dense list with the figures that decide a result, a few lines per attempt.
import clsx from "clsx";
import { Link } from "react-router";
import type { AttemptSortKey, SortDirection } from "../../../shared/filters";
import type { AttemptRow } from "../../../shared/schemas/insight";
import { attemptFieldNames, patientTypeNames } from "../../../shared/vocabulary";
import { ErrorNames, ResultBadge, type AttemptColumn } from "./attemptColumns";
import { formatRecordedDateTime } from "../../lib/formatting";
import { attemptHref } from "./returnPath";

export interface AttemptsTableProps {
  rows: readonly AttemptRow[];
  columns: readonly AttemptColumn[];
  sort: AttemptSortKey;
  dir: SortDirection;
  onSort: (key: AttemptSortKey) => void;
  /** The list's own address, which each attempt's back link returns to. */
  from: string;
  caption: string;
}

const linkClass = "font-semibold text-dusk-700 underline underline-offset-2 hover:text-dusk-900";

export function AttemptsTable(props: AttemptsTableProps) {
  return (
    <>
      <WideTable {...props} />
      <PhoneList rows={props.rows} from={props.from} caption={props.caption} />
    </>
  );
}

function ariaSort(active: boolean, dir: SortDirection): "ascending" | "descending" | "none" {
  return active ? (dir === "asc" ? "ascending" : "descending") : "none";
}

function WideTable({ rows, columns, sort, dir, onSort, from, caption }: AttemptsTableProps) {
  const idActive = sort === "id";
  const stickyCell = "sticky left-0 z-10 bg-surface pl-4 pr-3 shadow-[1px_0_0_rgba(0,0,0,0.1)]";
  return (
    <div
      className="relative hidden overflow-x-auto rounded-card border border-line bg-surface shadow-card sm:block"
      role="region"
      aria-label={caption}
      tabIndex={0}
    >
      <table className="w-full border-collapse text-left text-small">
        <caption className="sr-only">{caption}</caption>
        <thead>
          <tr className="border-b border-line-strong align-bottom">
            <th scope="col" aria-sort={ariaSort(idActive, dir)} className={clsx(stickyCell, "py-2 font-semibold text-muted")}>
              <SortButton label={attemptFieldNames.id} active={idActive} dir={dir} onClick={() => onSort("id")} />
            </th>
            {columns.map((column) => {
              const active = sort === column.key;
              return (
                <th
                  key={column.key}
                  scope="col"
                  aria-sort={ariaSort(active, dir)}
                  className={clsx("px-3 py-2 font-semibold text-muted last:pr-4", column.numeric && "text-right")}
                >
                  <SortButton label={column.header} active={active} dir={dir} numeric={column.numeric} onClick={() => onSort(column.key)} />
                </th>
              );
            })}
          </tr>
        </thead>
        <tbody>
          {rows.map((a) => (
            <tr key={a.id} className="group border-b border-line last:border-b-0">
              <th scope="row" className={clsx(stickyCell, "py-2 font-normal whitespace-nowrap group-hover:bg-paper")}>
                <Link to={attemptHref(a.id, from)} className={linkClass}>
                  {a.id}
                </Link>
              </th>
              {columns.map((column) => (
                <td
                  key={column.key}
                  className={clsx(
                    "px-3 py-2 align-middle last:pr-4 group-hover:bg-paper",
                    column.numeric ? "text-right tabular-nums whitespace-nowrap" : column.key === "errors" ? "min-w-32" : "whitespace-nowrap",
                  )}
                >
                  {column.cell(a)}
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

function SortButton({ label, active, dir, numeric, onClick }: { label: string; active: boolean; dir: SortDirection; numeric?: boolean; onClick: () => void }) {
  return (
    <button
      type="button"
      onClick={onClick}
      className={clsx("inline-flex items-end gap-1 rounded-sm text-balance hover:text-ink", active && "text-ink", numeric && "flex-row-reverse text-right")}
    >
      {label}
      <svg viewBox="0 0 10 14" className="mb-0.5 h-3.5 w-2.5 shrink-0" aria-hidden="true">
        <path d="M5 1 9 5.5H1z" fill="currentColor" opacity={active && dir === "asc" ? 1 : 0.3} />
        <path d="M5 13 1 8.5h8z" fill="currentColor" opacity={active && dir === "desc" ? 1 : 0.3} />
      </svg>
    </button>
  );
}

/** Phones: the attempt, its result and score on one line; when, who and what went wrong below. */
function PhoneList({ rows, from, caption }: { rows: readonly AttemptRow[]; from: string; caption: string }) {
  return (
    <ul aria-label={caption} className="divide-y divide-line rounded-card border border-line bg-surface shadow-card sm:hidden">
      {rows.map((a) => (
        <li key={a.id} className="flex flex-col gap-0.5 px-3 py-2 text-small">
          <div className="flex items-center justify-between gap-2">
            <Link to={attemptHref(a.id, from)} className={clsx(linkClass, "min-w-0 truncate")}>
              {a.id}
            </Link>
            <span className="flex shrink-0 items-center gap-2">
              <ResultBadge passed={a.passed} />
              <span className="tabular-nums font-semibold" aria-label={`${attemptFieldNames.score} ${Math.round(a.score)}`}>
                {Math.round(a.score)}
              </span>
            </span>
          </div>
          <p className="text-muted">
            {formatRecordedDateTime(a.startedAt)} · <span className="font-mono">{a.learner}</span> · {patientTypeNames[a.profile]}
          </p>
          <p className="flex flex-wrap justify-between gap-x-3">
            <ErrorNames errors={a.errors} none="No errors" />
            <span className="tabular-nums text-muted">
              Depth {Math.round(a.metrics.depthOkPct)} % · Rate {Math.round(a.metrics.rateOkPct)} % on target
            </span>
          </p>
        </li>
      ))}
    </ul>
  );
}
