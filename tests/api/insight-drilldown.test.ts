// Drill-down routes against the hand-worked fixture (tests/fixtures/insight/network.ts): the instructors'
// funnel, one instructor's trend, the error analysis, the attempt list and one attempt, one class.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import {
  attemptDetailAnswerSchema,
  attemptListAnswerSchema,
  classDetailAnswerSchema,
  techniqueErrorsAnswerSchema,
  instructorDetailAnswerSchema,
  instructorsAnswerSchema,
} from "../../shared/schemas/insight";
import { wilsonInterval } from "../../shared/stats";
import { startInsightApp, type InsightTestContext } from "../fixtures/insight/setup";

let t: InsightTestContext;
beforeAll(async () => {
  t = await startInsightApp();
});
afterAll(() => t.db.$client.close());

describe("GET /api/insight/instructors", () => {
  it("gives one row per instructor with rates, medians and funnel positions against the network rate", async () => {
    const body = instructorsAnswerSchema.parse((await t.quality.get("/api/insight/instructors").expect(200)).body);
    expect(body.funnel.networkRate).toBeCloseTo(28 / 44, 12);
    const row = (code: string) => body.instructors.find((r) => r.code === code)!;
    expect(body.instructors.map((r) => r.code)).toEqual(["A1", "B1", "C1", "D1"]);
    expect(row("A1")).toMatchObject({ name: "Instructor A1", site: { code: "NORTH" }, classes: 1, attempts: 10, medianScore: 75 });
    expect(row("A1").passRate).toMatchObject({ successes: 6, n: 10 });
    const [low, high] = wilsonInterval(6, 10)!;
    expect(row("A1").passRate.low).toBe(low);
    expect(row("A1").passRate.high).toBe(high);
    // The crude view (adjust=none) is tested below; by default instructors are compared by case mix.
    expect(body.funnel).toMatchObject({ adjust: "case-mix", method: "normal" });
  });

  it("compares instructors against the network as measured on request (adjust=none), limits widened for overdispersion", async () => {
    const body = instructorsAnswerSchema.parse((await t.quality.get("/api/insight/instructors?adjust=none").expect(200)).body);
    const row = (code: string) => body.instructors.find((r) => r.code === code)!;
    // One stratum, θ = 28/44 = 7/11, θ(1 − θ) = 28/121, worked by hand: z = (O − nθ) / √(nθ(1 − θ))
    // A1 (6 − 6.3636) / 1.52120 = −0.23905; B1 (2 − 6.3636) / 1.52120 = −2.86855;
    // C1 (0 − 2.54545) / 0.96209 = −2.64575; D1 (20 − 12.7273) / 2.15130 = 3.38064.
    expect(row("A1").expected).toBeCloseTo(70 / 11, 10);
    expect(row("A1").z).toBeCloseTo(-0.23905, 4);
    expect(row("B1").z).toBeCloseTo(-2.86855, 4);
    expect(row("C1").z).toBeCloseTo(-2.64575, 4);
    expect(row("D1").z).toBeCloseTo(3.38064, 4);
    // one stratum: drawn as measured, at its own number of attempts
    expect(row("D1").adjustedRate).toBeCloseTo(1, 12);
    expect(row("D1").effectiveAttempts).toBeCloseTo(20, 10);
    // Spiegelhalter 2005 (Qual Saf Health Care 14:347): winsorised at the type-7 10th percentile
    // −2.86855 + 0.3 × 0.22280 = −2.80171 and 90th −0.23905 + 0.7 × 3.61969 = 2.29473; squares
    // 7.84958 + 7.0 + 0.05715 + 5.26578 = 20.1725, φ = 5.0431; 4φ = 20.17 > qchisq(0.95, 3) = 7.8147.
    expect(body.funnel.phi).toBeCloseTo(5.0431, 3);
    expect(body.funnel.overdispersed).toBe(true);
    expect(body.funnel.scale).toBeCloseTo(Math.sqrt(5.0431), 3);
    // limits 1.96 × 2.2457 = 4.40 and 3.09 × 2.2457 = 6.94 standard errors: every instructor is inside;
    // unscaled, B1 and C1 would be below the 95 % limit and D1 above the 99.8 % one
    expect(body.instructors.map((r) => r.position)).toEqual(["inside", "inside", "inside", "inside"]);
    // the curve spans n = 1 … 20, the 99.8 % band outside the 95 % band, widened by √φ
    expect(body.funnel.curve[0].n).toBe(1);
    expect(body.funnel.curve.at(-1)!.n).toBe(20);
    const at20 = body.funnel.curve.at(-1)!;
    expect(at20.high95).toBeCloseTo(Math.min(1, 7 / 11 + 1.959964 * body.funnel.scale * Math.sqrt(28 / 121 / 20)), 10);
    for (const p of body.funnel.curve) {
      expect(p.low998).toBeLessThanOrEqual(p.low95);
      expect(p.high998).toBeGreaterThanOrEqual(p.high95);
    }
  });

  it("adjusts for patient type × feedback display by default (indirect standardisation)", async () => {
    const body = instructorsAnswerSchema.parse((await t.quality.get("/api/insight/instructors").expect(200)).body);
    const row = (code: string) => body.instructors.find((r) => r.code === code)!;
    // Network rates per stratum, worked by hand: adult·live 17/20 = 0.85, adult·hidden 11/20 = 0.55,
    // infant·hidden 0/4 = 0. A1 and B1 have 5 attempts in each adult stratum: E = 4.25 + 2.75 = 7,
    // V = 5·0.85·0.15 + 5·0.55·0.45 = 1.875; D1 has 10 in each: E = 14, V = 3.75.
    expect(row("A1").expected).toBeCloseTo(7, 10);
    expect(row("A1").z).toBeCloseTo(-1 / Math.sqrt(1.875), 10);
    expect(row("B1").z).toBeCloseTo(-5 / Math.sqrt(1.875), 10);
    expect(row("D1").z).toBeCloseTo(6 / Math.sqrt(3.75), 10);
    // A1 drawn at 7/11 + (6 − 7)/10 and at 10² · (28/121) / 1.875 effective attempts
    expect(row("A1").adjustedRate).toBeCloseTo(7 / 11 - 0.1, 10);
    expect(row("A1").effectiveAttempts).toBeCloseTo((100 * 28) / 121 / 1.875, 10);
    // C1's infants all failed, as every infant attempt in the network did: nothing to compare, no z
    expect(row("C1")).toMatchObject({ expected: 0, z: null, position: "inside" });
    // z −0.7303, −3.6515, 3.0984 winsorised at −3.0672 and 2.3327: φ = (9.4080 + 0.5333 + 5.4413) / 3 = 5.1275,
    // 3φ = 15.38 > qchisq(0.95, 2) = 5.9915, so B1's −3.65 is inside ±1.96·√φ = ±4.44
    expect(body.funnel.phi).toBeCloseTo(5.1275, 3);
    expect(body.funnel.overdispersed).toBe(true);
    expect(row("B1").position).toBe("inside");
    // the curve reaches D1's effective attempts, 400 · (28/121) / 3.75 = 24.7
    expect(body.funnel.curve.at(-1)!.n).toBe(25);
  });

  it("refuses an unknown adjustment with 422", async () => {
    const res = await t.quality.get("/api/insight/instructors?adjust=age").expect(422);
    expect(res.body.error.details[0]).toMatchObject({ path: "adjust" });
  });

  it("follows the filters", async () => {
    const body = instructorsAnswerSchema.parse((await t.coordinator.get("/api/insight/instructors?site=NORTH&from=2025-Q3&to=2026-Q2").expect(200)).body);
    // NORTH: A1 1/29 + 6/10 = 7/39 over two classes, C1 0/4
    expect(body.instructors.map((r) => [r.code, r.classes, r.passRate.successes, r.passRate.n])).toEqual([
      ["A1", 2, 7, 39],
      ["C1", 1, 0, 4],
    ]);
    expect(body.funnel.networkRate).toBeCloseTo(7 / 43, 12);
  });
});

