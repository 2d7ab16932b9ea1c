// Migration 0009 keeps deliveries per user: the signals alert_log held as mailed to every coordinator and
// quality lead become deliveries to each of them, so upgrading mails no one a signal they already had.
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import Database from "better-sqlite3";
import { drizzle } from "drizzle-orm/better-sqlite3";
import { migrate } from "drizzle-orm/better-sqlite3/migrator";
import { describe, expect, it } from "vitest";
import { projectRoot } from "../../../server/projectRoot";
import { tempDbFile } from "../../helpers/testApp";

/** The project's migrations up to and including `lastTag`, in a folder of their own. */
function migrationsUpTo(lastTag: string): string {
  const source = path.join(projectRoot, "drizzle");
  const folder = fs.mkdtempSync(path.join(os.tmpdir(), "qb-migrations-"));
  fs.cpSync(source, folder, { recursive: true });
  const journalFile = path.join(folder, "meta/_journal.json");
  const journal = JSON.parse(fs.readFileSync(journalFile, "utf8")) as { entries: { tag: string }[] };
  const last = journal.entries.findIndex((entry) => entry.tag === lastTag);
  expect(last).toBeGreaterThan(0);
  fs.writeFileSync(journalFile, JSON.stringify({ ...journal, entries: journal.entries.slice(0, last + 1) }));
  return folder;
}

describe("migration 0009: alert choice and deliveries", () => {
  it("turns each logged signal into a delivery to every active coordinator and quality lead, and drops the log", () => {
    const sqlite = new Database(tempDbFile());
    sqlite.pragma("foreign_keys = ON");
    const db = drizzle(sqlite);
    migrate(db, { migrationsFolder: migrationsUpTo("0008_import_uploads_and_jobs") });
    const user = sqlite.prepare("INSERT INTO users (email, display_name, password_hash, role, active) VALUES (?, ?, 'x', ?, ?)");
    user.run("coord@test.example", "Coord", "coordinator", 1);
    user.run("quality@test.example", "Quality", "quality_lead", 1);
    user.run("gone@test.example", "Gone", "quality_lead", 0);
    user.run("funder@test.example", "Funder", "funder", 1);
    sqlite.prepare("INSERT INTO alert_log (key, sent_at) VALUES (?, ?)").run("service:MK-1:service_by_days:never", "2026-05-01T08:00:00.000Z");
    sqlite.prepare("INSERT INTO alert_log (key, sent_at) VALUES (?, ?)").run("funnel:2026-Q1:A1:below", "2026-04-01T08:00:00.000Z");

    migrate(db, { migrationsFolder: path.join(projectRoot, "drizzle") });
    const rows = sqlite
      .prepare(
        "SELECT users.email AS email, key, kind, sent_at AS sentAt FROM alert_deliveries JOIN users ON users.id = alert_deliveries.user_id ORDER BY email, key",
      )
      .all();
    expect(rows).toEqual([
      { email: "coord@test.example", key: "funnel:2026-Q1:A1:below", kind: "funnel", sentAt: "2026-04-01T08:00:00.000Z" },
      { email: "coord@test.example", key: "service:MK-1:service_by_days:never", kind: "service", sentAt: "2026-05-01T08:00:00.000Z" },
      { email: "quality@test.example", key: "funnel:2026-Q1:A1:below", kind: "funnel", sentAt: "2026-04-01T08:00:00.000Z" },
      { email: "quality@test.example", key: "service:MK-1:service_by_days:never", kind: "service", sentAt: "2026-05-01T08:00:00.000Z" },
    ]);
    expect(sqlite.prepare("SELECT count(*) FROM sqlite_master WHERE name = 'alert_log'").pluck().get()).toBe(0);
    expect(sqlite.prepare("SELECT alert_kinds FROM users").pluck().all()).toEqual([null, null, null, null]);
    sqlite.close();
  });
});
