// GET /api/insight/overview against the hand-worked fixture (tests/fixtures/insight/network.ts), its filters,
// its validation and its suppression of small groups.
import { count, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { overviewAnswerSchema, type OverviewAnswer } from "../../shared/schemas/insight";
import { openDatabase } from "../../server/db/client";
import { attempts } from "../../server/db/schema";
import { resolveFilters } from "../../server/insight/filters";
import { overview } from "../../server/insight/overview";
import { viewerOf } from "../../server/insight/viewer";
import { findActiveUser } from "../../server/users/service";
import { startInsightApp, type InsightTestContext } from "../fixtures/insight/setup";
import { proportionDifference } from "../../shared/stats/difference";

let t: InsightTestContext;
beforeAll(async () => {
  t = await startInsightApp();
});
afterAll(() => t.db.$client.close());

async function get(url: string, agent = t.coordinator): Promise<OverviewAnswer> {
  const res = await agent.get(url).expect(200);
  return overviewAnswerSchema.parse(res.body);
}

describe("overview of the latest quarter (2026-Q2), seen by the coordinator", () => {
  let o: OverviewAnswer;
  beforeAll(async () => {
    o = await get("/api/insight/overview");
  });

  it("defaults to the latest quarter with data and counts classes, learners and attempts", () => {
    expect(o.period).toEqual({ from: "2026-Q2", to: "2026-Q2", quarters: ["2026-Q2"] });
    expect(o.previousPeriod.quarters).toEqual(["2026-Q1"]);
    // classes A1-2604, B1-2605, C1-2605, D1-2606; learners 10 + 10 + 4 + 20 = 44; attempts 10 + 10 + 4 + 20
    expect(o).toMatchObject({ classes: 4, learners: 44, attempts: 44, suppressed: false });
  });

  it("gives the pass rate with its Wilson interval and the change from the previous quarter", () => {
    // passed: A1 6 + B1 2 + C1 0 + D1 20 = 28 of 44
    expect(o.passRate).toMatchObject({ successes: 28, n: 44, suppressed: false });
    expect(o.passRate.rate).toBeCloseTo(28 / 44, 12);
    // previous quarter 81/263: Wilson 95 % 0.2553–0.3662 (Newcombe, Stat Med 1998;17:857, Table I)
    expect(o.passRateChange.previous).toMatchObject({ successes: 81, n: 263 });
    expect(o.passRateChange.previous.low).toBeCloseTo(0.2553, 4);
    expect(o.passRateChange.previous.high).toBeCloseTo(0.3662, 4);
    // 28/44 − 81/263 = 0.636364 − 0.307985 = 0.328379; relative 0.328379 / 0.307985 = 1.06622
    expect(o.passRateChange.absolute).toBeCloseTo(0.328379, 5);
    expect(o.passRateChange.relative).toBeCloseTo(1.06622, 4);
    // the change is called with the same test the funder report uses (Newcombe's hybrid score interval)
    const difference = proportionDifference(28, 44, 81, 263)!;
    expect(o.passRateChange.low).toBeCloseTo(difference.low, 12);
    expect(o.passRateChange.high).toBeCloseTo(difference.high, 12);
    expect(o.passRateChange.verdict).toBe("up");
  });

  it("puts the instructors' recorded completion rate beside it", () => {
    // recorded passed 7 + 5 + 4 + 20 = 36 of 44 learners
    expect(o.recordedCompletion).toMatchObject({ successes: 36, n: 44 });
    expect(o.recordedCompletion.rate).toBeCloseTo(36 / 44, 12);
    expect(o.recordedCompletion.low).toBeLessThan(36 / 44);
  });

  it("gives the type-7 median score", () => {
    // 44 scores; below 80: the 16 scores of A1, B1 and C1 up to 78; then 80 ×3 (17th–19th), 81, 82, 83 (22nd),
    // 84 ×2 (23rd–24th). Type 7 (Hyndman & Fan 1996): h = 43 × 0.5 = 21.5 → (x[22nd] + x[23rd]) / 2 = (83 + 84) / 2
    expect(o.medianScore).toBe(83.5);
  });

  it("charts the last eight quarters with p-chart limits and flags the quarters outside them", () => {
    expect(o.series.points.map((p) => p.quarter)).toEqual(["2024-Q3", "2024-Q4", "2025-Q1", "2025-Q2", "2025-Q3", "2025-Q4", "2026-Q1", "2026-Q2"]);
    // centre p̄ = (1 + 0 + 81 + 28) / (29 + 20 + 263 + 44) = 110 / 356 (Montgomery p-chart)
    expect(o.series.centre).toBeCloseTo(110 / 356, 12);
    const point = (q: string) => o.series.points.find((p) => p.quarter === q)!;
    // p̄(1 − p̄) = 0.308989 × 0.691011 = 0.213516
    // 2025-Q3: 1/29, 3·sqrt(0.213516/29) = 0.257417 → LCL 0.051572; 0.0345 < LCL → outside
    expect(point("2025-Q3")).toMatchObject({ attempts: 29, passed: 1, outside: true });
    expect(point("2025-Q3").lcl).toBeCloseTo(0.051572, 5);
    // Wilson 1/29: 0.0061–0.1718 (Newcombe 1998)
    expect(point("2025-Q3").low).toBeCloseTo(0.0061, 4);
    expect(point("2025-Q3").high).toBeCloseTo(0.1718, 4);
    // 2025-Q4: 0/20, 3·sqrt(0.213516/20) = 0.309973 > p̄ → LCL clamped to 0; 0 is not below 0 → inside
    expect(point("2025-Q4")).toMatchObject({ attempts: 20, passed: 0, lcl: 0, outside: false });
    // Wilson 0/20: 0–0.1611 (Newcombe 1998)
    expect(point("2025-Q4").high).toBeCloseTo(0.1611, 4);
    // 2026-Q1: 81/263 = 0.30798 within 0.308989 ± 0.085479 → inside
    expect(point("2026-Q1")).toMatchObject({ outside: false });
    expect(point("2026-Q1").lcl).toBeCloseTo(0.22351, 5);
    // 2026-Q2: 28/44 = 0.63636 above UCL 0.308989 + 3·sqrt(0.213516/44) = 0.517972 → outside
    expect(point("2026-Q2")).toMatchObject({ attempts: 44, passed: 28, outside: true });
    expect(point("2026-Q2").ucl).toBeCloseTo(0.517972, 5);
    // quarters without attempts: no rate, no limits
    expect(point("2024-Q3")).toMatchObject({ attempts: 0, rate: null, lcl: null, outside: false, suppressed: false });
  });

  it("builds the error Pareto from the error bits", () => {
    // attempts with each error: too_shallow A1 2 + B1 4 + C1 2 = 8; incomplete_recoil A1 1 + B1 1 + C1 2 = 4;
    // too_fast A1 1 + B1 2 = 3; long_pause B1 1; 16 errors in all
    expect(o.errors.attempts).toBe(44);
    expect(o.errors.rows.map((r) => [r.error, r.count, r.share, r.cumulativeShare])).toEqual([
      ["too_shallow", 8, 0.5, 0.5],
      ["incomplete_recoil", 4, 0.25, 0.75],
      ["too_fast", 3, 0.1875, 0.9375],
      ["long_pause", 1, 0.0625, 1],
      ["low_hands_on", 0, 0, 1],
      ["too_deep", 0, 0, 1],
      ["too_slow", 0, 0, 1],
    ]);
    expect(o.errors.rows[0].attemptShare).toBeCloseTo(8 / 44, 12);
  });

  it("compares live-display and hidden-display attempts", () => {
    const live = o.feedback.find((f) => f.mode === "live")!;
    const hidden = o.feedback.find((f) => f.mode === "hidden")!;
    // live: A1 5 (5 passed), B1 5 (2), D1 10 (10) = 17 of 20; hidden: A1 5 (1), B1 5 (0), C1 4 (0), D1 10 (10) = 11 of 24
    expect(live).toMatchObject({ attempts: 20, passRate: { successes: 17, n: 20 } });
    expect(hidden).toMatchObject({ attempts: 24, passRate: { successes: 11, n: 24 } });
    // live scores sorted: 62 64 72 75 80 80 82 84 84 85 | 86 88 88 90 90 92 94 95 96 98 → (85 + 86) / 2
    expect(live.medianScore).toBe(85.5);
    // hidden: 61 63 65 65 66 68 70 70 74 75 76 78 | 80 81 83 85 87 89 90 91 93 95 97 99 → (78 + 80) / 2
    expect(hidden.medianScore).toBe(79);
  });

  it("has no agreement figure without instructors' results", () => {
    expect(o.agreement).toMatchObject({ pairs: 0, kappa: null, suppressed: false });
  });
});

describe("overview of other periods", () => {
  it("gives Cohen's kappa of the instructors' results against Quarterbeat's", async () => {
    const o = await get("/api/insight/overview?quarter=2026-Q1");
    // Gerstman, Epidemiology Kept Simple, Example 10.1: [[40, 9], [6, 45]] → p0 0.85, pe 0.50, κ 0.6995
    expect(o.agreement.table).toEqual([
      [40, 9],
      [6, 45],
    ]);
    expect(o.agreement.pairs).toBe(100);
    expect(o.agreement.observed).toBeCloseTo(0.85, 10);
    expect(o.agreement.expected).toBeCloseTo(0.5, 2);
    expect(o.agreement.kappa).toBeCloseTo(0.6995, 4);
  });

  it("covers a from/to range and compares it with the range of equal length before it", async () => {
    const o = await get("/api/insight/overview?from=2026-Q1&to=2026-Q2");
    expect(o.period.quarters).toEqual(["2026-Q1", "2026-Q2"]);
    // 263 + 44 attempts, 81 + 28 passed
    expect(o.passRate).toMatchObject({ successes: 109, n: 307 });
    // the series is the range itself
    expect(o.series.points.map((p) => p.quarter)).toEqual(["2026-Q1", "2026-Q2"]);
    // previous two quarters: 2025-Q3 and 2025-Q4, 1 of 29 + 0 of 20
    expect(o.previousPeriod.quarters).toEqual(["2025-Q3", "2025-Q4"]);
    expect(o.passRateChange.previous).toMatchObject({ successes: 1, n: 49 });
  });

  it("gives a range open at one end up to the latest quarter with data", async () => {
    const o = await get("/api/insight/overview?from=2025-Q4");
    expect(o.period).toMatchObject({ from: "2025-Q4", to: "2026-Q2" });
    expect(o.passRate).toMatchObject({ successes: 0 + 81 + 28, n: 20 + 263 + 44 });
  });
});

describe("answers kept per state of the database", () => {
  it("follows a write made through another connection, as a CLI import would", async () => {
    const first = await get("/api/insight/overview?instructor=C1");
    expect(first.passRate).toMatchObject({ successes: 0, n: 4 });
    const other = openDatabase(t.db.$client.name);
    try {
      other.update(attempts).set({ passed: true, errorMask: 0 }).where(eq(attempts.id, "C1-2605-001")).run();
      const after = await get("/api/insight/overview?instructor=C1");
      expect(after.passRate).toMatchObject({ successes: 1, n: 4 });
      other.update(attempts).set({ passed: false, errorMask: 16 }).where(eq(attempts.id, "C1-2605-001")).run();
    } finally {
      other.$client.close();
    }
    expect((await get("/api/insight/overview?instructor=C1")).passRate).toMatchObject({ successes: 0, n: 4 });
  });
});

describe("filters", () => {
  const cases: [string, number, number][] = [
    // [query, attempts, passed] in 2026-Q2
    ["site=NORTH", 14, 6], // A1 10 (6) + C1 4 (0)
    ["site=SOUTH", 30, 22], // B1 10 (2) + D1 20 (20)
    ["profile=adult", 40, 28],
    ["profile=infant", 4, 0],
    ["feedback=live", 20, 17],
    ["feedback=hidden", 24, 11],
    ["instructor=B1", 10, 2],
    ["manikin=MK-S1", 30, 22],
    ["site=SOUTH&feedback=live", 15, 12], // B1 live 5 (2) + D1 live 10 (10)
    ["quarter=2025-Q4", 20, 0],
  ];
  it.each(cases)("%s narrows the attempts", async (query, n, passed) => {
    const o = await get(`/api/insight/overview?${query}`);
    expect(o.passRate).toMatchObject({ n, successes: passed });
  });

  it("takes numeric ids as well as codes", async () => {
    const byId = await get(`/api/insight/overview?site=${t.net.sites.south.id}&instructor=${t.net.instructors.d1.id}`);
    expect(byId.passRate).toMatchObject({ n: 20, successes: 20 });
  });

  it("narrows class logs by the attempt filters too", async () => {
    const o = await get("/api/insight/overview?profile=infant");
    // only C1-2605 has infant attempts: 4 learners, 4 recorded passed
    expect(o).toMatchObject({ classes: 1, learners: 4, recordedCompletion: { successes: 4, n: 4 } });
  });

  const invalid: [string, string][] = [
    ["quarter=2026-Q5", "quarter"],
    ["quarter=26-Q1", "quarter"],
    ["from=2026-Q2&to=2026-Q1", "to"],
    ["quarter=2026-Q1&from=2025-Q1", "quarter"],
    ["profile=elderly", "profile"],
    ["feedback=sometimes", "feedback"],
    ["site=NO%20SUCH", "site"],
    ["site=NOWHERE", "site"],
    ["instructor=ZZ9", "instructor"],
    ["manikin=MK-404", "manikin"],
    ["site=NORTH&site=SOUTH", "site"],
    ["from=1990-Q1&to=2026-Q2", "from"],
  ];
  it.each(invalid)("refuses %s with 422 naming %s", async (query, field) => {
    const res = await t.coordinator.get(`/api/insight/overview?${query}`).expect(422);
    expect(res.body.error.details.map((d: { path: string }) => d.path)).toContain(field);
  });
});

describe("SQL written into the filters", () => {
  const injections = [
    "' OR '1'='1",
    "1 OR 1=1",
    "1; DROP TABLE attempts; --",
    "NORTH' --",
    '" OR ""="',
    "%' UNION SELECT email, password_hash FROM users --",
    "2026-Q2' OR quarter LIKE '%",
    "1)) OR ((1=1",
  ];
  const fields = ["quarter", "from", "to", "site", "profile", "feedback", "instructor", "manikin"];

  it("is refused or matches nothing on every route and every filter, and changes nothing", async () => {
    const countAttempts = () => t.db.select({ n: count() }).from(attempts).get()!.n;
    const before = countAttempts();
    for (const route of ["/api/insight/overview", "/api/insight/instructors", "/api/insight/errors", "/api/attempts", "/api/equipment"]) {
      for (const field of fields) {
        for (const value of injections) {
          const res = await t.coordinator.get(`${route}?${field}=${encodeURIComponent(value)}`);
          expect([200, 422], `${route} ${field}=${value}`).toContain(res.status);
          if (res.status === 200 && route === "/api/attempts") expect(res.body.total).toBe(0);
        }
      }
    }
    for (const field of ["error", "class", "page", "pageSize"]) {
      for (const value of injections) {
        const res = await t.coordinator.get(`/api/attempts?${field}=${encodeURIComponent(value)}`);
        expect([200, 422], `attempts ${field}=${value}`).toContain(res.status);
        if (res.status === 200) expect(res.body.total).toBe(0);
      }
    }
    expect(countAttempts()).toBe(before);
  });
});

describe("the control chart's baseline and limits", () => {
  it("takes the centre from the first four quarters with attempts by default, and says so", async () => {
    const o = await get("/api/insight/overview");
    // the fixture has four quarters with attempts, 2025-Q3 … 2026-Q2: 356 attempts in all
    expect(o.series.baseline).toEqual({ from: "2025-Q3", to: "2026-Q2", source: "default", attempts: 356 });
    expect(o.series).toMatchObject({ limits: "binomial", sigmaZ: null });
  });

  it("widens the limits by Laney's σ_z on request (Laney 2002)", async () => {
    const o = await get("/api/insight/overview?limits=laney");
    // worked by hand: p̄ = 110/356, z = (p_i − p̄)/√(p̄(1 − p̄)/n_i) = −3.19917, −2.99050, −0.03524, 4.69957 in
    // quarter order; moving ranges 0.20867, 2.95526, 4.73480, MR̄ = 2.63291, σ_z = MR̄ / 1.128 = 2.33414
    expect(o.series.limits).toBe("laney");
    expect(o.series.sigmaZ).toBeCloseTo(2.33414, 4);
    const point = (q: string) => o.series.points.find((p) => p.quarter === q)!;
    // 2026-Q1 (263): 110/356 ± 3 · 0.028493 · 2.33414 → 0.109470 to 0.508508
    expect(point("2026-Q1").lcl).toBeCloseTo(0.10947, 5);
    expect(point("2026-Q1").ucl).toBeCloseTo(0.508508, 5);
    // 2026-Q2: 0.6364 is inside the widened UCL 0.796782; 2025-Q3's 0.0345 is above the clamped LCL 0
    expect(point("2026-Q2").ucl).toBeCloseTo(0.796782, 5);
    expect(o.series.points.filter((p) => p.outside)).toEqual([]);
    await t.coordinator.get("/api/insight/overview?limits=wide").expect(422);
  });

  it("follows a coordinator's baseline, and the quarters after it never move its centre", async () => {
    const put = await t.coordinator.put("/api/settings/chart-baseline", { baseline: { from: "2025-Q3", to: "2025-Q4" } });
    expect(put.status, JSON.stringify(put.body)).toBe(200);
    expect(put.body).toEqual({ from: "2025-Q3", to: "2025-Q4", source: "setting" });
    try {
      const o = await get("/api/insight/overview");
      // 2025-Q3 1/29 and 2025-Q4 0/20: centre 1/49; UCL for 2026-Q1 (263) 1/49 + 3·√(1/49 · 48/49 / 263) = 0.046564
      expect(o.series.baseline).toEqual({ from: "2025-Q3", to: "2025-Q4", source: "setting", attempts: 49 });
      expect(o.series.centre).toBeCloseTo(1 / 49, 12);
      const point = (q: string) => o.series.points.find((p) => p.quarter === q)!;
      expect(point("2026-Q1").ucl).toBeCloseTo(0.046564, 5);
      expect(point("2026-Q1").outside).toBe(true);
      // the same centre when the period ends earlier: later quarters do not move it
      const earlier = await get("/api/insight/overview?quarter=2026-Q1");
      expect(earlier.series.centre).toBe(o.series.centre);
      // only a coordinator sets it; a range that runs backwards is refused
      await t.quality.put("/api/settings/chart-baseline", { baseline: null }).expect(403);
      const backwards = await t.coordinator.put("/api/settings/chart-baseline", { baseline: { from: "2026-Q1", to: "2025-Q4" } }).expect(422);
      expect(backwards.body.error.details[0]).toMatchObject({ path: "baseline.to" });
    } finally {
      const reset = await t.coordinator.put("/api/settings/chart-baseline", { baseline: null });
      expect(reset.body).toEqual({ from: "2025-Q3", to: "2026-Q2", source: "default" });
    }
  });
});

describe("the control chart split at an improvement action's start", () => {
  const point = (o: OverviewAnswer, q: string) => o.series.points.find((p) => p.quarter === q)!;

  it("judges the first quarters after the split against the limits before it, until the new phase has four", async () => {
    // 2026-01-15 is inside 2026-Q1, so the first whole quarter after it is 2026-Q2
    const o = await get("/api/insight/overview?split=2026-01-15");
    // the default baseline 2025-Q3 … 2026-Q2 is cut at the split: 1 + 0 + 81 passed of 29 + 20 + 263 = 82/312
    expect(o.series.baseline).toEqual({ from: "2025-Q3", to: "2026-Q1", source: "default", attempts: 312 });
    expect(o.series.centre).toBeCloseTo(82 / 312, 12);
    // one quarter after the split: too few for a centre of its own (Montgomery's phase I needs a baseline)
    expect(o.series.split).toEqual({ date: "2026-01-15", quarter: "2026-Q2", centre: null, baseline: null, sigmaZ: null });
    // 2026-Q2 (44 attempts) against the old limits, worked by hand: 82/312 ± 3·√(0.262821 · 0.737179 / 44)
    // = 0.262821 ± 0.199072 → 0.063748 to 0.461893; its 28/44 = 0.636 is above
    expect(point(o, "2026-Q2").lcl).toBeCloseTo(0.063748, 5);
    expect(point(o, "2026-Q2").ucl).toBeCloseTo(0.461893, 5);
    expect(point(o, "2026-Q2").outside).toBe(true);
    // the run-chart median is that of the quarters before the split (1/29, 0, 81/263 → 1/29), carried on
    expect(o.series.runChart?.median).toBeCloseTo(1 / 29, 12);
  });

  it("gives the phase after the split a centre of its own from its first four quarters", async () => {
    // split at the first day of 2025-Q3: nothing before it, and the four quarters 2025-Q3 … 2026-Q2 after it
    const o = await get("/api/insight/overview?split=2025-07-01");
    expect(o.series.split).toEqual({
      date: "2025-07-01",
      quarter: "2025-Q3",
      centre: 110 / 356,
      baseline: { from: "2025-Q3", to: "2026-Q2", attempts: 356 },
      sigmaZ: null,
    });
    expect(o.series.centre).toBeNull();
    // the same limits as the unsplit chart, whose baseline is those same four quarters
    const whole = await get("/api/insight/overview");
    expect(point(o, "2026-Q1").ucl).toBeCloseTo(point(whole, "2026-Q1").ucl!, 12);
    expect(o.series.points.map((p) => p.outside)).toEqual(whole.series.points.map((p) => p.outside));
  });

  it("leaves the chart whole without a split, and refuses a date it cannot read", async () => {
    expect((await get("/api/insight/overview")).series.split).toBeNull();
    const bad = await t.coordinator.get("/api/insight/overview?split=2026-13-01").expect(422);
    expect(bad.body.error.details[0]).toMatchObject({ path: "split" });
  });
});

describe("suppression of small groups", () => {
  it("shows a group of 4 attempts to the quality lead", async () => {
    const o = await get("/api/insight/overview?profile=infant", t.quality);
    expect(o).toMatchObject({ suppressed: false, attempts: 4, passRate: { successes: 0, n: 4 } });
    // C1's scores 74 76 78 80 → (76 + 78) / 2
    expect(o.medianScore).toBe(77);
  });

  it("hides the same group from an instructor: null values and suppressed: true", async () => {
    const o = await get("/api/insight/overview?profile=infant", t.instructor);
    expect(o).toMatchObject({ suppressed: true, attempts: null, learners: null, classes: null, medianScore: null });
    expect(o.passRate).toEqual({ successes: null, n: null, rate: null, low: null, high: null, suppressed: true });
    expect(o.errors).toEqual({ attempts: null, rows: [], suppressed: true });
    const point = o.series.points.find((p) => p.quarter === "2026-Q2")!;
    expect(point).toMatchObject({ suppressed: true, rate: null, attempts: null, lcl: null });
    // quarters without attempts hide nothing
    expect(o.series.points.find((p) => p.quarter === "2026-Q1")).toMatchObject({ attempts: 0, suppressed: false });
  });

  it("hides the same group from a funder (the service the funder report reads)", () => {
    const funder = findActiveUser(t.db, t.net.users.funder.id)!;
    const viewer = viewerOf(t.db, funder);
    const o = overview(t.db, viewer, resolveFilters(t.db, { profile: "infant" }, viewer));
    expect(o.suppressed).toBe(true);
    expect(o.passRate.rate).toBeNull();
    const full = overview(t.db, viewer, resolveFilters(t.db, {}, viewer));
    expect(full).toMatchObject({ suppressed: false, attempts: 44 });
  });

  it("refuses a funder every filter that points at a site, an instructor or a manikin", () => {
    const funder = findActiveUser(t.db, t.net.users.funder.id)!;
    const viewer = viewerOf(t.db, funder);
    for (const filters of [{ site: "NORTH" }, { instructor: "A1" }, { manikin: "MK-N1" }]) {
      expect(() => resolveFilters(t.db, filters, viewer)).toThrow(/network figures only/);
    }
  });

  it("judges a group by the attempts of others, so an instructor cannot subtract their own", async () => {
    // NORTH in 2026-Q2: A1's own 10 attempts + C1's 4. Shown in full to the quality lead …
    expect((await get("/api/insight/overview?site=NORTH", t.quality)).passRate).toMatchObject({ n: 14, successes: 6 });
    // … but to A1 the 14 minus their own 10 would be C1's 4: hidden
    const a1 = await get("/api/insight/overview?site=NORTH", t.instructor);
    expect(a1).toMatchObject({ suppressed: true, attempts: null });
    expect(a1.series.points.at(-1)).toMatchObject({ suppressed: true, attempts: null });
    // to B1, who has no attempts at NORTH, the 14 are enough attempts but those of two colleagues only
    // (fewer than the three other instructors a group needs): hidden as well
    const b1 = await get("/api/insight/overview?site=NORTH", t.otherInstructor);
    expect(b1).toMatchObject({ suppressed: true, attempts: null });
    expect(b1.feedback.every((f) => f.suppressed && f.attempts === null)).toBe(true);
  });

  it("lets an instructor filter on themselves only", async () => {
    await t.instructor.get("/api/insight/overview?instructor=B1").expect(403);
    await t.instructor.get(`/api/insight/overview?instructor=${t.net.instructors.b1.id}`).expect(403);
    // an unknown code gives the same answer as a known one: nothing is learnt about who exists
    await t.instructor.get("/api/insight/overview?instructor=NOBODY").expect(403);
    const own = await get("/api/insight/overview?instructor=A1", t.instructor);
    expect(own.passRate).toMatchObject({ successes: 6, n: 10 });
  });

  it("follows the network policy's smallest group and fewest instructors", async () => {
    // 2026-Q2 to A1: 44 attempts, of which 34 are others' (B1, C1 and D1): three other instructors
    const url = "/api/insight/overview?quarter=2026-Q2";
    expect(await get(url, t.instructor)).toMatchObject({ suppressed: false, attempts: 44 });
    const { policy } = (await t.coordinator.get("/api/settings/policy").expect(200)).body.current;
    expect(policy).toMatchObject({ suppressionMinCount: 5, suppressionMinInstructors: 3 });
    // … hidden once a group needs four other instructors
    await t.coordinator.put("/api/settings/policy", { policy: { ...policy, suppressionMinInstructors: 4 }, note: "Four colleagues" }).expect(200);
    expect(await get(url, t.instructor)).toMatchObject({ suppressed: true, attempts: null });
    // … and once it needs 40 attempts of others (34 are)
    await t.coordinator.put("/api/settings/policy", { policy: { ...policy, suppressionMinCount: 40 }, note: "Larger groups only" }).expect(200);
    expect(await get(url, t.instructor)).toMatchObject({ suppressed: true, suppressionMinCount: 40 });
    // the quality lead sees it throughout
    expect(await get(url, t.quality)).toMatchObject({ suppressed: false, attempts: 44 });
    await t.coordinator.put("/api/settings/policy", { policy, note: "Back to the default" }).expect(200);
    expect((await get(url, t.instructor)).suppressed).toBe(false);
  });
});
