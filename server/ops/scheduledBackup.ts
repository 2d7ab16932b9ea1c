// One scheduled backup: an online copy into the backup folder, verified (integrity check, and every table's
// row count equal to the database's in the snapshot copied), recorded beside the copy, then the rotation applied.
import fs from "node:fs";
import path from "node:path";
import Database from "better-sqlite3";
import { checkQuarterbeatDatabase, tableCounts } from "./databaseCheck";
import { backupsToKeep, type BackupEntry, type KeepCounts } from "./rotation";

const NAME = /^quarterbeat-(\d{4}-\d{2}-\d{2})T(\d{2})(\d{2})(\d{2})Z\.sqlite$/;

export interface BackupRecord {
  file: string;
  takenAt: string;
  ok: boolean;
  /** Why verification failed; null when it passed. */
  problem: string | null;
  sizeBytes: number;
  tables: Record<string, number>;
  deleted: string[];
}

export const backupFileName = (at: Date) => `quarterbeat-${at.toISOString().slice(0, 19).replace(/:/g, "")}Z.sqlite`;

/** Backups in the folder, by the time in their names (not file times, which a copy elsewhere changes). */
export function listBackups(dir: string): BackupEntry[] {
  if (!fs.existsSync(dir)) return [];
  return fs.readdirSync(dir).flatMap((name) => {
    const match = NAME.exec(name);
    return match ? [{ file: path.join(dir, name), takenAt: new Date(`${match[1]}T${match[2]}:${match[3]}:${match[4]}Z`) }] : [];
  });
}

function removeBackup(file: string) {
  for (const suffix of ["", ".json", "-wal", "-shm"]) fs.rmSync(file + suffix, { force: true });
}

/**
 * Counts and copy come from one read transaction on a connection of their own: in WAL mode it sees one
 * snapshot while the server goes on writing, so the copy must hold exactly the rows counted.
 */
async function copySnapshot(dbFile: string, target: string): Promise<Record<string, number>> {
  const conn = new Database(dbFile, { readonly: true, fileMustExist: true });
  try {
    conn.exec("BEGIN");
    const counts = tableCounts(conn);
    await conn.backup(target);
    conn.exec("COMMIT");
    return counts;
  } finally {
    conn.close();
  }
}

export interface VerifiedCopy {
  /** False when the copy could not be made or read at all (nothing usable was written). */
  copied: boolean;
  /** Why verification failed; null when it passed. */
  problem: string | null;
  tables: Record<string, number>;
}

/** Copies the database to `target` from one snapshot and verifies the copy against that snapshot's row counts. */
export async function copyAndVerify(dbFile: string, target: string): Promise<VerifiedCopy> {
  try {
    const expected = await copySnapshot(dbFile, target);
    const tables = (await checkQuarterbeatDatabase(target)).tables;
    return { copied: true, problem: describeMismatch(expected, tables), tables };
  } catch (err) {
    return { copied: false, problem: err instanceof Error ? err.message : String(err), tables: {} };
  }
}

export async function takeScheduledBackup(dbFile: string, dir: string, keep: KeepCounts, now: Date): Promise<BackupRecord> {
  fs.mkdirSync(dir, { recursive: true });
  const file = path.join(dir, backupFileName(now));
  const staging = `${file}.partial`;
  fs.rmSync(staging, { force: true });
  const { copied, problem, tables } = await copyAndVerify(dbFile, staging);
  if (copied) fs.renameSync(staging, file);
  else fs.rmSync(staging, { force: true });
  const record: BackupRecord = {
    file,
    takenAt: now.toISOString(),
    ok: problem === null,
    problem,
    sizeBytes: fs.existsSync(file) ? fs.statSync(file).size : 0,
    tables,
    deleted: [],
  };
  if (record.ok) {
    // rotate only after a good copy, so a run of failures never deletes the last good backups
    const keepers = backupsToKeep(listBackups(dir), keep);
    for (const backup of listBackups(dir)) {
      if (keepers.has(backup.file)) continue;
      removeBackup(backup.file);
      record.deleted.push(backup.file);
    }
  }
  if (fs.existsSync(file)) fs.writeFileSync(`${file}.json`, JSON.stringify(record, null, 2));
  return record;
}

function describeMismatch(expected: Record<string, number>, copied: Record<string, number>): string | null {
  const names = [...new Set([...Object.keys(expected), ...Object.keys(copied)])];
  const differing = names.filter((name) => expected[name] !== copied[name]);
  if (differing.length === 0) return null;
  return `The copy's row counts differ from the database's in: ${differing.map((name) => `${name} (${copied[name] ?? "missing"} copied of ${expected[name] ?? "none"})`).join(", ")}.`;
}
