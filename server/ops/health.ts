// What /api/health and /api/health/ready report: one cheap read proves the database answers and tells the
// schema's migration level; version and uptime come from the process.
import type { Db } from "../db/client";
import { migrationLevel, type MigrationLevel } from "./migrations";
import { APP_VERSION } from "./version";

export interface Health {
  ok: boolean;
  version: string;
  uptimeSeconds: number;
  database: { ok: true; migration: MigrationLevel } | { ok: false };
}

export function readHealth(db: Db, startedAt: number, now = Date.now()): Health {
  const base = { version: APP_VERSION, uptimeSeconds: Math.round((now - startedAt) / 1000) };
  try {
    return { ok: true, ...base, database: { ok: true, migration: migrationLevel(db.$client) } };
  } catch {
    // a closed handle, a missing or locked file, a file that is not a database: all mean "not usable now";
    // the answer is public, so SQLite's own message (which may name files) stays out of it
    return { ok: false, ...base, database: { ok: false } };
  }
}

/** Ready for traffic: the database answers and carries every migration this program ships. */
export function readiness(health: Health): { ready: boolean; reason?: string } {
  if (!health.database.ok) return { ready: false, reason: "The database cannot be read." };
  if (!health.database.migration.current) return { ready: false, reason: "Database migrations have not all been applied." };
  return { ready: true };
}