describe("GET /api/insight/instructors/:id", () => {
  it("gives the quarterly trend and the classes of one instructor", async () => {
    const body = instructorDetailAnswerSchema.parse((await t.coordinator.get(`/api/insight/instructors/${t.net.instructors.a1.id}`).expect(200)).body);
    expect(body.instructor).toMatchObject({ code: "A1", site: { code: "NORTH" } });
    expect(body.trend).toHaveLength(8);
    const q = (quarter: string) => body.trend.find((p) => p.quarter === quarter)!;
    // 2025-Q3: 1 of 29 passed; scores 80 and 28 × 70 → median 70
    expect(q("2025-Q3")).toMatchObject({ passRate: { successes: 1, n: 29 }, medianScore: 70 });
    expect(q("2025-Q3").passRate.low).toBeCloseTo(0.0061, 4); // Newcombe 1998, 1/29
    expect(q("2026-Q2")).toMatchObject({ passRate: { successes: 6, n: 10 }, medianScore: 75 });
    expect(q("2026-Q1")).toMatchObject({ passRate: { successes: 0, n: 0, rate: null }, medianScore: null });
    expect(body.classes.map((c) => c.id)).toEqual(["A1-2604"]);
  });

  it("answers 404 for an instructor who does not exist and 422 for an id that is not a number", async () => {
    await t.coordinator.get("/api/insight/instructors/9999").expect(404);
    await t.coordinator.get("/api/insight/instructors/A1").expect(422);
  });
});

