// What the fault tests share: generated attempt files, the CLI as a child process, a write-lock probe.
import { spawn, type ChildProcess } from "node:child_process";
import fs from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";
import Database from "better-sqlite3";

export const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "../..");
export const CLASSES_FIXTURE = path.join(root, "tests/fixtures/import/classes-valid.csv");

const ATTEMPTS_HEADER =
  "attempt_id,class_id,learner,manikin,profile,feedback,started_at,duration_s,compressions,rate_cpm,depth_mm,depth_ok_pct,too_shallow_pct,too_deep_pct,rate_ok_pct,too_slow_pct,too_fast_pct,recoil_ok_pct,hands_on_pct,longest_pause_s,instructor_result";

/** An attempt summary file of `rows` valid attempts of class C-001 (from classes-valid.csv), ids `${prefix}-n`. */
export function writeAttemptsFile(file: string, prefix: string, rows: number): string {
  const fd = fs.openSync(file, "w");
  let chunk = `${ATTEMPTS_HEADER}\n`;
  for (let i = 0; i < rows; i++) {
    chunk += `${prefix}-${i},C-001,L-${i % 5000},MK-1,adult,${i % 2 ? "live" : "hidden"},2026-07-14T10:00:00Z,120,230,112,54,85,10,5,80,12,8,90,85,4,\n`;
    if (chunk.length > 1 << 20) {
      fs.writeSync(fd, chunk);
      chunk = "";
    }
  }
  fs.writeSync(fd, chunk);
  fs.closeSync(fd);
  return file;
}

export interface CliRun {
  child: ChildProcess;
  done: Promise<{ code: number | null; signal: NodeJS.Signals | null; stdout: string; stderr: string }>;
}

/** `quarterbeat --db <db> …args` as a child process of its own (node with tsx, no npx in between). */
export function startCli(db: string, args: string[]): CliRun {
  const child = spawn(process.execPath, ["--import", "tsx", "cli/main.ts", "--db", db, ...args], {
    cwd: root,
    env: { ...process.env, QUARTERBEAT_DB: "" },
    stdio: ["ignore", "pipe", "pipe"],
  });
  let stdout = "";
  let stderr = "";
  child.stdout!.on("data", (d: Buffer) => (stdout += d.toString()));
  child.stderr!.on("data", (d: Buffer) => (stderr += d.toString()));
  const done = new Promise<{ code: number | null; signal: NodeJS.Signals | null; stdout: string; stderr: string }>((resolve) =>
    child.on("exit", (code, signal) => resolve({ code, signal, stdout, stderr })),
  );
  return { child, done };
}

export async function runCli(db: string, args: string[]) {
  return startCli(db, args).done;
}

export { writeLockHeld } from "../../server/db/writeLock";

export const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

/** Waits until `check` is true, polling; false if `give up` comes first. */
export async function waitFor(check: () => boolean, timeoutMs: number, everyMs = 20): Promise<boolean> {
  const until = Date.now() + timeoutMs;
  while (Date.now() < until) {
    if (check()) return true;
    await sleep(everyMs);
  }
  return false;
}

export function countRows(file: string, sql: string, ...params: unknown[]): number {
  const db = new Database(file, { readonly: true });
  try {
    return db
      .prepare(sql)
      .pluck()
      .get(...params) as number;
  } finally {
    db.close();
  }
}

/** Row count of every table but those in `skip`, by name. */
export function tableCounts(file: string, skip: string[]): Record<string, number> {
  const conn = new Database(file, { readonly: true });
  try {
    const names = conn.prepare("SELECT name FROM sqlite_master WHERE type = 'table' ORDER BY name").pluck().all() as string[];
    return Object.fromEntries(names.filter((n) => !skip.includes(n)).map((n) => [n, conn.prepare(`SELECT count(*) FROM "${n}"`).pluck().get() as number]));
  } finally {
    conn.close();
  }
}

/** SQLite's integrity check of the file: "ok" or the first problem. */
export function integrity(file: string): string {
  const conn = new Database(file, { readonly: true });
  try {
    return conn.prepare("PRAGMA integrity_check").pluck().get() as string;
  } finally {
    conn.close();
  }
}
