// Step 1: what the file holds and which file. Uploads with a progress bar (large compression files take a
// while) and can be cancelled.
import { useQuery } from "@tanstack/react-query";
import { useId, useRef, useState, type FormEvent } from "react";
import { importKinds, type ImportKind } from "../../../shared/domain";
import type { Preview, Upload } from "../../../shared/import/api";
import type { UploadProgress } from "../../api/upload";
import { ApiError } from "../../api/http";
import { Button } from "../../components/Button";
import { Field, controlClass } from "../../components/Field";
import { Notice } from "../../components/Notice";
import { errorMessage } from "../../components/States";
import { useCan } from "../auth/useCan";
import { formatBytes, kindHints, kindLabels } from "./labels";
import { ProgressBar } from "./ProgressBar";
import { importQueries, uploadImportFile } from "./queries";

/** The server refuses larger uploads (server/imports/routes.ts). */
export const MAX_UPLOAD_BYTES = 50 * 1024 * 1024;

export interface ChooseFileStepProps {
  initialKind: ImportKind | null;
  onUploaded: (upload: Upload, preview: Preview) => void;
}

export function ChooseFileStep({ initialKind, onUploaded }: ChooseFileStepProps) {
  const importsEquipment = useCan("importEquipment");
  const importsOwnOnly = !useCan("importData", "any");
  const [kind, setKind] = useState<ImportKind | "">(initialKind ?? "");
  const [file, setFile] = useState<File | null>(null);
  const [errors, setErrors] = useState<{ kind?: string; file?: string; form?: string }>({});
  const [progress, setProgress] = useState<UploadProgress | null>(null);
  const abort = useRef<AbortController | null>(null);
  const kindGroupId = useId();
  const uploading = progress !== null;

  async function submit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const found: typeof errors = {};
    if (!kind) found.kind = "Choose what the file holds.";
    if (!file) found.file = "Choose a CSV file.";
    else if (!file.name.toLowerCase().endsWith(".csv")) found.file = `${file.name} is not a .csv file. Save it from the spreadsheet as CSV first.`;
    else if (file.size > MAX_UPLOAD_BYTES)
      found.file = `${file.name} is ${formatBytes(file.size)}; the largest file Quarterbeat accepts is ${formatBytes(MAX_UPLOAD_BYTES)}. Split it into smaller files.`;
    else if (file.size === 0) found.file = `${file.name} is empty.`;
    setErrors(found);
    if (found.kind || found.file || !kind || !file) {
      const first = event.currentTarget.querySelector<HTMLElement>(found.kind ? "input[name=kind]" : "input[type=file]");
      first?.focus();
      return;
    }
    const controller = new AbortController();
    abort.current = controller;
    setProgress({ loaded: 0, total: file.size, fraction: 0 });
    try {
      const answer = await uploadImportFile(kind, file, setProgress, controller.signal);
      onUploaded(answer.upload, answer.preview);
    } catch (error) {
      if (error instanceof ApiError && error.code === "aborted") setErrors({ form: "Upload cancelled. Nothing was stored." });
      else setErrors({ form: `${file.name} could not be uploaded: ${errorMessage(error)}` });
    } finally {
      abort.current = null;
      setProgress(null);
    }
  }

  return (
    <form onSubmit={submit} noValidate className="flex flex-col gap-5">
      <fieldset className="flex flex-col gap-2" aria-describedby={errors.kind ? `${kindGroupId}-error` : undefined}>
        <legend className="mb-1 text-small font-semibold text-ink">What does the file hold?</legend>
        <div className="grid gap-2 sm:grid-cols-2">
          {importKinds.map((value) => {
            const coordinatorOnly = value === "equipment" && !importsEquipment;
            return (
              <label
                key={value}
                className={`flex gap-3 rounded-control border p-3 ${kind === value ? "border-dusk-500 bg-dusk-50" : "border-line-strong bg-surface"} ${coordinatorOnly ? "opacity-70" : "cursor-pointer"}`}
              >
                <input
                  type="radio"
                  name="kind"
                  value={value}
                  checked={kind === value}
                  disabled={coordinatorOnly || uploading}
                  onChange={() => {
                    setKind(value);
                    // the choice answers "Choose what the file holds"; an earlier upload's message is stale too
                    setErrors(({ file: fileError }) => ({ file: fileError }));
                  }}
                  className="mt-1 size-4 shrink-0 accent-dusk-700"
                />
                <span>
                  <span className="block font-semibold">{kindLabels[value]}</span>
                  <span className="block text-small text-muted">
                    {kindHints[value]}
                    {coordinatorOnly && " Imported by the coordinator."}
                  </span>
                </span>
              </label>
            );
          })}
        </div>
        {errors.kind && (
          <p id={`${kindGroupId}-error`} className="text-small font-medium text-danger-text">
            {errors.kind}
          </p>
        )}
        {importsOwnOnly && (
          <p className="text-small text-muted">
            You can import your own classes and the attempts measured in them. Rows for another instructor's classes are refused.
          </p>
        )}
      </fieldset>

      {kind && <FormatHelp kind={kind} />}

      <Field
        label="CSV file"
        hint={`A .csv file with a header row, its columns separated by commas, semicolons or tabs, up to ${formatBytes(MAX_UPLOAD_BYTES)}.`}
        error={errors.file}
      >
        {({ id, describedBy, invalid }) => (
          <input
            id={id}
            type="file"
            accept=".csv,text/csv"
            aria-describedby={describedBy}
            aria-invalid={invalid || undefined}
            disabled={uploading}
            onChange={(event) => {
              setFile(event.target.files?.[0] ?? null);
              // messages about the previous file (or upload) no longer apply to the new one
              setErrors(({ kind: kindError }) => ({ kind: kindError }));
            }}
            className={`${controlClass(invalid)} py-2 file:mr-3 file:rounded-control file:border file:border-line-strong file:bg-paper file:px-3 file:py-1 file:font-medium`}
          />
        )}
      </Field>
      {file && !errors.file && (
        <p className="-mt-3 text-small text-muted">
          Chosen: {file.name}, {formatBytes(file.size)}
        </p>
      )}

      {progress && (
        <ProgressBar
          label={`Uploading ${file?.name ?? "the file"}`}
          fraction={progress.fraction}
          detail={progress.total > 0 ? `${formatBytes(progress.loaded)} of ${formatBytes(progress.total)}` : formatBytes(progress.loaded)}
        />
      )}
      {errors.form && <Notice tone="error">{errors.form}</Notice>}

      <div className="flex flex-wrap gap-2">
        <Button type="submit" busy={uploading}>
          {uploading ? "Uploading…" : "Upload and preview"}
        </Button>
        {uploading && (
          <Button variant="secondary" onClick={() => abort.current?.abort()}>
            Cancel upload
          </Button>
        )}
      </div>
    </form>
  );
}

