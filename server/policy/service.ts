// The network's scoring policy: every saved change is a new version; scores record the version used.
import { desc, eq } from "drizzle-orm";
import { DEFAULT_POLICY, networkPolicySchema, type NetworkPolicy } from "../../shared/scoring/policy";
import type { Db } from "../db/client";
import { policyVersions } from "../db/schema";
import { validationError } from "../errors";

export interface PolicyVersion {
  version: number;
  policy: NetworkPolicy;
  note: string;
  createdAt: string;
}

function toVersion(row: typeof policyVersions.$inferSelect): PolicyVersion {
  return { version: row.version, policy: networkPolicySchema.parse(row.policy), note: row.note, createdAt: row.createdAt };
}

/** The policy in force; the project defaults become version 1 on first use. */
export function currentPolicy(db: Db): PolicyVersion {
  const row = db.select().from(policyVersions).orderBy(desc(policyVersions.version)).limit(1).get();
  if (row) return toVersion(row);
  db.insert(policyVersions).values({ version: 1, policy: DEFAULT_POLICY, note: "Project defaults" }).onConflictDoNothing().run();
  return currentPolicy(db);
}

export function policyVersion(db: Db, version: number): PolicyVersion | undefined {
  const row = db.select().from(policyVersions).where(eq(policyVersions.version, version)).get();
  return row ? toVersion(row) : undefined;
}

export function listPolicyVersions(db: Db): PolicyVersion[] {
  currentPolicy(db);
  return db.select().from(policyVersions).orderBy(desc(policyVersions.version)).all().map(toVersion);
}

export function savePolicy(db: Db, input: unknown, note: string, userId: number | null): PolicyVersion {
  const parsed = networkPolicySchema.safeParse(input);
  if (!parsed.success) throw validationError(parsed.error, "The policy");
  const next = currentPolicy(db).version + 1;
  db.insert(policyVersions).values({ version: next, policy: parsed.data, note, createdBy: userId }).run();
  return currentPolicy(db);
}
