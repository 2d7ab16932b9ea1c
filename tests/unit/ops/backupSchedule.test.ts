// Scheduled backups under an injected clock: two months of daily runs leave the rotation's backups and no
// others, each copy verified; a failing run deletes nothing; a missed day is caught up at start.
import fs from "node:fs";
import path from "node:path";
import { Writable } from "node:stream";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { loadConfig } from "../../../server/config";
import { openDatabase } from "../../../server/db/client";
import { createLogger } from "../../../server/logging/logger";
import type { BackupProblem } from "../../../server/ops/backupAlert";
import { startBackupSchedule, nextRunAfter, type Clock } from "../../../server/ops/backupSchedule";
import { backupsToKeep } from "../../../server/ops/rotation";
import { backupFileName, listBackups, type BackupRecord } from "../../../server/ops/scheduledBackup";
import { createSite } from "../../../server/sites/service";
import type { BackupLogEntry } from "../../../shared/schemas/system";
import { tempDbFile } from "../../helpers/testApp";

const KEEP = { daily: 7, weekly: 4, monthly: 12 };

/** A clock whose time moves only when the test fires the pending timer. */
function fakeClock(start: string) {
  let now = new Date(start);
  let pending: { due: number; run: () => void } | null = null;
  const clock: Clock = {
    now: () => new Date(now),
    setTimer: (run, ms) => {
      pending = { due: now.getTime() + ms, run };
      return { cancel: () => (pending = null) };
    },
  };
  return {
    clock,
    pendingAt: () => (pending ? new Date(pending.due).toISOString() : null),
    /** Moves the time to the pending timer's and runs it; resolves when the next timer is set. */
    async fire() {
      const timer = pending!;
      pending = null;
      now = new Date(timer.due);
      timer.run();
      while (!pending) await new Promise((resolve) => setTimeout(resolve, 1));
    },
    async settle() {
      while (!pending) await new Promise((resolve) => setTimeout(resolve, 1));
    },
  };
}

function captureLogger() {
  const lines: Record<string, unknown>[] = [];
  const stream = new Writable({ write: (chunk, _e, done) => (lines.push(JSON.parse(chunk.toString())), done()) });
  return { lines, logger: createLogger({ logLevel: "info", nodeEnv: "test" }, stream) };
}

let dbFile: string;
beforeAll(() => {
  dbFile = tempDbFile("qb-backup-schedule");
  const db = openDatabase(dbFile);
  createSite(db, { code: "NORTH", name: "Northfield Hall" });
  db.$client.close();
});
afterAll(() => fs.rmSync(path.dirname(dbFile), { recursive: true, force: true }));

describe("rotation", () => {
  it("keeps the newest backup of each ISO week, where weeks cross the new year", () => {
    // ISO 8601: 2026-01-01 is a Thursday, so Monday 2025-12-29 starts 2026-W01; Sunday 2025-12-28 ends 2025-W52
    const at = (iso: string) => ({ file: iso, takenAt: new Date(`${iso}T03:00:00Z`) });
    const kept = backupsToKeep([at("2025-12-28"), at("2025-12-29"), at("2026-01-01"), at("2025-12-20")], { daily: 0, weekly: 2, monthly: 0 });
    expect([...kept].sort()).toEqual(["2025-12-28", "2026-01-01"]);
  });

  it("names the hour of the next run in UTC", () => {
    expect(nextRunAfter(new Date("2026-03-01T02:59:59Z"), 3).toISOString()).toBe("2026-03-01T03:00:00.000Z");
    expect(nextRunAfter(new Date("2026-03-01T03:00:00Z"), 3).toISOString()).toBe("2026-03-02T03:00:00.000Z");
    expect(nextRunAfter(new Date("2026-12-31T23:00:00Z"), 3).toISOString()).toBe("2027-01-01T03:00:00.000Z");
  });
});

describe("backup settings", () => {
  it("default to a daily 03:00 UTC backup beside the database, keeping 7, 4 and 12; BACKUP_DIR=off turns them off", () => {
    expect(loadConfig({ QUARTERBEAT_DB: "/srv/qb/quarterbeat.sqlite" }).backups).toEqual({
      dir: "/srv/qb/backups",
      hourUtc: 3,
      keep: { daily: 7, weekly: 4, monthly: 12 },
    });
    expect(loadConfig({}, { dbFile: "/tmp/other/db.sqlite" }).backups.dir).toBe("/tmp/other/backups");
    expect(loadConfig({ BACKUP_DIR: "off" }).backups.dir).toBeNull();
    expect(loadConfig({ BACKUP_DIR: "/mnt/b", BACKUP_HOUR_UTC: "22", BACKUP_KEEP_MONTHLY: "24" }).backups).toMatchObject({
      dir: "/mnt/b",
      hourUtc: 22,
      keep: { monthly: 24 },
    });
    expect(() => loadConfig({ BACKUP_HOUR_UTC: "24" })).toThrow(/BACKUP_HOUR_UTC must be an hour from 0 to 23/);
  });
});