describe("GET /api/insight/errors", () => {
  it("gives the Pareto without a chosen error", async () => {
    const body = techniqueErrorsAnswerSchema.parse((await t.coordinator.get("/api/insight/errors").expect(200)).body);
    expect(body.pareto.rows[0]).toMatchObject({ error: "too_shallow", count: 8, share: 0.5 });
    expect(body.selected).toBeNull();
  });

  it("gives the trend and the breakdowns of a chosen error", async () => {
    const body = techniqueErrorsAnswerSchema.parse((await t.coordinator.get("/api/insight/errors?error=too_shallow").expect(200)).body);
    const selected = body.selected!;
    const trend = Object.fromEntries(selected.trend.map((p) => [p.quarter, [p.count, p.attempts]]));
    // 2025-Q3 28 of 29; 2025-Q4 20 of 20; 2026-Q1 9 + 45 + 128 = 182 of 263; 2026-Q2 8 of 44
    expect(trend).toMatchObject({ "2025-Q3": [28, 29], "2025-Q4": [20, 20], "2026-Q1": [182, 263], "2026-Q2": [8, 44], "2025-Q2": [0, 0] });
    const q2 = selected.trend.find((p) => p.quarter === "2026-Q2")!;
    expect(q2.share).toBeCloseTo(8 / 44, 12);
    expect([q2.low, q2.high]).toEqual(wilsonInterval(8, 44));
    const pairs = (rows: typeof selected.byProfile) => rows.map((r) => [r.key, r.count, r.attempts]);
    // 2026-Q2 shallow attempts: A1 2 (hidden), B1 4 (2 live, 2 hidden), C1 2 (infant, hidden)
    expect(pairs(selected.byProfile)).toEqual([
      ["adult", 6, 40],
      ["infant", 2, 4],
    ]);
    expect(pairs(selected.byFeedback)).toEqual([
      ["hidden", 6, 24],
      ["live", 2, 20],
    ]);
    expect(pairs(selected.bySite)).toEqual([
      ["NORTH", 4, 14],
      ["SOUTH", 4, 30],
    ]);
    // equal counts: the larger share first (C1 2/4 before A1 2/10)
    expect(pairs(selected.byInstructor)).toEqual([
      ["B1", 4, 10],
      ["C1", 2, 4],
      ["A1", 2, 10],
      ["D1", 0, 20],
    ]);
    expect(pairs(selected.byManikin)).toEqual([
      ["MK-S1", 4, 30],
      ["MK-N2", 2, 4],
      ["MK-N1", 2, 10],
    ]);
    expect(selected.byInstructor[0].share).toBeCloseTo(0.4, 12);
  });

  it("refuses an unknown error name with 422", async () => {
    const res = await t.coordinator.get("/api/insight/errors?error=bad_hair").expect(422);
    expect(res.body.error.details[0].path).toBe("error");
  });
});

