// Validation and import jobs of the web upload. They run in one long-lived worker thread (importWorker.ts)
// with its own database connection, one after another, so two imports never wait on each other's write lock
// and no job pays for starting a thread. A worker that dies fails its job and is replaced for the next.
// The page polls a job for its progress (bytes read of the total, rows) and then reads its summary.
// Each change of a job's state is also recorded in SQLite (records.ts), so that after a restart its id
// answers with its outcome, or as interrupted when the server stopped before it finished.
import crypto from "node:crypto";
import fs from "node:fs";
import { Worker } from "node:worker_threads";
import type { UserRole } from "../../shared/domain";
import { apiErrorCodes } from "../../shared/errorCodes";
import { finishedJobStatuses, type ImportJob, type ImportSummary } from "../../shared/import/api";
import type { ImportMapping } from "../../shared/import/mapping";
import { AppError } from "../errors";
import { logImport } from "../logging/events";
import type { Logger } from "../logging/logger";
import { jobFromRecord, mayUseImport, type ImportRecords, type JobRecord } from "./records";
import type { ImportActor } from "./run";
import { rejectedRowsPath, type StoredUpload } from "./uploads";
import type { WorkerInput, WorkerMessage } from "./importWorker";

interface JobState extends ImportJob {
  userId: number;
  rejectedPath: string;
  finishedAt: string | null;
}

// From source the worker is TypeScript loaded through tsx (worker.mjs); compiled, it is the bundle
// importWorker.js beside this one in dist/server (scripts/build-server.mjs).
const workerUrl = new URL(import.meta.url.endsWith(".ts") ? "./worker.mjs" : "./importWorker.js", import.meta.url);
const KEEP_JOBS = 200;

export class ImportJobs {
  private readonly jobs = new Map<string, JobState>();
  private tail: Promise<void> = Promise.resolve();
  private worker: Worker | null = null;
  private current: { job: JobState; finish: (summary: ImportSummary | null, error: string | null) => void } | null = null;

  constructor(
    private readonly dbFile: string,
    private readonly records: ImportRecords,
    private readonly logger?: Logger,
    /** Called once an import job has written a batch (not for validation or a refused file). */
    private readonly afterImport?: (summary: ImportSummary) => void,
  ) {}

  start(upload: StoredUpload, mode: "validate" | "import", mapping: ImportMapping, skipInvalid: boolean, actor: ImportActor & { userId: number }): ImportJob {
    const id = crypto.randomBytes(12).toString("hex");
    const job: JobState = {
      id,
      uploadId: upload.id,
      mode,
      status: "queued",
      progress: { bytesRead: 0, totalBytes: upload.size, rows: 0 },
      summary: null,
      error: null,
      rejectedCsvUrl: null,
      createdAt: new Date().toISOString(),
      userId: actor.userId,
      rejectedPath: rejectedRowsPath(upload.path, id),
      finishedAt: null,
    };
    this.jobs.set(id, job);
    this.save(job);
    this.forgetOld();
    const input: WorkerInput = {
      jobId: id,
      dbFile: this.dbFile,
      options: {
        kind: upload.kind,
        input: { path: upload.path, fileName: upload.fileName },
        mapping,
        dryRun: mode === "validate",
        skipInvalid,
        actor,
        source: "web",
        rejectedCsvPath: job.rejectedPath,
      },
    };
    this.tail = this.tail.then(() => this.run(job, input));
    return publicJob(job);
  }

  get(id: string, user: { id: number; role: UserRole }): ImportJob {
    const live = this.jobs.get(id);
    if (live && mayUseImport(live.userId, user)) return publicJob(live);
    const record = live ? null : this.records.findJob(id);
    if (record && mayUseImport(record.userId, user)) return jobFromRecord(record);
    throw jobNotFound();
  }

