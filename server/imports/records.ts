// Web uploads and import jobs, kept in SQLite so that their ids still answer after the server restarts.
// While the server runs, its live uploads and jobs are in memory (uploads.ts, jobs.ts) and each change of
// state is written here. A server that stops leaves its unfinished jobs and its uploads behind: the next one
// ends them at start-up (endStoppedServerWork) — an import is stored whole or not at all, so an interrupted
// job wrote nothing — and removes their files, and their ids answer with what happened instead of 404.
//
// The request thread never waits for the write lock (a CLI or worker import may hold it for a minute): a
// write that finds it taken stays pending and is tried again shortly, in order. Until it lands, the rule on
// reading is the same as after a restart: an unfinished job or an open upload that is not live in this
// process was left by a stopped server.
import fs from "node:fs";
import { and, eq, inArray, isNotNull, lt, notInArray, or, sql } from "drizzle-orm";
import type { ImportJob, ImportSummary, JobStatus, UploadEndReason } from "../../shared/import/api";
import { finishedJobStatuses } from "../../shared/import/api";
import type { ImportKind, UserRole } from "../../shared/domain";
import { can } from "../../shared/permissions";
import type { Db } from "../db/client";
import { noteHousekeepingWrite } from "../db/dataState";
import { importJobs, importUploads } from "../db/schema";
import { isBusy, withoutWaiting } from "../db/writeWhenFree";
import type { Logger } from "../logging/logger";

/** Records of ended uploads and finished jobs are kept this long, then deleted at a start-up. */
const KEEP_RECORDS_MS = 30 * 24 * 60 * 60 * 1000;
const RETRY_MS = 100;

export interface UploadRecord {
  id: string;
  userId: number;
  kind: ImportKind;
  fileName: string;
  size: number;
  path: string;
  uploadedAt: string;
  endedAt: string | null;
  endReason: UploadEndReason | null;
}

export interface JobRecord {
  id: string;
  uploadId: string;
  userId: number;
  mode: "validate" | "import";
  status: JobStatus;
  totalBytes: number | null;
  rows: number;
  summary: ImportSummary | null;
  error: string | null;
  rejectedPath: string;
  rejectedKept: boolean;
  createdAt: string;
  finishedAt: string | null;
}

/** An upload or job is its maker's; importers with "any" reach may use anyone's. */
export function mayUseImport(owner: number, user: { id: number; role: UserRole }): boolean {
  return owner === user.id || can(user, "importData", "any");
}

/** What a job that the server's stop cut short says. */
export function interruptedMessage(mode: "validate" | "import"): string {
  return mode === "import"
    ? "The server restarted before this import finished. Nothing was written: an import is stored whole or not at all. Upload the file again to import it."
    : "The server restarted before this check finished. Nothing was written. Upload the file again to check it.";
}

/** Why an upload can no longer be used. */
export function uploadEndedMessage(reason: UploadEndReason | null): string {
  return reason === "expired"
    ? "This upload was removed: uploads are kept for 6 hours. Upload the file again."
    : "This upload was removed when the server restarted. Upload the file again.";
}

export class ImportRecords {
  /** Writes not yet stored, by what they write (a later state of the same job replaces an earlier one). */
  private readonly pending = new Map<string, () => void>();
  private retry: NodeJS.Timeout | null = null;

  constructor(
    private readonly db: Db,
    private readonly logger?: Logger,
  ) {}

  saveUpload(upload: UploadRecord): void {
    const row = { ...upload, sizeBytes: upload.size };
    this.write(`upload:${upload.id}`, () =>
      this.housekeeping(
        this.db
          .insert(importUploads)
          .values(row)
          .onConflictDoUpdate({ target: importUploads.id, set: { endedAt: row.endedAt, endReason: row.endReason } })
          .run(),
      ),
    );
  }

  saveJob(job: JobRecord): void {
    const row = { ...job, rowsRead: job.rows };
    const { id: _id, ...changes } = row;
    this.write(`job:${job.id}`, () =>
      this.housekeeping(this.db.insert(importJobs).values(row).onConflictDoUpdate({ target: importJobs.id, set: changes }).run()),
    );
  }

  findUpload(id: string): UploadRecord | null {
    const row = this.db.select().from(importUploads).where(eq(importUploads.id, id)).get();
    if (!row) return null;
    const { sizeBytes, ...rest } = row;
    return { ...rest, size: sizeBytes };
  }

  findJob(id: string): JobRecord | null {
    const row = this.db.select().from(importJobs).where(eq(importJobs.id, id)).get();
    if (!row) return null;
    const { rowsRead, summary, ...rest } = row;
    return { ...rest, rows: rowsRead, summary: summary as ImportSummary | null };
  }