/** The columns the chosen kind needs, folded away until asked for. */
function FormatHelp({ kind }: { kind: ImportKind }) {
  const formats = useQuery(importQueries.formats());
  const columns = formats.data?.[kind];
  return (
    <details className="rounded-control border border-line bg-surface px-4 py-3 text-small">
      <summary className="cursor-pointer font-semibold text-dusk-800">Columns for {kindLabels[kind].toLowerCase()}</summary>
      {formats.isPending && <p className="mt-2 text-muted">Loading the column list…</p>}
      {formats.isError && <p className="mt-2 text-danger-text">The column list could not be loaded: {errorMessage(formats.error)}</p>}
      {columns && (
        <>
          <p className="mt-2 text-muted">Files from other tools can use other column names and units: the next step lets you match them.</p>
          <dl className="mt-2 grid gap-x-4 gap-y-1 sm:grid-cols-[auto_1fr]">
            {columns.map((column) => (
              <div key={column.name} className="contents">
                <dt className="font-mono font-semibold">
                  {column.name}
                  {!column.required && <span className="font-sans font-normal text-muted"> (optional)</span>}
                </dt>
                <dd className="mb-1 text-muted sm:mb-0">{column.description}</dd>
              </div>
            ))}
          </dl>
        </>
      )}
    </details>
  );
}