describe("GET /api/attempts", () => {
  it("pages through the filtered attempts, newest first", async () => {
    const page1 = attemptListAnswerSchema.parse((await t.coordinator.get("/api/attempts?pageSize=15").expect(200)).body);
    expect(page1).toMatchObject({ page: 1, pageSize: 15, total: 44 });
    expect(page1.attempts[0].classId).toBe("D1-2606");
    const page3 = attemptListAnswerSchema.parse((await t.coordinator.get("/api/attempts?pageSize=15&page=3").expect(200)).body);
    expect(page3.attempts).toHaveLength(14);
    expect(page3.attempts.at(-1)!.classId).toBe("A1-2604");
  });

  it("narrows by error and by class, and names the errors of each attempt", async () => {
    const shallow = attemptListAnswerSchema.parse((await t.coordinator.get("/api/attempts?error=too_shallow").expect(200)).body);
    expect(shallow.total).toBe(8);
    expect(shallow.attempts.every((a) => a.errors.includes("too_shallow"))).toBe(true);
    const cls = attemptListAnswerSchema.parse((await t.coordinator.get("/api/attempts?class=B1-2605&error=too_fast").expect(200)).body);
    expect(cls.attempts.map((a) => [a.score, a.errors])).toEqual([
      [63, ["too_fast"]],
      [61, ["too_fast"]],
    ]);
  });

  it("marks attempts with a stored compression stream", async () => {
    const body = attemptListAnswerSchema.parse((await t.coordinator.get("/api/attempts?class=A1-2604").expect(200)).body);
    expect(body.attempts.filter((a) => a.hasStream).map((a) => a.id)).toEqual(["A1-2604-001"]);
  });

  it("shows an instructor their own attempts only", async () => {
    const own = attemptListAnswerSchema.parse((await t.instructor.get("/api/attempts?from=2025-Q3&to=2026-Q2").expect(200)).body);
    expect(own.total).toBe(39);
    expect(new Set(own.attempts.map((a) => a.instructor?.code))).toEqual(new Set(["A1"]));
    const none = attemptListAnswerSchema.parse((await t.instructor.get("/api/attempts?class=B1-2605").expect(200)).body);
    expect(none.total).toBe(0);
  });

  it("refuses a page size over 200", async () => {
    const res = await t.coordinator.get("/api/attempts?pageSize=201").expect(422);
    expect(res.body.error.details[0].path).toBe("pageSize");
  });
});