  /** Path of the job's refused rows as CSV, once it has some. */
  rejectedCsv(id: string, user: { id: number; role: UserRole }): string {
    const job = this.jobs.get(id);
    if (job && mayUseImport(job.userId, user)) {
      if (job.status !== "done" || !job.rejectedCsvUrl || !fs.existsSync(job.rejectedPath))
        throw new AppError(apiErrorCodes.notFound, 404, "This job has no refused rows to download.");
      return job.rejectedPath;
    }
    this.get(id, user); // 404 unless the user's job is on record
    throw new AppError(
      apiErrorCodes.notFound,
      404,
      "The refused rows of this job were removed with its upload. An import keeps its refused rows in the import history.",
    );
  }

  /** Resolves when every job started so far has finished (tests, shutdown). */
  idle(): Promise<void> {
    return this.tail;
  }

  private save(job: JobState) {
    this.records.saveJob(recordOf(job));
  }

  private run(job: JobState, input: WorkerInput): Promise<void> {
    job.status = "running";
    this.save(job);
    const started = Date.now();
    return new Promise((resolve) => {
      let finished = false;
      const finish = (summary: ImportSummary | null, error: string | null) => {
        if (finished) return;
        finished = true;
        if (this.logger) {
          const durationMs = Date.now() - started;
          logImport(this.logger, { jobId: job.id, userId: job.userId, mode: job.mode, kind: input.options.kind, summary, failed: error !== null, durationMs });
        }
        this.current = null;
        job.summary = summary;
        job.error = error;
        job.status = error ? "failed" : "done";
        if (summary && summary.issuesTotal > 0) job.rejectedCsvUrl = `/api/imports/jobs/${job.id}/rejected.csv`;
        job.finishedAt = new Date().toISOString();
        this.save(job);
        if (summary?.status === "imported" && job.mode === "import") this.afterImport?.(summary);
        resolve();
      };
      this.current = { job, finish };
      this.ensureWorker().postMessage(input);
    });
  }

  private ensureWorker(): Worker {
    if (this.worker) return this.worker;
    const worker = new Worker(workerUrl);
    worker.unref(); // an idle worker never keeps the process alive
    worker.on("message", (message: WorkerMessage) => {
      const current = this.current;
      if (!current || message.jobId !== current.job.id) return;
      const job = current.job;
      if (message.type === "progress") job.progress = { bytesRead: message.bytesRead, totalBytes: message.totalBytes, rows: message.rows };
      else if (message.type === "done") {
        job.progress = { ...job.progress, bytesRead: job.progress.totalBytes ?? job.progress.bytesRead, rows: message.summary.rowsRead };
        current.finish(message.summary, null);
      } else current.finish(null, message.message);
    });
    worker.on("error", (err) => this.current?.finish(null, `The import stopped: ${err.message}`));
    worker.on("exit", (code) => {
      this.worker = null;
      this.current?.finish(null, `The import stopped (the worker exited with code ${code}).`);
    });
    this.worker = worker;
    return worker;
  }

  /** Stops the worker (shutdown, tests). */
  async close() {
    const worker = this.worker;
    this.worker = null;
    await worker?.terminate();
  }

  private forgetOld() {
    if (this.jobs.size <= KEEP_JOBS) return;
    for (const [id, job] of this.jobs) {
      if (this.jobs.size <= KEEP_JOBS) break;
      if (finishedJobStatuses.includes(job.status)) {
        fs.rmSync(job.rejectedPath, { force: true });
        this.jobs.delete(id);
        // its record still answers for it, without the refused rows
        this.records.saveJob({ ...recordOf(job), rejectedKept: false });
      }
    }
  }
}

const jobNotFound = () => new AppError(apiErrorCodes.notFound, 404, "The import job was not found.");

function recordOf(job: JobState): JobRecord {
  return {
    id: job.id,
    uploadId: job.uploadId,
    userId: job.userId,
    mode: job.mode,
    status: job.status,
    totalBytes: job.progress.totalBytes,
    rows: job.progress.rows,
    summary: job.summary,
    error: job.error,
    rejectedPath: job.rejectedPath,
    rejectedKept: job.rejectedCsvUrl !== null,
    createdAt: job.createdAt,
    finishedAt: job.finishedAt,
  };
}

function publicJob(job: JobState): ImportJob {
  const { userId: _user, rejectedPath: _path, finishedAt: _finished, ...rest } = job;
  return { ...rest, progress: { ...rest.progress } };
}
