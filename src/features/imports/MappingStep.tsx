// Step 2: the first rows of the file and, for each Quarterbeat column, the file's column it is read from;
// units and value spellings of the file; saved mappings. Header problems are checked here, in the browser,
// with the server's own rules, before anything is validated.
import { useId, useMemo, useRef } from "react";
import type { ImportKind } from "../../../shared/domain";
import type { Preview, Upload } from "../../../shared/import/api";
import { importColumns } from "../../../shared/import/columns";
import { delimiterLabels } from "../../../shared/import/delimiter";
import { resolveHeader } from "../../../shared/import/header";
import type { ImportMapping } from "../../../shared/import/mapping";
import { Button } from "../../components/Button";
import { controlClass } from "../../components/Field";
import { formatBytes, kindLabels } from "./labels";
import { buildMapping, draftProblems, readUnderOwnName, unitGroupsOf, unknownValues, type MappingDraft } from "./mappingDraft";
import { PresetControls } from "./PresetControls";
import { UnitChoices } from "./UnitChoices";

export interface MappingStepProps {
  kind: ImportKind;
  upload: Upload;
  preview: Preview;
  draft: MappingDraft;
  onDraftChange: (draft: MappingDraft) => void;
  onBack: () => void;
  onValidate: (mapping: ImportMapping) => void;
  busy?: boolean;
}

const PREVIEW_ROWS = 10;

