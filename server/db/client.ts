// Opens the SQLite file, sets the pragmas every connection needs and applies pending migrations.
import fs from "node:fs";
import path from "node:path";
import Database from "better-sqlite3";
import { drizzle, type BetterSQLite3Database } from "drizzle-orm/better-sqlite3";
import { migrate } from "drizzle-orm/better-sqlite3/migrator";
import { refreshInstructorValues } from "../metrics/instructorValues";
import { ensureRunningValues } from "../metrics/runningValues";
import { projectRoot } from "../projectRoot";
import * as schema from "./schema";

export type Db = BetterSQLite3Database<typeof schema> & { $client: Database.Database };

const migrationsFolder = path.join(projectRoot, "drizzle");

export function openDatabase(file: string, options: { migrate?: boolean } = {}): Db {
  if (file !== ":memory:") fs.mkdirSync(path.dirname(path.resolve(file)), { recursive: true });
  const sqlite = new Database(file);
  sqlite.pragma("journal_mode = WAL");
  sqlite.pragma("foreign_keys = ON");
  // One writer at a time: a second writer (CLI import beside the server) waits instead of failing.
  sqlite.pragma("busy_timeout = 15000");
  sqlite.pragma("synchronous = NORMAL");
  const db = drizzle({ client: sqlite, schema, casing: "snake_case" }) as Db;
  if (options.migrate !== false) {
    migrate(db, { migrationsFolder });
    // instructor-quarters a migration or an outside write left noted are built once here, not on every read
    refreshInstructorValues(sqlite);
    ensureRunningValues(sqlite);
  }
  return db;
}
