// GET /api/insight/standing: instructor A1's view of themselves beside the network (fixture:
// tests/fixtures/insight/network.ts), and what it must never show about other instructors. The fixture has
// four instructors, so A1 has three colleagues: the figures below are worked out with a policy that lets two
// other instructors make a group; the default of three is tested at the end.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { standingAnswerSchema, type StandingAnswer } from "../../shared/schemas/insight";
import { startInsightApp, type InsightTestContext } from "../fixtures/insight/setup";

let t: InsightTestContext;
let s: StandingAnswer;
let raw: string;
beforeAll(async () => {
  t = await startInsightApp();
  const { policy } = (await t.coordinator.get("/api/settings/policy").expect(200)).body.current;
  await t.coordinator.put("/api/settings/policy", { policy: { ...policy, suppressionMinInstructors: 2 }, note: "Two colleagues make a group" }).expect(200);
  const res = await t.instructor.get("/api/insight/standing").expect(200);
  raw = res.text;
  s = standingAnswerSchema.parse(res.body);
});
afterAll(() => t.db.$client.close());

describe("my standing (instructor A1, 2026-Q2)", () => {
  it("names me and counts my attempts", () => {
    expect(s.me).toEqual({ instructorId: t.net.instructors.a1.id, code: "A1", name: "Instructor A1" });
    expect(s.attempts).toBe(10);
  });

  it("gives my median score beside the network's and my percentile rank among instructors", () => {
    const score = s.metrics.find((m) => m.key === "score")!;
    // mine: 65 65 70 70 75 | 75 80 85 90 95 → (75 + 75) / 2 = 75; network: 83.5 (see the overview test)
    expect(score.mine).toBe(75);
    expect(score.network).toBe(83.5);
    // instructors with ≥ 5 attempts: B1 67, A1 75, D1 89.5 (C1 has 4 and is left out)
    // percentile rank of 75: (1 below + ½ × 1 equal) / 3 = 50 %
    expect(score.percentileRank).toBe(50);
    // hands-on time is 80 % in every attempt: mine = network = 80, rank (0 + ½ × 3) / 3 = 50 %
    expect(s.metrics.find((m) => m.key === "hands_on_pct")).toMatchObject({ mine: 80, network: 80, percentileRank: 50 });
    // by default ranked within each case-mix stratum: adult·live medians A1 85, B1 72, D1 89 → 50;
    // adult·hidden A1 70, B1 66, D1 90 → 50; weighted by my 5 + 5 attempts → 50
    expect(score.percentileRank).toBe(50);
    // depth on target, mine: shallow attempts 30 and 15, the rest 95 90 85 80 75 70 90 90
    // sorted 15 30 70 75 80 | 85 90 90 90 95 → (80 + 85) / 2 = 82.5
    expect(s.metrics.find((m) => m.key === "depth_ok_pct")!.mine).toBe(82.5);
    // depth ranked within strata, by hand: adult·live medians A1 85, B1 84 (6 12 84 88 90), D1 89 → rank 50;
    // adult·hidden A1 70 (15 30 70 90 90), B1 90, D1 90 → rank (½ × 1) / 3 = 16.67; my 5 + 5 attempts → 33.33
    expect(s.metrics.find((m) => m.key === "depth_ok_pct")!.percentileRank).toBeCloseTo(100 / 3, 10);
  });

  it("ranks my medians among all instructors' on request (adjust=none)", async () => {
    const crude = standingAnswerSchema.parse((await t.instructor.get("/api/insight/standing?adjust=none").expect(200)).body);
    // depth medians over the quarter: A1 82.5, B1 86, D1 89.5 → (½ × 1) / 3 = 16.67
    expect(crude.metrics.find((m) => m.key === "depth_ok_pct")!.percentileRank).toBeCloseTo(100 / 6, 10);
  });

  it("shows the spread of instructors as anonymous points with mine flagged", () => {
    // (median score, pass rate): B1 (67, 2/10), A1 (75, 6/10), D1 (89.5, 20/20); C1 (4 attempts) left out
    expect(s.spread.points).toEqual([
      { medianScore: 67, passRate: 0.2, isMe: false },
      { medianScore: 75, passRate: 0.6, isMe: true },
      { medianScore: 89.5, passRate: 1, isMe: false },
    ]);
    expect(s.spread.instructorsLeftOut).toBe(1);
    expect(s.spread.minAttempts).toBe(5);
  });

  it("places my pass rate on the network funnel, adjusted for case mix", () => {
    // network rate 28/44 = 7/11; my 5 live and 5 hidden adult attempts expect 5·0.85 + 5·0.55 = 7 passes
    // (stratum rates by hand: adult·live 17/20, adult·hidden 11/20), V = 1.875, z = (6 − 7)/√1.875
    expect(s.funnel.networkRate).toBeCloseTo(7 / 11, 12);
    expect(s.funnel.adjust).toBe("case-mix");
    expect(s.funnel.me).toMatchObject({ successes: 6, n: 10, position: "inside" });
    expect(s.funnel.me.expected).toBeCloseTo(7, 10);
    expect(s.funnel.me.z).toBeCloseTo(-0.730297, 5);
    // instructors are overdispersed (φ = 5.1275, see the instructors' funnel test): the limits are widened
    expect(s.funnel.overdispersed).toBe(true);
    expect(s.funnel.phi).toBeCloseTo(5.1275, 3);
  });

  it("places my pass rate against the network as measured on request", async () => {
    const crude = standingAnswerSchema.parse((await t.instructor.get("/api/insight/standing?adjust=none").expect(200)).body);
    // normal limits at n = 10 around θ = 7/11, widened by √φ = √5.0431 (Spiegelhalter 2005):
    // 7/11 ± 1.959964 · 2.24569 · √(0.231405 / 10) = 7/11 ± 0.66956
    const at10 = crude.funnel.curve.find((p) => p.n === 10)!;
    expect(at10.low95).toBe(0);
    expect(at10.high95).toBe(1);
    expect(crude.funnel.scale).toBeCloseTo(2.24569, 4);
    expect(crude.funnel.me).toMatchObject({ successes: 6, n: 10, position: "inside" });
    expect(crude.funnel.me.adjustedRate).toBeCloseTo(0.6, 12);
    expect(crude.funnel.me.effectiveAttempts).toBeCloseTo(10, 10);
    expect(crude.funnel.me.z).toBeCloseTo(-0.23905, 4);
    // the curve runs to the largest instructor (D1, 20 attempts)
    expect(crude.funnel.curve.at(-1)!.n).toBe(20);
  });

  it("compares my error profile with the network's", () => {
    const row = (error: string) => s.errorProfile.rows.find((r) => r.error === error)!;
    // mine: 2 shallow, 1 fast, 1 recoil of 10; network: 8, 3, 4 of 44
    expect(row("too_shallow")).toMatchObject({ mine: 0.2 });
    expect(row("too_shallow").network).toBeCloseTo(8 / 44, 12);
    expect(row("too_fast")).toMatchObject({ mine: 0.1 });
    expect(row("incomplete_recoil").network).toBeCloseTo(4 / 44, 12);
    expect(row("long_pause")).toMatchObject({ mine: 0 });
  });

  it("lists my classes of the period", () => {
    expect(s.classes).toHaveLength(1);
    expect(s.classes[0]).toMatchObject({ id: "A1-2604", date: "2026-04-15", course: "adult", learners: 10, passed: 7, attempts: 10 });
    expect(s.classes[0].passRate).toMatchObject({ successes: 6, n: 10 });
  });

  it("holds no id, code or name of any other instructor anywhere in the answer", () => {
    for (const code of ["B1", "C1", "D1"]) expect(raw).not.toContain(code);
    for (const name of ["Instructor B1", "Instructor C1", "Instructor D1"]) expect(raw).not.toContain(name);
    const others = [t.net.instructors.b1.id, t.net.instructors.c1.id, t.net.instructors.d1.id];
    const ids: number[] = [];
    JSON.parse(raw, (key, value) => {
      if (/instructor/i.test(key) && typeof value === "number") ids.push(value);
      return value;
    });
    expect(ids.filter((id) => others.includes(id))).toEqual([]);
    // no learner codes of other instructors' classes either
    expect(raw).not.toMatch(/LRN-(B1|C1|D1)/);
  });

  it("is the same picture from the other side for instructor B1", async () => {
    const other = standingAnswerSchema.parse((await t.otherInstructor.get("/api/insight/standing").expect(200)).body);
    expect(other.me.code).toBe("B1");
    expect(other.spread.points.find((p) => p.isMe)).toEqual({ medianScore: 67, passRate: 0.2, isMe: true });
    // B1 z = (2 − 7)/√1.875 = −3.65, inside the limits widened by √φ (±1.96 · 2.264 = ±4.44)
    expect(other.funnel.me.z).toBeCloseTo(-3.651484, 5);
    expect(other.funnel.me.position).toBe("inside");
    expect(JSON.stringify(other)).not.toContain("A1");
  });
});