export function MappingStep({ kind, upload, preview, draft, onDraftChange, onBack, onValidate, busy }: MappingStepProps) {
  const problemsRef = useRef<HTMLDivElement>(null);
  const problemsId = useId();
  const mapping = useMemo(() => buildMapping(kind, draft), [kind, draft]);
  const problems = useMemo(() => draftProblems(kind, preview.header, draft), [kind, preview.header, draft]);
  const ignored = useMemo(() => resolveHeader(preview.header, kind, mapping).extra, [preview.header, kind, mapping]);
  const readBy = useMemo(() => {
    const byFileColumn = new Map<string, string>();
    for (const [column, source] of Object.entries(draft.columns)) if (source) byFileColumn.set(source.trim().toLowerCase(), column);
    return byFileColumn;
  }, [draft.columns]);
  const oddValues = useMemo(() => unknownValues(kind, preview.header, preview.rows, draft), [kind, preview, draft]);

  function setColumn(column: string, source: string) {
    onDraftChange({ ...draft, columns: { ...draft.columns, [column]: source } });
  }

  function setTranslation(column: string, value: string, to: string) {
    onDraftChange({ ...draft, values: { ...draft.values, [column]: { ...(draft.values[column] ?? {}), [value]: to } } });
  }

  function validate() {
    if (problems.length > 0) {
      problemsRef.current?.focus();
      return;
    }
    onValidate(mapping);
  }

  const firstValue = (column: string): string | null => {
    const source = draft.columns[column];
    if (!source) return null;
    const position = preview.header.findIndex((h) => h.trim().toLowerCase() === source.trim().toLowerCase());
    const row = preview.rows.find((r) => (r[position] ?? "").trim() !== "");
    return row ? row[position].trim() : null;
  };

  return (
    <div className="flex flex-col gap-6">
      <p className="text-small text-muted">
        {upload.fileName} · {formatBytes(upload.size)} · {kindLabels[kind]} · {preview.header.length} columns
        {preview.delimiter && ` separated by ${delimiterLabels[preview.delimiter]}`}
      </p>

      <section aria-labelledby="preview-heading" className="flex flex-col gap-2">
        <h3 id="preview-heading" className="text-lead font-semibold">
          First rows of the file
        </h3>
        {preview.rows.length === 0 ? (
          <p className="text-muted">The file has a header row but no data rows.</p>
        ) : (
          <div
            role="region"
            aria-labelledby="preview-heading"
            tabIndex={0}
            className="relative overflow-x-auto rounded-card border border-line bg-surface shadow-card"
          >
            <table className="w-full border-collapse text-left text-small">
              <caption className="sr-only">
                The first {Math.min(PREVIEW_ROWS, preview.rows.length)} data rows; under each file column, the Quarterbeat column that reads it.
              </caption>
              <thead>
                <tr className="border-b border-line-strong">
                  <th scope="col" className="px-3 py-2 font-semibold whitespace-nowrap text-muted">
                    Row
                  </th>
                  {preview.header.map((name, i) => {
                    const reader = readBy.get(name.trim().toLowerCase());
                    return (
                      <th key={i} scope="col" className="px-3 py-2 align-bottom whitespace-nowrap">
                        <span className="block font-semibold">{name || <span className="text-muted">(no name)</span>}</span>
                        <span className={`block text-caption font-normal ${reader ? "text-dusk-700" : "text-muted"}`}>
                          {reader ? (
                            <>
                              read as <span className="font-mono">{reader}</span>
                            </>
                          ) : (
                            "not read"
                          )}
                        </span>
                      </th>
                    );
                  })}
                </tr>
              </thead>
              <tbody>
                {preview.rows.slice(0, PREVIEW_ROWS).map((row, r) => (
                  <tr key={r} className="border-b border-line last:border-b-0">
                    <th scope="row" className="px-3 py-1.5 font-normal text-muted tabular-nums">
                      {r + 1}
                    </th>
                    {preview.header.map((_, c) => (
                      <td key={c} className="px-3 py-1.5 whitespace-nowrap">
                        {row[c] ?? ""}
                      </td>
                    ))}
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        )}
        <p className="text-caption text-muted">Row 1 is the first data row after the header (a spreadsheet shows it as line 2).</p>
      </section>

      <PresetControls kind={kind} header={preview.header} mapping={mapping} onApply={onDraftChange} />

      <section aria-labelledby="columns-heading" className="flex flex-col gap-3">
        <div>
          <h3 id="columns-heading" className="text-lead font-semibold">
            Match the columns
          </h3>
          <p className="text-small text-muted">
            For each Quarterbeat column, choose the column of your file that holds it. Quarterbeat suggested a match where the names were close; check each one.
          </p>
        </div>
        <ul className="flex flex-col divide-y divide-line rounded-card border border-line bg-surface shadow-card">
          {importColumns[kind].map((spec) => {
            const selectId = `map-${spec.name}`;
            const ownName = readUnderOwnName(kind, preview.header, spec.name);
            const sample = firstValue(spec.name);
            const problem = problems.find((p) => p.column === spec.name);
            return (
              <li key={spec.name} className="grid gap-2 px-4 py-3 sm:grid-cols-[minmax(0,1fr)_minmax(12rem,18rem)] sm:items-center sm:gap-4">
                <div>
                  <label htmlFor={selectId} className="font-mono font-semibold">
                    <span className="sr-only">File column for </span>
                    {spec.name}
                  </label>
                  <span className="ml-2 text-caption text-muted">{spec.required ? "required" : "optional"}</span>
                  <p id={`${selectId}-hint`} className="text-small text-muted">
                    {spec.description}
                    {sample !== null && (
                      <>
                        {" "}
                        · first value: <span className="font-mono text-ink">{sample}</span>
                      </>
                    )}
                  </p>
                  {problem && (
                    <p id={`${selectId}-error`} className="text-small font-medium text-danger-text">
                      {problem.reason}
                    </p>
                  )}
                </div>
                <select
                  id={selectId}
                  value={draft.columns[spec.name] ?? ""}
                  onChange={(event) => setColumn(spec.name, event.target.value)}
                  aria-describedby={`${selectId}-hint${problem ? ` ${selectId}-error` : ""}`}
                  aria-invalid={problem ? true : undefined}
                  className={controlClass(Boolean(problem))}
                >
                  {!ownName && <option value="">{spec.required ? "Choose a column…" : "Not in this file"}</option>}
                  {preview.header
                    .filter((name) => name.trim() !== "")
                    .map((name, i) => (
                      <option key={i} value={name.trim()}>
                        {name.trim()}
                      </option>
                    ))}
                </select>
              </li>
            );
          })}
        </ul>
        {ignored.length > 0 && <p className="text-small text-muted">Not read (ignored): {ignored.join(", ")}.</p>}
      </section>

      {unitGroupsOf(kind).length > 0 && (
        <UnitChoices kind={kind} units={draft.units} onChange={(units) => onDraftChange({ ...draft, units })} sample={firstValue} />
      )}

      {oddValues.length > 0 && (
        <section aria-labelledby="values-heading" className="flex flex-col gap-3">
          <div>
            <h3 id="values-heading" className="text-lead font-semibold">
              Values spelled differently
            </h3>
            <p className="text-small text-muted">
              These values in the first rows are not among Quarterbeat's. Say what each one means, or leave it and fix the file: rows that keep it are refused.
            </p>
          </div>
          <ul className="grid gap-3 sm:grid-cols-2">
            {oddValues.map((odd) => {
              const id = `value-${odd.column}-${odd.value}`;
              return (
                <li key={id} className="flex flex-col gap-1">
                  <label htmlFor={id} className="text-small font-semibold">
                    Read “{odd.value}” in <span className="font-mono">{odd.column}</span> as
                  </label>
                  <select
                    id={id}
                    value={draft.values[odd.column]?.[odd.value] ?? ""}
                    onChange={(event) => setTranslation(odd.column, odd.value, event.target.value)}
                    className={controlClass(false)}
                  >
                    <option value="">Leave as it is (refused)</option>
                    {odd.allowed.map((allowed) => (
                      <option key={allowed} value={allowed}>
                        {allowed}
                      </option>
                    ))}
                  </select>
                </li>
              );
            })}
          </ul>
        </section>
      )}

      <div
        ref={problemsRef}
        id={problemsId}
        tabIndex={-1}
        aria-live="polite"
        className={problems.length > 0 ? "rounded-card border border-danger-line bg-danger-tint p-4 outline-none focus-visible:outline-3" : "sr-only"}
      >
        {problems.length > 0 ? (
          <>
            <p className="font-semibold text-danger-text">Before validating, fix {problems.length === 1 ? "this" : `these ${problems.length} problems`}:</p>
            <ul className="mt-1 list-disc pl-5 text-small text-ink">
              {problems.map((problem, i) => (
                <li key={i}>
                  <span className="font-mono">{problem.column}</span>: {problem.reason}
                </li>
              ))}
            </ul>
          </>
        ) : (
          "Every required column is matched."
        )}
      </div>

      <div className="flex flex-wrap gap-2">
        <Button onClick={validate} busy={busy} aria-describedby={problems.length > 0 ? problemsId : undefined}>
          Validate the file
        </Button>
        <Button variant="secondary" onClick={onBack}>
          Choose another file
        </Button>
      </div>
      <p className="-mt-4 text-small text-muted">Validating reads every row and writes nothing.</p>
    </div>
  );
}
