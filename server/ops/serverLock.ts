// Marks a database file as served by a running Quarterbeat server, so that `quarterbeat restore` never
// replaces a file under a live server (which keeps writing to the old, unlinked file and loses every write).
//
// Why a lock file and not an SQLite lock: an idle server holds no SQLite lock at all between requests (WAL mode
// readers and writers lock only while a statement runs), so no probe of the database can tell "a server has
// it open" from "nobody has it open". The file `<db>.server-lock` is created exclusively at start-up and holds
// the server's process id and host name; it is removed when the server stops. A server that was killed leaves
// it behind, so a lock whose process no longer exists on this host counts as stale and is taken over. A lock
// written on another host cannot be checked from here and counts as held.
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { AppError } from "../errors";
import { processIsAlive } from "./processAlive";

export interface LockHolder {
  pid: number;
  host: string;
  startedAt: string;
}

export const lockFileOf = (dbFile: string) => `${path.resolve(dbFile)}.server-lock`;

function readHolder(lockFile: string): LockHolder | null {
  try {
    return JSON.parse(fs.readFileSync(lockFile, "utf8")) as LockHolder;
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code === "ENOENT") return null;
    // unreadable or half-written: treat as held by an unknown server rather than guess it away
    return { pid: -1, host: "unknown", startedAt: "unknown" };
  }
}

/** The live server holding the database, or null when none does (no lock file, or a stale one). */
export function serverHolding(dbFile: string): LockHolder | null {
  const holder = readHolder(lockFileOf(dbFile));
  if (!holder) return null;
  if (holder.host === os.hostname() && holder.pid > 0 && !processIsAlive(holder.pid)) return null;
  return holder;
}

export function inUseError(dbFile: string, holder: LockHolder): AppError {
  return new AppError(
    "database_in_use",
    409,
    `${dbFile} is in use by a running Quarterbeat server (process ${holder.pid} on ${holder.host}, started ${holder.startedAt}).`,
    undefined,
    `Stop that server first. If no server is running, delete ${lockFileOf(dbFile)} and try again.`,
  );
}

/** Takes the lock for this process; refuses when another live server holds it. Returns the release function. */
export function holdServerLock(dbFile: string): () => void {
  const lockFile = lockFileOf(dbFile);
  const mine: LockHolder = { pid: process.pid, host: os.hostname(), startedAt: new Date().toISOString() };
  fs.mkdirSync(path.dirname(lockFile), { recursive: true });
  // "wx" creates the file only if it is absent, so of two servers starting together exactly one gets it
  for (let attempt = 0; ; attempt++) {
    try {
      fs.writeFileSync(lockFile, JSON.stringify(mine), { flag: "wx" });
      break;
    } catch (err) {
      if ((err as NodeJS.ErrnoException).code !== "EEXIST") throw err;
      const holder = serverHolding(dbFile);
      if (holder) throw inUseError(dbFile, holder);
      if (attempt > 0) throw err;
      fs.rmSync(lockFile, { force: true }); // stale: its server is gone
    }
  }
  let released = false;
  const release = () => {
    if (released) return;
    released = true;
    if (readHolder(lockFile)?.pid === process.pid) fs.rmSync(lockFile, { force: true });
  };
  process.once("exit", release);
  return release;
}