describe("GET /api/attempts/:id", () => {
  it("gives the attempt, its policy version and its decoded stream with the target band", async () => {
    const body = attemptDetailAnswerSchema.parse((await t.instructor.get("/api/attempts/A1-2604-001").expect(200)).body);
    expect(body.attempt).toMatchObject({ id: "A1-2604-001", score: 95, passed: true, errors: [], policyVersion: 1 });
    // depths were stored in tenths of a millimetre
    expect(body.stream).toEqual({
      compressions: 3,
      t_ms: [0, 550, 1100],
      depth_mm: [52.3, 54.8, 60.1],
      release_mm: [1.2, 0, 3.1],
      // adult band under the default policy: 50–60 mm (AHA 2020, ERC 2021), 100–120/min
      band: { depthMinMm: 50, depthMaxMm: 60, rateMin: 100, rateMax: 120, recoilMaxMm: 5 },
    });
  });

  it("gives the pass rule that scored the attempt, for every role that may open it", async () => {
    const body = attemptDetailAnswerSchema.parse((await t.instructor.get("/api/attempts/A1-2604-001").expect(200)).body);
    // the default policy's pass rule and adult band (shared/scoring/policy.ts)
    expect(body.scoring).toEqual({
      passRule: { minDepthOkPct: 70, minRateOkPct: 70, minRecoilOkPct: 70, minHandsOnPct: 60, maxLongestPauseS: 10 },
      band: { depthMinMm: 50, depthMaxMm: 60, rateMin: 100, rateMax: 120, recoilMaxMm: 5 },
      pauseThresholdS: 2,
      longPauseLimitS: 10,
    });
  });

  it("places the attempt among the network's attempts of its patient type and quarter", async () => {
    const body = attemptDetailAnswerSchema.parse((await t.quality.get("/api/attempts/A1-2604-001").expect(200)).body);
    // 2026-Q2 adult attempts (A1, B1, D1): 40. Score 95: 34 below (A1 9, B1 10, D1 80–94 15) and 2 equal (itself,
    // D1's 95), so (34 + 2/2) / 40 = 87.5 % (mid-rank percentile, worked by hand).
    expect(body.placement).toMatchObject({ quarter: "2026-Q2", profile: "adult", attempts: 40, hidden: false });
    expect(body.placement.percentiles.score).toBe(87.5);
    // hands-on time is 80 % in every fixture attempt: all 40 tie, so the attempt sits at the middle
    expect(body.placement.percentiles.handsOnPct).toBe(50);
    // the infant class is alone in its group of four: the lowest of 74, 76, 78, 80 (score) is at 1/2 of 1/4
    const infant = attemptDetailAnswerSchema.parse((await t.quality.get("/api/attempts/C1-2605-002").expect(200)).body);
    expect(infant.placement).toMatchObject({ profile: "infant", attempts: 4 });
    expect(infant.placement.percentiles.score).toBe(12.5);
  });

  it("gives an instructor the placement when the group holds enough of other people's attempts", async () => {
    const body = attemptDetailAnswerSchema.parse((await t.instructor.get("/api/attempts/A1-2604-001").expect(200)).body);
    expect(body.placement).toMatchObject({ attempts: 40, hidden: false });
    expect(body.placement.percentiles.score).toBe(87.5);
  });

  it("names the errors of a failed attempt and has no stream when none was stored", async () => {
    const body = attemptDetailAnswerSchema.parse((await t.coordinator.get("/api/attempts/B1-2605-010").expect(200)).body);
    expect(body.attempt.errors).toEqual(["long_pause"]);
    expect(body.errorLabels[0].label).toMatch(/interruption/);
    expect(body.stream).toBeNull();
  });

  it("answers 404 to an instructor asking for another instructor's attempt, as for one that does not exist", async () => {
    const other = await t.instructor.get("/api/attempts/B1-2605-001").expect(404);
    const missing = await t.instructor.get("/api/attempts/NO-SUCH").expect(404);
    expect(other.body.error.message).toBe(missing.body.error.message);
    await t.otherInstructor.get("/api/attempts/B1-2605-001").expect(200);
  });
});

describe("GET /api/classes/:id", () => {
  it("gives the class log and its attempts with learner codes only", async () => {
    const body = classDetailAnswerSchema.parse((await t.instructor.get("/api/classes/A1-2604").expect(200)).body);
    expect(body.class).toMatchObject({ id: "A1-2604", learners: 10, passed: 7, instructor: { code: "A1" }, site: { code: "NORTH" } });
    expect(body.attempts).toHaveLength(10);
    expect(body.attempts[0].learner).toBe("LRN-A1-2604-1");
    expect(body.passRate).toMatchObject({ successes: 6, n: 10 });
  });

  it("answers 404 to an instructor asking for another instructor's class", async () => {
    await t.instructor.get("/api/classes/B1-2605").expect(404);
    await t.otherInstructor.get("/api/classes/B1-2605").expect(200);
    await t.quality.get("/api/classes/B1-2605").expect(200);
    await t.funder.get("/api/classes/B1-2605").expect(403);
  });
});
