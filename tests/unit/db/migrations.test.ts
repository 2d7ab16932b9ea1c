import { describe, expect, it } from "vitest";
import { openDatabase } from "../../../server/db/client";
import { tempDbFile } from "../../helpers/testApp";

describe("database set-up", () => {
  it("applies every migration to an empty file, with WAL and foreign keys on", () => {
    const db = openDatabase(tempDbFile());
    const sqlite = db.$client;
    const tables = sqlite
      .prepare("SELECT name FROM sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite_%' AND name NOT LIKE '__drizzle%'")
      .pluck()
      .all() as string[];
    for (const table of [
      "users",
      "sessions",
      "sites",
      "instructors",
      "classes",
      "attempts",
      "compression_streams",
      "manikins",
      "equipment_events",
      "import_batches",
      "rejected_rows",
      "policy_versions",
    ]) {
      expect(tables).toContain(table);
    }
    expect(sqlite.pragma("journal_mode", { simple: true })).toBe("wal");
    expect(sqlite.pragma("foreign_keys", { simple: true })).toBe(1);
    db.$client.close();
  });

  it("is idempotent: opening the same file again applies nothing twice", () => {
    const file = tempDbFile();
    openDatabase(file).$client.close();
    const again = openDatabase(file);
    const applied = again.$client.prepare("SELECT count(*) FROM __drizzle_migrations").pluck().get() as number;
    const reopened = openDatabase(file);
    expect(reopened.$client.prepare("SELECT count(*) FROM __drizzle_migrations").pluck().get()).toBe(applied);
    again.$client.close();
    reopened.$client.close();
  });

  it("refuses a row that breaks a foreign key", () => {
    const db = openDatabase(tempDbFile());
    expect(() => db.$client.prepare("INSERT INTO instructors (code, name, site_id) VALUES ('X', 'X', 999)").run()).toThrow(/FOREIGN KEY/);
    db.$client.close();
  });
});
