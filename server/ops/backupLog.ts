// The record of every backup taken (scheduled or by `quarterbeat backup`) and its verification, which the
// System page and `quarterbeat system` read. A record is housekeeping: writing one changes no figure.
import { desc, eq } from "drizzle-orm";
import type { BackupLogEntry } from "../../shared/schemas/system";
import type { Db } from "../db/client";
import { noteHousekeepingWrite } from "../db/dataState";
import { backupLog } from "../db/schema";

const columns = {
  takenAt: backupLog.takenAt,
  file: backupLog.file,
  sizeBytes: backupLog.sizeBytes,
  source: backupLog.source,
  verified: backupLog.verified,
  message: backupLog.message,
};

export function recordBackup(db: Db, entry: BackupLogEntry): void {
  noteHousekeepingWrite(db.$client, db.insert(backupLog).values(entry).run());
}

/** Newest first. */
export function recentBackups(db: Db, limit = 10): BackupLogEntry[] {
  return db.select(columns).from(backupLog).orderBy(desc(backupLog.takenAt), desc(backupLog.id)).limit(limit).all();
}

export function lastVerifiedBackup(db: Db): BackupLogEntry | null {
  return db.select(columns).from(backupLog).where(eq(backupLog.verified, true)).orderBy(desc(backupLog.takenAt), desc(backupLog.id)).limit(1).get() ?? null;
}

/** What a passed verification checked, for the record. */
export function verifiedMessage(tables: Record<string, number>): string {
  const rows = Object.values(tables).reduce((sum, n) => sum + n, 0);
  return `Integrity check passed; ${rows} rows in ${Object.keys(tables).length} tables, each table's count equal to the database's.`;
}
