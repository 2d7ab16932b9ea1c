// What a refused request must leave as it was: the list of tables and the rows in each.
import type { Db } from "../../server/db/client";

/** Tables that change on any visit (sign-in sessions) are left out. */
const VOLATILE = new Set(["sessions"]);

export function tableNames(db: Db): string[] {
  return db.$client.prepare("SELECT name FROM sqlite_master WHERE type = 'table' ORDER BY name").pluck().all() as string[];
}

export function rowCounts(db: Db): Record<string, number> {
  const counts: Record<string, number> = {};
  for (const table of tableNames(db)) {
    if (VOLATILE.has(table)) continue;
    counts[table] = db.$client.prepare(`SELECT count(*) FROM "${table}"`).pluck().get() as number;
  }
  return counts;
}
