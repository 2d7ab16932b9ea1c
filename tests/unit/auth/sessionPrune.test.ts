// Expired sessions are deleted on a schedule, so the sessions table does not grow with every sign-in ever made.
import type session from "express-session";
import { afterEach, describe, expect, it, vi } from "vitest";
import { PRUNE_EVERY_MS, SqliteSessionStore } from "../../../server/auth/sessionStore";
import { makeTestDb } from "../../helpers/testApp";

afterEach(() => {
  vi.useRealTimers();
});

function sessionExpiringAt(expires: Date): session.SessionData {
  return { cookie: { originalMaxAge: null, expires } } as unknown as session.SessionData;
}

describe("session pruning", () => {
  it("deletes expired sessions on its schedule and keeps the live ones", () => {
    const db = makeTestDb();
    try {
      vi.useFakeTimers({ toFake: ["setInterval", "clearInterval", "Date"], now: new Date("2026-10-02T09:00:00Z") });
      const store = new SqliteSessionStore(db);
      store.set("live", sessionExpiringAt(new Date("2026-10-02T21:00:00Z")));
      store.set("expiring", sessionExpiringAt(new Date("2026-10-02T09:10:00Z")));
      const sids = () => db.$client.prepare("SELECT sid FROM sessions ORDER BY sid").pluck().all();
      expect(sids()).toEqual(["expiring", "live"]);

      vi.advanceTimersByTime(PRUNE_EVERY_MS - 1);
      expect(sids()).toEqual(["expiring", "live"]);
      vi.advanceTimersByTime(1);
      expect(sids()).toEqual(["live"]);
    } finally {
      db.$client.close();
    }
  });

  it("stops by itself once the connection is closed", () => {
    const db = makeTestDb();
    vi.useFakeTimers({ toFake: ["setInterval", "clearInterval", "Date"] });
    new SqliteSessionStore(db);
    db.$client.close();
    expect(vi.getTimerCount()).toBe(1);
    vi.advanceTimersByTime(PRUNE_EVERY_MS);
    expect(vi.getTimerCount()).toBe(0);
  });
});
