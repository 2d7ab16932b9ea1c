// The import flow, one step at a time: choose the file → match its columns → validate (nothing written) →
// import → summary. Focus moves to each step's heading so keyboard and screen-reader users follow along.
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { useEffect, useRef, useState } from "react";
import type { ImportKind } from "../../../shared/domain";
import type { ImportJob, Preview, Upload } from "../../../shared/import/api";
import type { ImportMapping } from "../../../shared/import/mapping";
import { invalidateFigures } from "../../app/figureQueries";
import { Button } from "../../components/Button";
import { Notice } from "../../components/Notice";
import { errorMessage } from "../../components/States";
import { ChooseFileStep } from "./ChooseFileStep";
import { JobProgress } from "./JobProgress";
import { formatCount, kindLabels, plural } from "./labels";
import { draftFromMapping, type MappingDraft } from "./mappingDraft";
import { MappingStep } from "./MappingStep";
import { importQueries, startJob } from "./queries";
import { ValidationReport } from "./ValidationReport";

type Step = "choose" | "map" | "validate" | "import";

const steps: { id: Step; title: string }[] = [
  { id: "choose", title: "Choose the file" },
  { id: "map", title: "Match the columns" },
  { id: "validate", title: "Validate" },
  { id: "import", title: "Import" },
];

interface Loaded {
  upload: Upload;
  preview: Preview;
  draft: MappingDraft;
}

export function ImportWizard({ onImported }: { onImported?: (batchId: number | null) => void }) {
  const queryClient = useQueryClient();
  const [step, setStep] = useState<Step>("choose");
  const [kind, setKind] = useState<ImportKind | null>(null);
  const [loaded, setLoaded] = useState<Loaded | null>(null);
  const [mapping, setMapping] = useState<ImportMapping | null>(null);
  const [validateJobId, setValidateJobId] = useState<string | null>(null);
  const [importJobId, setImportJobId] = useState<string | null>(null);
  const [skipInvalid, setSkipInvalid] = useState(false);
  const headingRef = useRef<HTMLHeadingElement>(null);
  const firstRender = useRef(true);

  useEffect(() => {
    if (firstRender.current) {
      firstRender.current = false;
      return;
    }
    headingRef.current?.focus();
  }, [step]);

  const start = useMutation({
    mutationFn: ({ mode, mapping: used, skip }: { mode: "validate" | "import"; mapping: ImportMapping; skip: boolean }) =>
      startJob(loaded!.upload.id, mode, used, skip),
  });

  const validateJob = useQuery({ ...importQueries.job(validateJobId ?? ""), enabled: validateJobId !== null });
  const importJob = useQuery({ ...importQueries.job(importJobId ?? ""), enabled: importJobId !== null });

  // A finished import changes the history below and every figure computed from the data (once per job).
  const announced = useRef<string | null>(null);
  const finishedImport = importJob.data?.status === "done" ? importJob.data : null;
  useEffect(() => {
    if (!finishedImport || announced.current === finishedImport.id) return;
    announced.current = finishedImport.id;
    void invalidateFigures(queryClient);
    onImported?.(finishedImport.summary?.batchId ?? null);
  }, [finishedImport, queryClient, onImported]);

  function uploaded(upload: Upload, preview: Preview) {
    setKind(upload.kind);
    setLoaded({ upload, preview, draft: draftFromMapping(upload.kind, preview.header, preview.suggestedMapping) });
    setValidateJobId(null);
    setImportJobId(null);
    setSkipInvalid(false);
    setStep("map");
  }

  function validate(used: ImportMapping) {
    setMapping(used);
    start.reset();
    start.mutate(
      { mode: "validate", mapping: used, skip: false },
      {
        onSuccess: (job) => {
          setValidateJobId(job.id);
          setImportJobId(null);
          setSkipInvalid(false);
          setStep("validate");
        },
      },
    );
  }

  function runImport() {
    if (!mapping) return;
    start.reset();
    start.mutate(
      { mode: "import", mapping, skip: skipInvalid },
      {
        onSuccess: (job) => {
          setImportJobId(job.id);
          setStep("import");
        },
      },
    );
  }

  function startOver() {
    setLoaded(null);
    setMapping(null);
    setValidateJobId(null);
    setImportJobId(null);
    start.reset();
    setStep("choose");
  }

  const current = steps.findIndex((s) => s.id === step);

  return (
    <section aria-labelledby="wizard-heading" className="flex flex-col gap-5 rounded-card border border-line bg-surface p-4 shadow-card sm:p-6">
      <h2 id="wizard-heading" className="sr-only">
        Import a file
      </h2>
      <ol aria-label="Steps" className="grid grid-cols-2 gap-2 text-small sm:grid-cols-4">
        {steps.map((s, i) => (
          <li
            key={s.id}
            aria-current={i === current ? "step" : undefined}
            className={`flex items-center gap-2 rounded-control border px-3 py-2 ${i === current ? "border-dusk-600 bg-dusk-50 font-semibold text-dusk-900" : i < current ? "border-line text-ink" : "border-line text-muted"}`}
          >
            <span
              aria-hidden="true"
              className={`inline-flex size-6 shrink-0 items-center justify-center rounded-full border text-caption font-bold ${i < current ? "border-dusk-700 bg-dusk-700 text-white" : i === current ? "border-dusk-700 text-dusk-800" : "border-line-strong"}`}
            >
              {i < current ? "✓" : i + 1}
            </span>
            <span>
              {s.title}
              <span className="sr-only">{i < current ? " (done)" : i === current ? " (current step)" : ""}</span>
            </span>
          </li>
        ))}
      </ol>

      <div className="flex flex-col gap-4">
        <h3 ref={headingRef} tabIndex={-1} className="scroll-mt-24 text-title outline-none">
          Step {current + 1} of {steps.length}: {steps[current].title}
        </h3>

        {step === "choose" && <ChooseFileStep initialKind={kind} onUploaded={uploaded} />}

        {step === "map" && loaded && (
          <>
            <MappingStep
              kind={loaded.upload.kind}
              upload={loaded.upload}
              preview={loaded.preview}
              draft={loaded.draft}
              onDraftChange={(draft) => setLoaded({ ...loaded, draft })}
              onBack={startOver}
              onValidate={validate}
              busy={start.isPending}
            />
            {start.isError && <Notice tone="error">Validation could not start: {errorMessage(start.error)}</Notice>}
          </>
        )}

        {step === "validate" && loaded && (
          <ValidateStep
            job={validateJob.data}
            pollError={validateJob.error}
            fileName={loaded.upload.fileName}
            kind={loaded.upload.kind}
            skipInvalid={skipInvalid}
            onSkipInvalidChange={setSkipInvalid}
            onImport={runImport}
            importing={start.isPending}
            startError={start.isError ? errorMessage(start.error) : null}
            onBackToMapping={() => setStep("map")}
            onNewFile={startOver}
          />
        )}

        {step === "import" && loaded && (
          <ImportStep
            job={importJob.data}
            pollError={importJob.error}
            fileName={loaded.upload.fileName}
            onNewFile={startOver}
            onBackToMapping={() => setStep("map")}
          />
        )}
      </div>
    </section>
  );
}

