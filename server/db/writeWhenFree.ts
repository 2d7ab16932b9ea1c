// Writes from the server's request thread must never wait for the write lock: with the connection's busy
// timeout a write during a CLI or worker import would stall every request for up to 15 s. These helpers try
// at once and, when the lock is taken, try again later on a timer.
import type Database from "better-sqlite3";

export function isBusy(err: unknown): boolean {
  return (err as { code?: string } | null)?.code === "SQLITE_BUSY";
}

/** Runs `run` at once, without the connection's busy wait: SQLITE_BUSY instead of a stalled server. */
export function withoutWaiting<T>(sqlite: Database.Database, run: () => T): T {
  const busyTimeout = sqlite.pragma("busy_timeout", { simple: true }) as number;
  sqlite.pragma("busy_timeout = 0");
  try {
    return run();
  } finally {
    sqlite.pragma(`busy_timeout = ${busyTimeout}`);
  }
}

/** Runs `run` as soon as the write lock is free, trying every 50 ms until `giveUpAt`; then calls back. */
export function writeWhenFree(sqlite: Database.Database, run: () => void, callback: ((err?: unknown) => void) | undefined, giveUpAt: number): void {
  try {
    withoutWaiting(sqlite, run);
  } catch (err) {
    if (isBusy(err) && Date.now() < giveUpAt) {
      setTimeout(() => writeWhenFree(sqlite, run, callback, giveUpAt), 50);
      return;
    }
    callback?.(err);
    return;
  }
  callback?.();
}
