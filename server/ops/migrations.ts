// Which drizzle migration a database has reached, by tag, next to the latest one this program ships.
import fs from "node:fs";
import path from "node:path";
import type Database from "better-sqlite3";
import { projectRoot } from "../projectRoot";

export const MIGRATIONS_TABLE = "__drizzle_migrations";
const journalFile = path.join(projectRoot, "drizzle/meta/_journal.json");

interface JournalEntry {
  tag: string;
  when: number;
}

export interface MigrationLevel {
  /** Tag of the latest applied migration, e.g. "0006_backup_log"; null before the first. */
  applied: string | null;
  appliedCount: number;
  /** Tag of the latest migration this program knows. */
  latest: string;
  /** True when every migration this program ships has been applied. */
  current: boolean;
}

let journal: JournalEntry[] | undefined;

/** The shipped migrations in order; read once, the folder does not change while the program runs. */
export function shippedMigrations(): JournalEntry[] {
  journal ??= (JSON.parse(fs.readFileSync(journalFile, "utf8")) as { entries: JournalEntry[] }).entries;
  return journal;
}

/**
 * drizzle's migrator records each applied migration with the journal's `when` as `created_at` (not its tag),
 * so the level is found by matching the newest `created_at` against the journal. One indexed read.
 */
export function migrationLevel(sqlite: Database.Database): MigrationLevel {
  const row = sqlite.prepare(`SELECT max(created_at) AS newest, count(*) AS n FROM ${MIGRATIONS_TABLE}`).get() as { newest: number | null; n: number };
  const shipped = shippedMigrations();
  const latest = shipped[shipped.length - 1];
  const applied = row.newest === null ? null : (shipped.find((entry) => entry.when === Number(row.newest))?.tag ?? `unknown (${row.newest})`);
  return { applied, appliedCount: row.n, latest: latest.tag, current: row.newest !== null && Number(row.newest) >= latest.when };
}