  /**
   * At start-up, before any upload or job of this server exists: removes the files of the stopped server's
   * uploads and jobs, ends its uploads and marks its unfinished jobs interrupted, and forgets old records.
   */
  endStoppedServerWork(now = new Date()): void {
    const openUploads = this.db
      .select({ path: importUploads.path })
      .from(importUploads)
      .where(sql`${importUploads.endedAt} IS NULL`)
      .all();
    const jobFiles = this.db
      .select({ path: importJobs.rejectedPath })
      .from(importJobs)
      .where(or(eq(importJobs.rejectedKept, true), notInArray(importJobs.status, [...finishedJobStatuses])))
      .all();
    for (const { path } of [...openUploads, ...jobFiles]) fs.rmSync(path, { force: true });

    const at = now.toISOString();
    const forgetBefore = new Date(now.getTime() - KEEP_RECORDS_MS).toISOString();
    this.write("start-up", () => {
      this.db.transaction((tx) => {
        const changed = [
          tx
            .update(importUploads)
            .set({ endedAt: at, endReason: "restarted" })
            .where(sql`${importUploads.endedAt} IS NULL`)
            .run(),
          tx
            .update(importJobs)
            .set({
              status: "interrupted",
              error: sql`CASE ${importJobs.mode} WHEN 'import' THEN ${interruptedMessage("import")} ELSE ${interruptedMessage("validate")} END`,
              finishedAt: at,
            })
            .where(notInArray(importJobs.status, [...finishedJobStatuses]))
            .run(),
          tx.update(importJobs).set({ rejectedKept: false }).where(eq(importJobs.rejectedKept, true)).run(),
          tx
            .delete(importUploads)
            .where(and(isNotNull(importUploads.endedAt), lt(importUploads.endedAt, forgetBefore)))
            .run(),
          tx
            .delete(importJobs)
            .where(and(inArray(importJobs.status, [...finishedJobStatuses]), lt(importJobs.finishedAt, forgetBefore)))
            .run(),
        ];
        for (const info of changed) this.housekeeping(info);
      });
    });
  }

  /** Stores every pending write now, waiting for the lock if need be (shutdown, tests). */
  flushWaiting(): void {
    if (this.retry) clearTimeout(this.retry);
    this.retry = null;
    for (const [key, run] of this.pending) {
      this.pending.delete(key);
      this.attempt(run, false);
    }
  }

  /** Writes still waiting for the lock. */
  get pendingWrites(): number {
    return this.pending.size;
  }

  /** No figure reads these rows: their writes stay out of the data state (see db/dataState). */
  private housekeeping(info: { changes: number; lastInsertRowid: number | bigint }): void {
    noteHousekeepingWrite(this.db.$client, info);
  }

  private write(key: string, run: () => void): void {
    this.pending.delete(key); // a newer state goes to the end of the line
    this.pending.set(key, run);
    this.flush();
  }

  /** Stores pending writes in order until one finds the lock taken; that one and the rest are tried later. */
  private flush(): void {
    if (!this.db.$client.open) return;
    for (const [key, run] of this.pending) {
      if (!this.attempt(run, true)) {
        this.retry ??= setTimeout(() => {
          this.retry = null;
          this.flush();
        }, RETRY_MS).unref();
        return;
      }
      this.pending.delete(key);
    }
  }

  /** false when the write lock is taken; any other failure is logged and the write given up. */
  private attempt(run: () => void, quickly: boolean): boolean {
    try {
      if (quickly) withoutWaiting(this.db.$client, run);
      else run();
      return true;
    } catch (err) {
      if (quickly && isBusy(err)) return false;
      // a record that cannot be stored costs the id's answer after a restart, never the upload or import itself
      this.logger?.warn({ err }, "an import record could not be stored");
      return true;
    }
  }
}

/**
 * Called by the import worker on its own connection as soon as a job's import or check has finished, before
 * it tells the server: the request thread's write of the same state may wait for the lock, and a server that
 * stopped in between must not report a stored import as interrupted. (If the job's first record has not
 * landed yet, this changes nothing and the server's own write, with the same state, follows.)
 */
export function recordJobDone(db: Db, jobId: string, summary: ImportSummary, finishedAt = new Date()): void {
  const info = db
    .update(importJobs)
    .set({ status: "done", summary, error: null, rowsRead: summary.rowsRead, rejectedKept: summary.issuesTotal > 0, finishedAt: finishedAt.toISOString() })
    .where(eq(importJobs.id, jobId))
    .run();
  noteHousekeepingWrite(db.$client, info);
}

/**
 * The answer for a job that is not live in this process: one of a stopped server, or one this server has
 * forgotten. Unfinished in the record means its server stopped before the end (the start-up write saying
 * so may still be pending).
 */
export function jobFromRecord(record: JobRecord): ImportJob {
  const cutShort = !finishedJobStatuses.includes(record.status);
  const status: JobStatus = cutShort ? "interrupted" : record.status;
  return {
    id: record.id,
    uploadId: record.uploadId,
    mode: record.mode,
    status,
    progress: { bytesRead: status === "done" ? (record.totalBytes ?? 0) : 0, totalBytes: record.totalBytes, rows: record.rows },
    summary: record.summary,
    error: cutShort ? interruptedMessage(record.mode) : record.error,
    rejectedCsvUrl:
      status === "done" && record.rejectedKept && record.summary && record.summary.issuesTotal > 0 ? `/api/imports/jobs/${record.id}/rejected.csv` : null,
    createdAt: record.createdAt,
  };
}