interface ValidateStepProps {
  job: ImportJob | undefined;
  pollError: unknown;
  fileName: string;
  kind: ImportKind;
  skipInvalid: boolean;
  onSkipInvalidChange: (skip: boolean) => void;
  onImport: () => void;
  importing: boolean;
  startError: string | null;
  onBackToMapping: () => void;
  onNewFile: () => void;
}

function ValidateStep({
  job,
  pollError,
  fileName,
  kind,
  skipInvalid,
  onSkipInvalidChange,
  onImport,
  importing,
  startError,
  onBackToMapping,
  onNewFile,
}: ValidateStepProps) {
  const back = (
    <>
      <Button variant="secondary" onClick={onBackToMapping}>
        Change the column matches
      </Button>
      <Button variant="secondary" onClick={onNewFile}>
        Upload a corrected file
      </Button>
    </>
  );
  if (pollError && !job) return <JobError message={errorMessage(pollError)} actions={back} />;
  if (!job || job.status === "queued" || job.status === "running") return <JobProgress job={job} fileName={fileName} />;
  // failed, or interrupted by a server restart: the server's message says what happened and what to do
  if (job.status !== "done" || !job.summary) return <JobError message={job.error ?? "The check stopped without a result."} actions={back} />;

  const summary = job.summary;
  const things = summary.unit === "attempts" ? "attempt" : "row";
  const good = summary.inserted + summary.updated + summary.unchanged;
  const changes = summary.inserted + summary.updated;
  const needsChoice = summary.rejected > 0 && good > 0;
  const canImport = good > 0 && (!needsChoice || skipInvalid);

  return (
    <div className="flex flex-col gap-6">
      <ValidationReport summary={summary} rejectedCsvUrl={job.rejectedCsvUrl} />

      <section aria-labelledby="confirm-heading" className="flex flex-col gap-3 rounded-card border border-line-strong bg-paper p-4">
        <h4 id="confirm-heading" className="text-lead font-semibold">
          Import {kindLabels[kind].toLowerCase()}
        </h4>
        {good === 0 ? (
          <p>Nothing in this file can be imported yet. Download the refused rows, correct them in the file, and upload it again.</p>
        ) : (
          <>
            {changes === 0 && <p>Everything in this file is already in Quarterbeat; importing it changes nothing but records the file in the history.</p>}
            {needsChoice && (
              <>
                <p>
                  You can fix the file first (download the refused rows, correct them, upload again), or import the {plural(good, `valid ${things}`)} now and
                  keep the {plural(summary.rejected, "refused row")} in the import history to correct later.
                </p>
                <label className="flex cursor-pointer items-start gap-3 rounded-control border border-line-strong bg-surface p-3">
                  <input
                    type="checkbox"
                    checked={skipInvalid}
                    onChange={(event) => onSkipInvalidChange(event.target.checked)}
                    className="mt-1 size-4 shrink-0 accent-dusk-700"
                  />
                  <span>
                    Import the {plural(good, `valid ${things}`)} and keep the {plural(summary.rejected, "refused row")}
                  </span>
                </label>
              </>
            )}
          </>
        )}
        {startError && <Notice tone="error">The import could not start: {startError}</Notice>}
        <div className="flex flex-wrap gap-2">
          {good > 0 && (
            <Button
              onClick={onImport}
              disabled={!canImport}
              busy={importing}
              aria-describedby={needsChoice && !skipInvalid ? "import-needs-choice" : undefined}
            >
              Import {formatCount(good)} {good === 1 ? things : `${things}s`}
            </Button>
          )}
          {back}
        </div>
        {needsChoice && !skipInvalid && (
          <p id="import-needs-choice" className="text-small text-muted">
            Tick the box above to import with refused rows, or correct the file first.
          </p>
        )}
      </section>
    </div>
  );
}

