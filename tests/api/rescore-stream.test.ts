// Rescoring under a policy with other bands measures stream attempts again from their stored compressions.
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { DEFAULT_POLICY } from "../../shared/scoring/policy";
import type { Db } from "../../server/db/client";
import { importFile } from "../../server/imports/service";
import { savePolicy } from "../../server/policy/service";
import { rescoreAttempts } from "../../server/scoring/rescore";
import { makeTestDb, seedPeople } from "../helpers/testApp";

const fixtures = path.resolve(__dirname, "../fixtures/import");
let db: Db;

beforeAll(async () => {
  db = makeTestDb();
  await seedPeople(db);
  const now = new Date("2026-11-30T12:00:00Z");
  for (const [kind, file] of [
    ["classes", "classes-valid.csv"],
    ["compressions", "compressions-valid.csv"],
  ] as const) {
    const summary = await importFile(db, { kind, input: { path: path.join(fixtures, file) }, source: "cli", now });
    expect(summary.status).toBe("imported");
  }
});
afterAll(() => db.$client.close());

const depthOk = () =>
  db.$client.prepare("SELECT depth_ok_pct, policy_version FROM attempts WHERE id = 'S-001'").get() as { depth_ok_pct: number; policy_version: number };

describe("rescore of stream attempts", () => {
  it("re-measures depth against the new band and records the new version", () => {
    const before = depthOk();
    // Every adult compression of S-001 is 50–60 mm deep; a band of 70–80 mm puts none of them on target.
    const stricter = { ...DEFAULT_POLICY, bands: { ...DEFAULT_POLICY.bands, adult: { ...DEFAULT_POLICY.bands.adult, depthMinMm: 70, depthMaxMm: 80 } } };
    const saved = savePolicy(db, stricter, "test: deeper adult band", null);
    const result = rescoreAttempts(db);
    expect(result.version).toBe(saved.version);
    const after = depthOk();
    expect(before.depth_ok_pct).toBeGreaterThan(0);
    expect(after.depth_ok_pct).toBe(0);
    expect(after.policy_version).toBe(saved.version);
    const history = db.$client.prepare("SELECT count(*) FROM score_history WHERE attempt_id = 'S-001'").pluck().get();
    expect(history).toBe(1);
  });
});