describe("standing with filters and small groups", () => {
  it("hides the network figures when the network group is small, but shows mine", async () => {
    // 2025-Q3 holds only A1's own 29 attempts; with the infant filter the network has C1's 4 attempts only
    const res = await t.instructor.get("/api/insight/standing?profile=infant").expect(200);
    const small = standingAnswerSchema.parse(res.body);
    expect(small.attempts).toBe(0);
    expect(small.errorProfile.networkSuppressed).toBe(true);
    expect(small.metrics.find((m) => m.key === "score")).toMatchObject({ mine: null, network: null, percentileRank: null });
    expect(small.funnel).toMatchObject({ networkRate: null, curve: [] });
    expect(small.spread.points).toEqual([]);
    expect(res.text).not.toContain("C1");
  });

  it("hides the network figures when the others in it are too few, however many are mine", async () => {
    // NORTH: my 10 attempts + C1's 4 → the network minus me is C1's 4 attempts
    const res = await t.instructor.get("/api/insight/standing?site=NORTH").expect(200);
    const north = standingAnswerSchema.parse(res.body);
    expect(north.attempts).toBe(10);
    expect(north.errorProfile.networkSuppressed).toBe(true);
    expect(north.funnel.networkRate).toBeNull();
    expect(north.metrics.find((m) => m.key === "score")).toMatchObject({ mine: 75, network: null, percentileRank: null });
    expect(north.spread.points).toEqual([{ medianScore: 75, passRate: 0.6, isMe: true }]);
  });

  it("covers earlier quarters on request", async () => {
    const q3 = standingAnswerSchema.parse((await t.instructor.get("/api/insight/standing?quarter=2025-Q3").expect(200)).body);
    // 2025-Q3: A1's 29 attempts are the whole network
    expect(q3.attempts).toBe(29);
    expect(q3.funnel.me).toMatchObject({ successes: 1, n: 29 });
    expect(q3.spread.points).toEqual([{ medianScore: 70, passRate: 1 / 29, isMe: true }]);
  });

  it("refuses another instructor as a filter", async () => {
    await t.instructor.get("/api/insight/standing?instructor=B1").expect(403);
  });

  it("is for instructors only", async () => {
    await t.coordinator.get("/api/insight/standing").expect(403);
    await t.funder.get("/api/insight/standing").expect(403);
  });
});

