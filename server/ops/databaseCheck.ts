// Checks that a file is a sound Quarterbeat database before anyone relies on it: SQLite's integrity check,
// drizzle's migrations table, the tables every Quarterbeat database has, and a schema no newer than this
// program. Used on backups before a restore and on the restored copy after it.
import fs from "node:fs";
import Database from "better-sqlite3";
import { AppError } from "../errors";
import { MIGRATIONS_TABLE, migrationLevel, shippedMigrations, type MigrationLevel } from "./migrations";

/** Tables present since the first migration; a file without them is some other application's database. */
const CORE_TABLES = ["settings", "sites", "instructors", "users", "classes", "attempts", "import_batches"];

export interface DatabaseCheck {
  migration: MigrationLevel;
  /** Row count of every table, by name. */
  tables: Record<string, number>;
}

const refused = (message: string, hint: string) => new AppError("backup_refused", 422, message, undefined, hint);

/**
 * Reads a copy that nothing else has open. A copy of a WAL database is itself in WAL mode, and reading it
 * creates -wal and -shm files beside it; those this read created are removed again (they hold nothing).
 */
export async function readCopy<T>(file: string, read: (conn: Database.Database) => T | Promise<T>): Promise<T> {
  if (!fs.existsSync(file)) throw refused(`There is no file ${file}.`, "Give the path of a file written by `quarterbeat backup`.");
  if (!fs.statSync(file).isFile()) throw refused(`${file} is not a file.`, "Give the path of a file written by `quarterbeat backup`.");
  const created = ["-wal", "-shm"].map((suffix) => file + suffix).filter((sidecar) => !fs.existsSync(sidecar));
  const conn = new Database(file, { readonly: true, fileMustExist: true });
  try {
    return await read(conn);
  } finally {
    conn.close();
    for (const sidecar of created) fs.rmSync(sidecar, { force: true });
  }
}

export function tableNames(conn: Database.Database): string[] {
  return conn.prepare("SELECT name FROM sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite_%' ORDER BY name").pluck().all() as string[];
}

export function tableCounts(conn: Database.Database): Record<string, number> {
  return Object.fromEntries(tableNames(conn).map((name) => [name, conn.prepare(`SELECT count(*) FROM "${name}"`).pluck().get() as number]));
}

function integrityProblems(conn: Database.Database, file: string): string[] {
  try {
    const lines = conn.prepare("PRAGMA integrity_check(20)").pluck().all() as string[];
    return lines.length === 1 && lines[0] === "ok" ? [] : lines;
  } catch (err) {
    const code = (err as { code?: string }).code;
    if (code === "SQLITE_NOTADB") throw refused(`${file} is not an SQLite database.`, "Give the path of a file written by `quarterbeat backup`.");
    if (code === "SQLITE_CORRUPT") return [(err as Error).message];
    throw err;
  }
}

/** Throws an AppError naming the file and what is wrong with it; otherwise returns its level and row counts. */
export function checkQuarterbeatDatabase(file: string): Promise<DatabaseCheck> {
  return readCopy(file, (conn) => {
    const problems = integrityProblems(conn, file);
    if (problems.length > 0) {
      throw refused(`${file} failed SQLite's integrity check: ${problems.slice(0, 3).join("; ")}`, "The copy is damaged; use an older backup.");
    }
    const names = new Set(tableNames(conn));
    if (!names.has(MIGRATIONS_TABLE)) {
      throw refused(
        `${file} is an SQLite database but not a Quarterbeat one: it has no ${MIGRATIONS_TABLE} table.`,
        "Give the path of a file written by `quarterbeat backup`.",
      );
    }
    const missing = CORE_TABLES.filter((name) => !names.has(name));
    if (missing.length > 0) {
      throw refused(
        `${file} is not a Quarterbeat database: it lacks the table(s) ${missing.join(", ")}.`,
        "Give the path of a file written by `quarterbeat backup`.",
      );
    }
    const migration = migrationLevel(conn);
    if (migration.applied === null) throw refused(`${file} has no applied migrations.`, "Give the path of a file written by `quarterbeat backup`.");
    const known = new Set(shippedMigrations().map((entry) => entry.tag));
    if (!known.has(migration.applied)) {
      throw refused(
        `${file} was written by a newer Quarterbeat (migration ${migration.applied} is unknown to this version).`,
        "Restore it with the Quarterbeat version that made it, or upgrade this one first.",
      );
    }
    return { migration, tables: tableCounts(conn) };
  });
}
