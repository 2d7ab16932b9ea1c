// Takes a verified backup every day at a set hour (UTC) while the server runs, and one at once when the newest
// backup is more than a day old (the server was down at the hour, or has never taken one). The clock is
// injected so that tests can run weeks of schedule in a moment.
import path from "node:path";
import type { BackupLogEntry } from "../../shared/schemas/system";
import type { Logger } from "../logging/logger";
import type { BackupProblem } from "./backupAlert";
import { verifiedMessage } from "./backupLog";
import type { KeepCounts } from "./rotation";
import { listBackups, takeScheduledBackup, type BackupRecord } from "./scheduledBackup";

export interface Clock {
  now(): Date;
  /** Calls `run` after `ms` milliseconds; the timer never keeps the process alive. */
  setTimer(run: () => void, ms: number): { cancel(): void };
}

export const systemClock: Clock = {
  now: () => new Date(),
  setTimer: (run, ms) => {
    const timer = setTimeout(run, ms);
    timer.unref();
    return { cancel: () => clearTimeout(timer) };
  },
};

export interface BackupScheduleOptions {
  dbFile: string;
  dir: string;
  hourUtc: number;
  keep: KeepCounts;
  logger: Logger;
  clock?: Clock;
  /** Told of a failed backup, and of a missed day (not of the very first backup). */
  onProblem?: (problem: BackupProblem) => Promise<void>;
  /** Keeps each run's outcome (ops/backupLog.ts in the server). */
  record?: (entry: BackupLogEntry) => void;
}

const DAY_MS = 24 * 60 * 60 * 1000;

/** The first `hourUtc`:00 UTC strictly after `now`. */
export function nextRunAfter(now: Date, hourUtc: number): Date {
  const next = new Date(Date.UTC(now.getUTCFullYear(), now.getUTCMonth(), now.getUTCDate(), hourUtc));
  if (next.getTime() <= now.getTime()) next.setUTCDate(next.getUTCDate() + 1);
  return next;
}

export interface BackupSchedule {
  /** Resolves when the backup under way (if any) has finished. */
  idle(): Promise<void>;
  stop(): void;
}

export function startBackupSchedule(options: BackupScheduleOptions): BackupSchedule {
  const clock = options.clock ?? systemClock;
  let timer: { cancel(): void } | null = null;
  let running: Promise<void> = Promise.resolve();
  let stopped = false;

  const logResult = (record: BackupRecord, durationMs: number) => {
    const fields = {
      event: "backup",
      file: path.basename(record.file),
      ok: record.ok,
      sizeBytes: record.sizeBytes,
      rows: Object.values(record.tables).reduce((sum, n) => sum + n, 0),
      deleted: record.deleted.length,
      durationMs,
    };
    if (record.ok) options.logger.info(fields, "backup verified");
    else options.logger.error({ ...fields, problem: record.problem }, "backup failed");
  };

  const record = (entry: Omit<BackupLogEntry, "source">) => {
    try {
      options.record?.({ ...entry, source: "scheduled" });
    } catch (err) {
      // the backup itself stands; only its record is missing, which the log line says
      options.logger.error({ event: "backup", err }, "backup not recorded");
    }
  };

  const run = () => {
    running = running.then(async () => {
      if (stopped) return;
      const started = Date.now();
      const at = clock.now();
      try {
        const result = await takeScheduledBackup(options.dbFile, options.dir, options.keep, at);
        logResult(result, Date.now() - started);
        record({
          takenAt: result.takenAt,
          file: result.file,
          sizeBytes: result.sizeBytes,
          verified: result.ok,
          message: result.problem ?? verifiedMessage(result.tables),
        });
        if (!result.ok) await options.onProblem?.({ kind: "failed", file: result.file, at: result.takenAt, problem: result.problem ?? "unknown" });
      } catch (err) {
        // e.g. the backup folder cannot be written: the schedule goes on, and the next run tries again
        options.logger.error({ event: "backup", ok: false, err }, "backup failed");
        record({ takenAt: at.toISOString(), file: options.dir, sizeBytes: 0, verified: false, message: (err as Error).message });
        await options.onProblem?.({ kind: "failed", file: options.dir, at: at.toISOString(), problem: (err as Error).message });
      }
    });
    return running;
  };

  const scheduleNext = () => {
    if (stopped) return;
    const now = clock.now();
    timer = clock.setTimer(() => void run().then(scheduleNext), nextRunAfter(now, options.hourUtc).getTime() - now.getTime());
  };

  const newest = Math.max(0, ...listBackups(options.dir).map((backup) => backup.takenAt.getTime()));
  if (clock.now().getTime() - newest > DAY_MS) {
    const lastBackupAt = newest ? new Date(newest).toISOString() : null;
    options.logger.warn({ event: "backup", lastBackupAt }, "backup missed: taking one now");
    if (lastBackupAt) void options.onProblem?.({ kind: "missed", lastBackupAt, at: clock.now().toISOString() });
    void run().then(scheduleNext);
  } else {
    scheduleNext();
  }

  return {
    idle: () => running,
    stop: () => {
      stopped = true;
      timer?.cancel();
    },
  };
}