describe("standing under the default fewest instructors (three)", () => {
  it("shows no colleague's point and no rank when fewer than three others have enough attempts", async () => {
    const { policy } = (await t.coordinator.get("/api/settings/policy").expect(200)).body.current;
    await t.coordinator.put("/api/settings/policy", { policy: { ...policy, suppressionMinInstructors: 3 }, note: "Default" }).expect(200);
    const answer = standingAnswerSchema.parse((await t.instructor.get("/api/insight/standing").expect(200)).body);
    // B1 and D1 have at least 5 attempts, C1 has 4: two points of others would each be nearly a known colleague
    expect(answer.spread.points).toEqual([{ medianScore: 75, passRate: 0.6, isMe: true }]);
    expect(answer.spread.instructorsLeftOut).toBe(3);
    expect(answer.metrics.find((m) => m.key === "score")).toMatchObject({ mine: 75, percentileRank: null });
    // the network of three colleagues is still a group: its figures are shown
    expect(answer.metrics.find((m) => m.key === "score")!.network).toBe(83.5);
    // the funnel runs to my own (case-mix effective) size only: the largest colleague's count is not given away
    expect(answer.funnel.curve.at(-1)!.n).toBe(Math.ceil(answer.funnel.me.effectiveAttempts! - 1e-9));
    expect(answer.funnel.curve.at(-1)!.n).toBeLessThan(20);
  });
});
