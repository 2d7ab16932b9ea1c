// An attempt's place among the network's attempts of its patient type and quarter, when that group holds only
// a few of other instructors' attempts: an instructor must not see it (a percentile among so few would reveal
// them), while the quality lead sees it in full.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { attemptDetailAnswerSchema } from "../../shared/schemas/insight";
import { startInsightApp, type InsightTestContext } from "../fixtures/insight/setup";

let t: InsightTestContext;
beforeAll(async () => {
  t = await startInsightApp();
  // 2025-Q3 holds A1's 29 adult attempts only; add one of B1's, so the group has a single attempt of someone else
  const columns = (t.db.$client.prepare("PRAGMA table_info(attempts)").all() as { name: string }[])
    .map((c) => c.name)
    .filter((name) => name !== "id" && name !== "quarter");
  t.db.$client
    .prepare(
      `INSERT INTO attempts (id, quarter, ${columns.join(", ")}) SELECT 'B1-2511-EXTRA', '2025-Q3', ${columns.join(", ")} FROM attempts WHERE id = 'B1-2511-001'`,
    )
    .run();
});
afterAll(() => t.db.$client.close());

describe("GET /api/attempts/:id placement with few attempts of others", () => {
  it("hides the placement from an instructor when the group holds fewer than five of others' attempts", async () => {
    const body = attemptDetailAnswerSchema.parse((await t.instructor.get("/api/attempts/A1-2507-001").expect(200)).body);
    expect(body.placement).toEqual({
      quarter: "2025-Q3",
      profile: "adult",
      attempts: null,
      hidden: true,
      percentiles: { score: null, depthOkPct: null, rateOkPct: null, recoilOkPct: null, handsOnPct: null },
    });
  });

  it("shows it to the quality lead, counting the added attempt", async () => {
    const body = attemptDetailAnswerSchema.parse((await t.quality.get("/api/attempts/A1-2507-001").expect(200)).body);
    expect(body.placement).toMatchObject({ attempts: 30, hidden: false });
    // A1-2507-001 is the one pass at score 80; the other 29 (28 of A1's and B1's one) score 70: 29 below, itself
    // equal → (29 + 1/2) / 30 = 98.33… % (mid-rank percentile, worked by hand)
    expect(body.placement.percentiles.score).toBeCloseTo((100 * 29.5) / 30, 12);
  });
});