describe("the backup schedule", () => {
  it("takes a missed backup at once, then one a day, and keeps 7 daily, 4 weekly and 12 monthly", { timeout: 120_000 }, async () => {
    const dir = path.join(path.dirname(dbFile), "backups");
    const time = fakeClock("2026-01-01T12:00:00Z");
    const { lines, logger } = captureLogger();
    const problems: BackupProblem[] = [];
    const records: BackupLogEntry[] = [];
    const schedule = startBackupSchedule({
      dbFile,
      dir,
      hourUtc: 3,
      keep: KEEP,
      logger,
      clock: time.clock,
      onProblem: async (p) => void problems.push(p),
      record: (entry) => void records.push(entry),
    });
    await time.settle();
    expect(lines[0]).toMatchObject({ level: 40, event: "backup", lastBackupAt: null });
    expect(listBackups(dir).map((b) => path.basename(b.file))).toEqual([backupFileName(new Date("2026-01-01T12:00:00Z"))]);
    expect(time.pendingAt()).toBe("2026-01-02T03:00:00.000Z");

    while (time.pendingAt()! <= "2026-03-01T03:00:00.000Z") await time.fire();
    schedule.stop();

    // 2026-03-01 is a Sunday: the last four ISO weeks end on Mar 1, Feb 22, Feb 15 and Feb 8; the daily seven
    // are Feb 23 – Mar 1; the monthly ones are Mar 1, Feb 28 and Jan 31. The catch-up copy of Jan 1 is gone.
    const days = ["01-31", "02-08", "02-15", "02-22", "02-23", "02-24", "02-25", "02-26", "02-27", "02-28", "03-01"];
    const kept = listBackups(dir)
      .map((b) => path.basename(b.file))
      .sort();
    expect(kept).toEqual(days.map((day) => backupFileName(new Date(`2026-${day}T03:00:00Z`))));
    // each copy with its verification record, and nothing else (no partial copies, no -wal or -shm files)
    expect(fs.readdirSync(dir).sort()).toEqual(kept.flatMap((name) => [name, `${name}.json`]).sort());

    const record = JSON.parse(fs.readFileSync(`${path.join(dir, kept[kept.length - 1])}.json`, "utf8")) as BackupRecord;
    expect(record).toMatchObject({ ok: true, problem: null, tables: { sites: 1 } });
    const verified = lines.filter((line) => line.msg === "backup verified");
    expect(verified).toHaveLength(60); // the catch-up copy and 59 scheduled days
    expect(verified.every((line) => line.ok === true && typeof line.durationMs === "number")).toBe(true);
    expect(problems).toEqual([]); // the first backup ever is not a missed one
    // every run is recorded for the System page, kept copies and rotated ones alike
    expect(records).toHaveLength(60);
    expect(records.at(-1)).toEqual({
      takenAt: "2026-03-01T03:00:00.000Z",
      file: path.join(dir, kept[kept.length - 1]),
      sizeBytes: fs.statSync(path.join(dir, kept[kept.length - 1])).size,
      source: "scheduled",
      verified: true,
      message: expect.stringMatching(/^Integrity check passed; \d+ rows in \d+ tables/),
    });
  });

  it("logs a failed backup and deletes nothing when a copy cannot be made", { timeout: 60_000 }, async () => {
    const dir = path.join(path.dirname(dbFile), "backups-failing");
    fs.mkdirSync(dir);
    const old = ["2026-01-01", "2026-01-02"].map((day) => path.join(dir, backupFileName(new Date(`${day}T03:00:00Z`))));
    for (const file of old) fs.copyFileSync(dbFile, file);
    const time = fakeClock("2026-02-01T12:00:00Z");
    const { lines, logger } = captureLogger();
    const problems: BackupProblem[] = [];
    const onProblem = async (p: BackupProblem) => void problems.push(p);
    const records: BackupLogEntry[] = [];
    const record = (entry: BackupLogEntry) => void records.push(entry);
    const schedule = startBackupSchedule({
      dbFile: path.join(dir, "no-such-database.sqlite"),
      dir,
      hourUtc: 3,
      keep: { daily: 1, weekly: 0, monthly: 0 },
      logger,
      clock: time.clock,
      onProblem,
      record,
    });
    await time.settle();
    schedule.stop();
    // the newest copy is from 2026-01-02: a missed day, then the catch-up copy fails
    expect(problems).toEqual([
      { kind: "missed", lastBackupAt: "2026-01-02T03:00:00.000Z", at: "2026-02-01T12:00:00.000Z" },
      expect.objectContaining({ kind: "failed", at: "2026-02-01T12:00:00.000Z" }),
    ]);
    expect(lines.find((line) => line.msg === "backup failed")).toMatchObject({
      level: 50,
      ok: false,
      problem: expect.stringMatching(/no-such-database|unable to open|directory does not exist/),
    });
    expect(
      listBackups(dir)
        .map((b) => b.file)
        .sort(),
    ).toEqual(old);
    expect(records).toEqual([
      expect.objectContaining({
        takenAt: "2026-02-01T12:00:00.000Z",
        source: "scheduled",
        verified: false,
        sizeBytes: 0,
        message: problems[1].kind === "failed" ? problems[1].problem : "",
      }),
    ]);
  });

  it("waits for the hour when the newest backup is less than a day old", async () => {
    const dir = path.join(path.dirname(dbFile), "backups-recent");
    fs.mkdirSync(dir);
    fs.copyFileSync(dbFile, path.join(dir, backupFileName(new Date("2026-05-10T03:00:00Z"))));
    const time = fakeClock("2026-05-10T15:00:00Z");
    const { lines, logger } = captureLogger();
    const schedule = startBackupSchedule({ dbFile, dir, hourUtc: 3, keep: KEEP, logger, clock: time.clock });
    expect(time.pendingAt()).toBe("2026-05-11T03:00:00.000Z");
    schedule.stop();
    expect(time.pendingAt()).toBeNull();
    expect(lines).toEqual([]);
  });
});
