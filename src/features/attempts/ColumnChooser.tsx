// Which columns the attempt list shows, as a disclosure of checkboxes. The choice lives in the URL (?cols=…),
// so a shared link shows the same columns; the attempt itself is always the first column.
import type { AttemptColumn } from "./attemptColumns";
import { defaultAttemptColumns, type AttemptColumnKey } from "./attemptListState";

export interface ColumnChooserProps {
  columns: readonly AttemptColumn[];
  shown: readonly AttemptColumnKey[];
  onChange: (shown: AttemptColumnKey[]) => void;
}

export function ColumnChooser({ columns, shown, onChange }: ColumnChooserProps) {
  const isDefault = shown.length === defaultAttemptColumns.length && shown.every((key) => defaultAttemptColumns.includes(key));
  function toggle(key: AttemptColumnKey, on: boolean) {
    onChange(on ? [...shown, key] : shown.filter((k) => k !== key));
  }
  return (
    <details className="group relative hidden sm:block">
      <summary className="inline-flex min-h-11 cursor-pointer list-none items-center gap-2 rounded-control border border-line-strong bg-surface px-4 font-medium text-dusk-800 hover:bg-dusk-50">
        Columns ({shown.length} of {columns.length})
        <svg viewBox="0 0 10 6" className="h-1.5 w-2.5 transition-transform group-open:rotate-180" aria-hidden="true">
          <path d="M1 1l4 4 4-4" fill="none" stroke="currentColor" strokeWidth="1.5" />
        </svg>
      </summary>
      <div className="absolute right-0 z-20 mt-2 w-[min(36rem,90vw)] rounded-card border border-line bg-surface p-4 shadow-card">
        <fieldset>
          <legend className="mb-2 text-small font-semibold">Columns to show beside the attempt</legend>
          <div className="grid grid-cols-2 gap-x-4 gap-y-1 text-small">
            {columns.map((column) => (
              <label key={column.key} className="flex min-h-8 items-center gap-2">
                <input type="checkbox" checked={shown.includes(column.key)} onChange={(event) => toggle(column.key, event.target.checked)} className="size-4" />
                {column.header}
              </label>
            ))}
          </div>
        </fieldset>
        <button
          type="button"
          disabled={isDefault}
          onClick={() => onChange([...defaultAttemptColumns])}
          className="mt-3 font-medium text-dusk-700 underline underline-offset-2 hover:text-dusk-900 disabled:text-muted disabled:no-underline"
        >
          Back to the default columns
        </button>
      </div>
    </details>
  );
}
