// The policy settings routes and rescoring: versions, validation with field paths, and a rescore that moves
// changed results to the score history in one go.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { attemptDetailAnswerSchema, overviewAnswerSchema } from "../../shared/schemas/insight";
import { policySettingsAnswerSchema, policyVersionsAnswerSchema, rescoreAnswerSchema } from "../../shared/schemas/policySettings";
import { DEFAULT_POLICY, GUIDELINE_SOURCES, type NetworkPolicy } from "../../shared/scoring/policy";
import { startInsightApp, type InsightTestContext } from "../fixtures/insight/setup";

let t: InsightTestContext;
beforeAll(async () => {
  t = await startInsightApp();
});
afterAll(() => t.db.$client.close());

function leafPaths(value: unknown, prefix = ""): string[] {
  if (typeof value !== "object" || value === null) return [prefix];
  return Object.entries(value).flatMap(([key, child]) => leafPaths(child, prefix ? `${prefix}.${key}` : key));
}

describe("GET /api/settings/policy", () => {
  it("gives the policy in force, the defaults and where each default comes from", async () => {
    const body = policySettingsAnswerSchema.parse((await t.quality.get("/api/settings/policy").expect(200)).body);
    expect(body.current.version).toBe(1);
    expect(body.defaults).toEqual(DEFAULT_POLICY);
    expect(body.safetyNote).toMatch(/not a medical device/);
    // every default has a stated source, and every source named is one of the cited guidelines
    const covered = (path: string) => body.fieldSources.some((f) => new RegExp(`^${f.path.replace(/\./g, "\\.").replace("*", "[a-z]+")}$`).test(path));
    expect(leafPaths(DEFAULT_POLICY).filter((path) => !covered(path))).toEqual([]);
    const known = new Set(GUIDELINE_SOURCES.map((s) => s.id));
    expect(body.fieldSources.flatMap((f) => f.sources).filter((id) => !known.has(id))).toEqual([]);
    expect(body.fieldSources.find((f) => f.path === "passRule.minDepthOkPct")!.kind).toBe("project_default");
  });

  it("is not for instructors or funders", async () => {
    await t.instructor.get("/api/settings/policy").expect(403);
    await t.funder.get("/api/settings/policy/versions").expect(403);
  });
});

describe("PUT /api/settings/policy", () => {
  it("refuses an invalid policy with the path of each field", async () => {
    const policy = structuredClone(DEFAULT_POLICY) as NetworkPolicy;
    policy.passRule.minDepthOkPct = 120;
    policy.bands.adult.depthMinMm = 65; // above the maximum of 60
    const res = await t.coordinator.put("/api/settings/policy", { policy, note: "broken" }).expect(422);
    const paths = res.body.error.details.map((d: { path: string }) => d.path);
    expect(paths).toContain("policy.passRule.minDepthOkPct");
    expect(paths).toContain("policy.bands.adult.depthMaxMm");
    const res2 = await t.coordinator.put("/api/settings/policy", { note: "no policy" }).expect(422);
    expect(res2.body.error.details[0].path).toBe("policy");
  });

  it("is for the coordinator only", async () => {
    await t.quality.put("/api/settings/policy", { policy: DEFAULT_POLICY, note: "" }).expect(403);
  });

  it("saves a new version and lists it", async () => {
    const policy = structuredClone(DEFAULT_POLICY) as NetworkPolicy;
    policy.passRule.minDepthOkPct = 50;
    const saved = await t.coordinator.put("/api/settings/policy", { policy, note: "Depth pass mark 50 %" }).expect(200);
    expect(saved.body).toMatchObject({ version: 2, note: "Depth pass mark 50 %" });
    const { versions } = policyVersionsAnswerSchema.parse((await t.quality.get("/api/settings/policy/versions").expect(200)).body);
    expect(versions.map((v) => v.version)).toEqual([2, 1]);
    expect(versions[0].policy.passRule.minDepthOkPct).toBe(50);
  });
});

describe("POST /api/settings/rescore", () => {
  it("rescores from a quarter on, keeping the replaced results in the score history", async () => {
    const before = overviewAnswerSchema.parse((await t.coordinator.get("/api/insight/overview").expect(200)).body);
    expect(before.passRate).toMatchObject({ successes: 28, n: 44 });

    const result = rescoreAnswerSchema.parse((await t.coordinator.post("/api/settings/rescore", { fromQuarter: "2026-Q2" }).expect(200)).body);
    // with the depth pass mark at 50 %, C1's two "shallow" attempts (depth on target 54 % and 60 %, nothing
    // else wrong) now pass; the other shallow attempts of 2026-Q2 have at most 30 % and still fail
    expect(result).toEqual({ version: 2, examined: 44, changed: 2 });

    const detail = attemptDetailAnswerSchema.parse((await t.coordinator.get("/api/attempts/C1-2605-003").expect(200)).body);
    expect(detail.attempt).toMatchObject({ passed: true, errors: [], policyVersion: 2, score: 78 });
    expect(detail.scoreHistory).toEqual([{ policyVersion: 1, score: 78, passed: false, errors: ["too_shallow"], replacedAt: expect.any(String) }]);
    // an unchanged attempt moves to the new version without a history row
    const unchanged = attemptDetailAnswerSchema.parse((await t.coordinator.get("/api/attempts/A1-2604-002").expect(200)).body);
    expect(unchanged.attempt.policyVersion).toBe(2);
    expect(unchanged.scoreHistory).toEqual([]);

    // the statistics follow at once
    const after = overviewAnswerSchema.parse((await t.coordinator.get("/api/insight/overview").expect(200)).body);
    expect(after.passRate).toMatchObject({ successes: 30, n: 44 });
  });

  it("rescores the rest, then has nothing left to do", async () => {
    // 263 + 20 + 29 earlier attempts; their shallow attempts have 30 % depth on target and still fail
    expect((await t.coordinator.post("/api/settings/rescore", {}).expect(200)).body).toEqual({ version: 2, examined: 312, changed: 0 });
    expect((await t.coordinator.post("/api/settings/rescore").expect(200)).body).toEqual({ version: 2, examined: 0, changed: 0 });
  });

  it("refuses a malformed quarter and other roles", async () => {
    const res = await t.coordinator.post("/api/settings/rescore", { fromQuarter: "2026-Q9" }).expect(422);
    expect(res.body.error.details[0].path).toBe("fromQuarter");
    await t.quality.post("/api/settings/rescore", {}).expect(403);
    await t.instructor.post("/api/settings/rescore", {}).expect(403);
  });
});