function ImportStep({
  job,
  pollError,
  fileName,
  onNewFile,
  onBackToMapping,
}: {
  job: ImportJob | undefined;
  pollError: unknown;
  fileName: string;
  onNewFile: () => void;
  onBackToMapping: () => void;
}) {
  const again = (
    <Button variant="secondary" onClick={onNewFile}>
      Import another file
    </Button>
  );
  if (pollError && !job) return <JobError message={errorMessage(pollError)} actions={again} />;
  if (!job || job.status === "queued" || job.status === "running") return <JobProgress job={job} fileName={fileName} />;
  if (job.status !== "done" || !job.summary)
    return <JobError message={job.error ?? "The import stopped without a result. Nothing was written."} actions={again} />;
  const summary = job.summary;
  return (
    <div className="flex flex-col gap-4">
      {summary.status === "imported" ? (
        <Notice tone="success">
          {fileName} is imported{summary.batchId !== null ? ` as batch ${summary.batchId}` : ""}. It is listed in the import history below
          {summary.rejected > 0 ? ", with its refused rows" : ""}.
        </Notice>
      ) : summary.status === "unchanged" ? (
        <Notice tone="info">Nothing changed: every row of {fileName} is already stored as it is in the file, so no batch was recorded.</Notice>
      ) : (
        <Notice tone="error">
          The import was refused and nothing was written: the file or the data changed since it was validated. See the problems below.
        </Notice>
      )}
      <ValidationReport summary={summary} rejectedCsvUrl={job.rejectedCsvUrl} />
      <div className="flex flex-wrap gap-2">
        {again}
        {summary.status === "refused" && (
          <Button variant="secondary" onClick={onBackToMapping}>
            Change the column matches
          </Button>
        )}
      </div>
    </div>
  );
}

function JobError({ message, actions }: { message: string; actions: React.ReactNode }) {
  return (
    <div className="flex flex-col gap-3">
      <Notice tone="error">{message}</Notice>
      <div className="flex flex-wrap gap-2">{actions}</div>
    </div>
  );
}
