// express-session store on Quarterbeat's own SQLite connection: sessions survive a restart, the table lives
// in the Drizzle migrations, and there is one writer connection for the whole process.
import session from "express-session";
import type { Db } from "../db/client";
import { noteHousekeepingWrite } from "../db/dataState";
import { isBusy, withoutWaiting, writeWhenFree } from "../db/writeWhenFree";

const DAY_MS = 24 * 60 * 60 * 1000;
const TOUCH_EVERY_MS = 5 * 60 * 1000;
/** How long a sign-in or sign-out waits for an import's write lock before it fails. */
const WRITE_WAIT_MS = 5 * 60 * 1000;
/** How long an ended session id is remembered, so a request still in flight cannot write it back. */
const ENDED_MEMORY_MS = 10 * 60 * 1000;
/** How often expired sessions are deleted; a read never returns one, so this only keeps the table small. */
export const PRUNE_EVERY_MS = 15 * 60 * 1000;

export class SqliteSessionStore extends session.Store {
  private readonly statements;
  private readonly lastTouched = new Map<string, number>();
  /** Ended session id → when it ended. */
  private readonly ended = new Map<string, number>();

  private readonly sqlite;
  private readonly pruneTimer: NodeJS.Timeout;

  constructor(db: Db) {
    super();
    const sqlite = db.$client;
    this.sqlite = sqlite;
    // unref: the timer never keeps a process alive; it ends by itself once the connection is closed
    this.pruneTimer = setInterval(() => this.pruneOnSchedule(), PRUNE_EVERY_MS).unref();
    this.statements = {
      get: sqlite.prepare<[string, number], { sess: string }>("SELECT sess FROM sessions WHERE sid = ? AND expires_at > ?"),
      set: sqlite.prepare(
        "INSERT INTO sessions (sid, sess, expires_at) VALUES (?, ?, ?) ON CONFLICT(sid) DO UPDATE SET sess = excluded.sess, expires_at = excluded.expires_at",
      ),
      touch: sqlite.prepare("UPDATE sessions SET expires_at = ? WHERE sid = ?"),
      destroy: sqlite.prepare("DELETE FROM sessions WHERE sid = ?"),
      // passport keeps the signed-in user's id in the session JSON; a user has a handful of sessions at most,
      // so a scan of the table is cheaper to keep than a second copy of the id in its own column
      ofUser: sqlite.prepare<[number], string>("SELECT sid FROM sessions WHERE json_extract(sess, '$.passport.user') = ?").pluck(),
      prune: sqlite.prepare("DELETE FROM sessions WHERE expires_at <= ?"),
    };
  }

  private static expiry(sess: session.SessionData): number {
    const expires = sess.cookie?.expires;
    return expires ? new Date(expires).getTime() : Date.now() + DAY_MS;
  }

  override get(sid: string, callback: (err: unknown, session?: session.SessionData | null) => void): void {
    try {
      const row = this.statements.get.get(sid, Date.now());
      callback(null, row ? (JSON.parse(row.sess) as session.SessionData) : null);
    } catch (err) {
      callback(err);
    }
  }

  override set(sid: string, sess: session.SessionData, callback?: (err?: unknown) => void): void {
    // a request that loaded the session before it ended would otherwise save it again when it finishes
    if (this.ended.has(sid)) return callback?.();
    this.writeWhenFree(() => this.housekeeping(this.statements.set.run(sid, JSON.stringify(sess), SqliteSessionStore.expiry(sess))), callback);
  }

  /** Session rows are no figure's input: their writes are kept out of the data state (see db/dataState). */
  private housekeeping(info: { changes: number; lastInsertRowid: number | bigint }): void {
    noteHousekeepingWrite(this.sqlite, info);
  }

  /**
   * A session write (sign-in, sign-out) while an import holds the write lock waits for it without blocking
   * the server: the connection's busy timeout would stall every request and then fail the sign-in with a 500.
   */
  private writeWhenFree(run: () => void, callback?: (err?: unknown) => void): void {
    writeWhenFree(this.sqlite, run, callback, Date.now() + WRITE_WAIT_MS);
  }

  override touch(sid: string, sess: session.SessionData, callback?: () => void): void {
    // Reads should not write: extend a session's expiry at most every few minutes, so dashboards keep
    // working without waiting for the write lock while an import holds it.
    // A touch never waits for the lock either: it would stall every request for the busy timeout and then
    // throw inside the response's end, leaving the request unanswered. A skipped touch is tried again later.
    const now = Date.now();
    if (now - (this.lastTouched.get(sid) ?? 0) > TOUCH_EVERY_MS) {
      try {
        withoutWaiting(this.sqlite, () => this.housekeeping(this.statements.touch.run(SqliteSessionStore.expiry(sess), sid)));
        this.lastTouched.set(sid, now);
      } catch (err) {
        if (!isBusy(err)) throw err;
      }
    }
    callback?.();
  }

  override destroy(sid: string, callback?: (err?: unknown) => void): void {
    this.rememberEnded([sid]);
    this.writeWhenFree(() => this.housekeeping(this.statements.destroy.run(sid)), callback);
  }

  /** Ends every session of a user except `keepSid` (the one making the request, when it is theirs). */
  endSessionsOfUser(userId: number, keepSid?: string): Promise<void> {
    return new Promise((resolve, reject) => {
      this.writeWhenFree(
        () => {
          const sids = this.statements.ofUser.all(userId).filter((sid) => sid !== keepSid);
          this.rememberEnded(sids);
          for (const sid of sids) this.housekeeping(this.statements.destroy.run(sid));
        },
        (err) => (err ? reject(err) : resolve()),
      );
    });
  }

  private rememberEnded(sids: string[]): void {
    const now = Date.now();
    for (const [sid, endedAt] of this.ended) if (now - endedAt > ENDED_MEMORY_MS) this.ended.delete(sid);
    for (const sid of sids) {
      this.ended.set(sid, now);
      this.lastTouched.delete(sid);
    }
  }

  prune(): void {
    this.housekeeping(this.statements.prune.run(Date.now()));
  }

  private pruneOnSchedule(): void {
    if (!this.sqlite.open) return clearInterval(this.pruneTimer);
    try {
      withoutWaiting(this.sqlite, () => this.prune());
    } catch {
      // an import holding the write lock (or any other failure) only delays the pruning to the next round;
      // housekeeping must never bring the server down
    }
  }
}
