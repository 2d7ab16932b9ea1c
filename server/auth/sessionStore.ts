// express-session store on Quarterbeat's own SQLite connection: sessions survive a restart, the table lives
// in the Drizzle migrations, and there is one writer connection for the whole process.
import session from "express-session";
import type { Db } from "../db/client";

const DAY_MS = 24 * 60 * 60 * 1000;
const TOUCH_EVERY_MS = 5 * 60 * 1000;

export class SqliteSessionStore extends session.Store {
  private readonly statements;
  private readonly lastTouched = new Map<string, number>();

  private readonly sqlite;

  constructor(db: Db) {
    super();
    const sqlite = db.$client;
    this.sqlite = sqlite;
    this.statements = {
      get: sqlite.prepare<[string, number], { sess: string }>("SELECT sess FROM sessions WHERE sid = ? AND expires_at > ?"),
      set: sqlite.prepare(
        "INSERT INTO sessions (sid, sess, expires_at) VALUES (?, ?, ?) ON CONFLICT(sid) DO UPDATE SET sess = excluded.sess, expires_at = excluded.expires_at",
      ),
      touch: sqlite.prepare("UPDATE sessions SET expires_at = ? WHERE sid = ?"),
      destroy: sqlite.prepare("DELETE FROM sessions WHERE sid = ?"),
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
    try {
      this.statements.set.run(sid, JSON.stringify(sess), SqliteSessionStore.expiry(sess));
      callback?.();
    } catch (err) {
      callback?.(err);
    }
  }

  override touch(sid: string, sess: session.SessionData, callback?: () => void): void {
    // Reads should not write: extend a session's expiry at most every few minutes, so dashboards keep
    // working without waiting for the write lock while an import holds it.
    // A touch never waits for the lock either: it would stall every request for the busy timeout and then
    // throw inside the response's end, leaving the request unanswered. A skipped touch is tried again later.
    const now = Date.now();
    if (now - (this.lastTouched.get(sid) ?? 0) > TOUCH_EVERY_MS) {
      const sqlite = this.sqlite;
      const busyTimeout = sqlite.pragma("busy_timeout", { simple: true }) as number;
      sqlite.pragma("busy_timeout = 0");
      try {
        this.statements.touch.run(SqliteSessionStore.expiry(sess), sid);
        this.lastTouched.set(sid, now);
      } catch (err) {
        if ((err as { code?: string }).code !== "SQLITE_BUSY") throw err;
      } finally {
        sqlite.pragma(`busy_timeout = ${busyTimeout}`);
      }
    }
    callback?.();
  }

  override destroy(sid: string, callback?: (err?: unknown) => void): void {
    try {
      this.statements.destroy.run(sid);
      this.lastTouched.delete(sid);
      callback?.();
    } catch (err) {
      callback?.(err);
    }
  }

  prune(): void {
    this.statements.prune.run(Date.now());
  }
}
