// Key/value network settings kept in the database.
import { randomBytes } from "node:crypto";
import { eq } from "drizzle-orm";
import type { Db } from "../db/client";
import { settings } from "../db/schema";

export function getSetting(db: Db, key: string): string | undefined {
  return db.select({ value: settings.value }).from(settings).where(eq(settings.key, key)).get()?.value;
}

export function setSetting(db: Db, key: string, value: string): void {
  db.insert(settings)
    .values({ key, value })
    .onConflictDoUpdate({ target: settings.key, set: { value, updatedAt: new Date().toISOString() } })
    .run();
}

/** The configured secret, or one generated on first start and kept in the database (never a constant in code). */
export function sessionSecret(db: Db, configured?: string): string {
  if (configured) return configured;
  const stored = getSetting(db, "session_secret");
  if (stored) return stored;
  const generated = randomBytes(32).toString("base64url");
  setSetting(db, "session_secret", generated);
  return generated;
}
