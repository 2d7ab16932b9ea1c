// Improvement actions: who may record, change and see them, what is refused, and the before/after
// evaluation against a hand computation on the insight fixture network (tests/fixtures/insight/network.ts).
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { actionDetailAnswerSchema, actionListAnswerSchema, actionMarksAnswerSchema } from "../../shared/schemas/actions";
import { actionMonthlyAnswerSchema } from "../../shared/schemas/runChart";
import { startInsightApp, type InsightTestContext } from "../fixtures/insight/setup";

let t: InsightTestContext;
beforeAll(async () => {
  t = await startInsightApp();
});
afterAll(() => t.db.$client.close());

const base = { aim: "passRate", target: 70, siteId: null, instructorId: null, profile: null, owner: "Quality lead", status: "under_way" };

async function record(body: object) {
  const res = await t.quality.post("/api/actions", { ...base, ...body });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.action as { id: number };
}

describe("recording actions", () => {
  it("lets a quality lead and a coordinator record, change and annotate; others are refused", async () => {
    const action = await record({ title: "Depth refresher at North", siteId: t.net.sites.north.id, startDate: "2026-01-10" });
    await t.coordinator.patch(`/api/actions/${action.id}`, { status: "done" }).expect(200);
    const note = await t.quality.post(`/api/actions/${action.id}/notes`, { date: "2026-02-01", text: "Two sessions held" }).expect(201);
    expect(note.body.note).toMatchObject({ date: "2026-02-01", text: "Two sessions held" });

    for (const agent of [t.instructor, t.funder]) {
      await agent.post("/api/actions", { ...base, title: "x", startDate: "2026-01-01" }).expect(403);
      await agent.patch(`/api/actions/${action.id}`, { status: "stopped" }).expect(403);
      await agent.post(`/api/actions/${action.id}/notes`, { date: "2026-02-01", text: "x" }).expect(403);
    }
    await t.funder.get("/api/actions").expect(403);

    const detail = actionDetailAnswerSchema.parse((await t.coordinator.get(`/api/actions/${action.id}`).expect(200)).body);
    expect(detail.action).toMatchObject({ status: "done", siteCode: "NORTH" });
    expect(detail.notes.map((n) => n.text)).toEqual(["Two sessions held"]);
    expect(detail.mayManage).toBe(true);
  });

  it("answers 422 naming each invalid field", async () => {
    const res = await t.quality
      .post("/api/actions", {
        title: "",
        aim: "louder",
        target: 140,
        siteId: null,
        instructorId: null,
        profile: "elderly",
        startDate: "2026-02-30",
        owner: "",
        status: "maybe",
      })
      .expect(422);
    const paths = res.body.error.details.map((d: { path: string }) => d.path);
    expect(paths).toEqual(expect.arrayContaining(["title", "aim", "target", "profile", "startDate", "owner", "status"]));
  });

  it("refuses a scope naming both a site and an instructor, or one that does not exist", async () => {
    const both = await t.quality.post("/api/actions", {
      ...base,
      title: "x",
      startDate: "2026-01-01",
      siteId: t.net.sites.north.id,
      instructorId: t.net.instructors.a1.id,
    });
    expect(both.status).toBe(422);
    expect(both.body.error.details[0].path).toBe("instructorId");
    const missing = await t.quality.post("/api/actions", { ...base, title: "x", startDate: "2026-01-01", siteId: 9999 });
    expect(missing.status).toBe(422);
    expect(missing.body.error.details[0].path).toBe("siteId");
  });

  it("shows an instructor the network's, their site's and their own actions, read-only", async () => {
    const network = await record({ title: "Network rate drill", startDate: "2026-03-01" });
    const south = await record({ title: "South depth clinic", siteId: t.net.sites.south.id, startDate: "2026-03-02" });
    const a1 = await record({ title: "A1 coaching", instructorId: t.net.instructors.a1.id, startDate: "2026-03-03" });
    const list = actionListAnswerSchema.parse((await t.instructor.get("/api/actions").expect(200)).body);
    const ids = list.actions.map((a) => a.id);
    expect(ids).toEqual(expect.arrayContaining([network.id, a1.id]));
    expect(ids).not.toContain(south.id);
    expect(list.mayManage).toBe(false);
    await t.instructor.get(`/api/actions/${south.id}`).expect(404);
    await t.otherInstructor.get(`/api/actions/${a1.id}`).expect(404);
    await t.otherInstructor.get(`/api/actions/${south.id}`).expect(200);
  });
});

describe("evaluation", () => {
  it("compares A1's pass rate before and after an action starting on a quarter's first day", async () => {
    // Before: 2024-Q1…2025-Q4 holds A1's 2025-Q3 class, 1 of 29 passed. After: 2026-Q1 on; A1's 2026-Q2 class,
    // 6 of 10 passed. Difference 0.6 − 1/29 = 0.56552 with Newcombe's hybrid score interval (Newcombe, Stat Med
    // 1998;17:873–890, method 10; Wilson limits worked out by hand with z = 1.959964): 0.24708 to 0.79907.
    const action = await record({ title: "A1 depth coaching", instructorId: t.net.instructors.a1.id, startDate: "2026-01-01", target: 60 });
    const { evaluation } = actionDetailAnswerSchema.parse((await t.quality.get(`/api/actions/${action.id}`).expect(200)).body);
    expect(evaluation).not.toBeNull();
    expect(evaluation!.startQuarter).toBe("2026-Q1");
    expect(evaluation!.before).toMatchObject({ x: 1, n: 29 });
    expect(evaluation!.after).toMatchObject({ x: 6, n: 10 });
    expect(evaluation!.difference!.difference).toBeCloseTo(0.565517, 5);
    expect(evaluation!.difference!.low).toBeCloseTo(0.247083, 5);
    expect(evaluation!.difference!.high).toBeCloseTo(0.799066, 5);
    expect(evaluation!.verdict).toBe("up");
    expect(evaluation!.targetMet).toBe(true);
    expect(evaluation!.points.map((p) => [p.period, p.phase])).toEqual([
      ["2025-Q3", "before"],
      ["2026-Q2", "after"],
    ]);
  });

  it("leaves the start's own quarter out of both sides when the action starts within it", async () => {
    // SOUTH, too shallow: 2025-Q4 B1 20 of 20 shallow (before); 2026-Q1 D1 182 of 263 (transition);
    // 2026-Q2 B1 4 + D1 0 of 30 (after). 4/30 − 20/20 = −0.86667, Newcombe interval −0.94690 to −0.63713.
    const action = await record({ title: "South depth clinic", aim: "too_shallow", target: 20, siteId: t.net.sites.south.id, startDate: "2026-02-15" });
    const { evaluation } = actionDetailAnswerSchema.parse((await t.coordinator.get(`/api/actions/${action.id}`).expect(200)).body);
    expect(evaluation!.points.map((p) => [p.period, p.phase, p.x, p.n])).toEqual([
      ["2025-Q4", "before", 20, 20],
      ["2026-Q1", "transition", 182, 263],
      ["2026-Q2", "after", 4, 30],
    ]);
    expect(evaluation!.difference!.difference).toBeCloseTo(-0.866667, 5);
    expect(evaluation!.difference!.low).toBeCloseTo(-0.946903, 5);
    expect(evaluation!.difference!.high).toBeCloseTo(-0.63713, 5);
    expect(evaluation!.verdict).toBe("down");
    expect(evaluation!.targetMet).toBe(true);
    // Baseline median 1.0; the first point lies on it, so two useful points, both below: run 2, no crossing.
    // Limits for 2 useful points (Anhøj & Olesen 2014): longest run round(log2(2) + 3) = 4; P(X ≤ 0) = 0.5 for
    // Binomial(1, 0.5), so the fewest crossings allowed is 0 — no signal.
    expect(evaluation!.runChart).toEqual({ baselineMedian: 1, useful: 2, longestRun: 2, longestRunLimit: 4, crossings: 0, crossingsLimit: 0, signal: false });
  });

  it("gives an instructor their own action's evaluation", async () => {
    const action = await record({ title: "A1 rate coaching", instructorId: t.net.instructors.a1.id, startDate: "2026-01-01" });
    const { evaluation, mayManage } = actionDetailAnswerSchema.parse((await t.instructor.get(`/api/actions/${action.id}`).expect(200)).body);
    expect(evaluation!.after).toMatchObject({ x: 6, n: 10 });
    expect(mayManage).toBe(false);
  });
});

describe("evaluation seen by an instructor", () => {
  it("shows a network action's figures but hides a site's whose other attempts form a small group", async () => {
    const network = await record({ title: "Network refresher", startDate: "2026-01-01" });
    const { evaluation } = actionDetailAnswerSchema.parse((await t.instructor.get(`/api/actions/${network.id}`).expect(200)).body);
    // every quarter's attempts of others are at least 20, above the smallest group shown (5, the default policy)
    // after = 2026-Q1 (81 of 263) + 2026-Q2 (28 of 44)
    expect(evaluation!.after).toMatchObject({ x: 109, n: 307 });
    // NORTH infant attempts: only C1's 4 in 2026-Q2, fewer than 5 others of A1, so suppressed for A1
    const infant = await record({ title: "North infant drill", siteId: t.net.sites.north.id, profile: "infant", startDate: "2026-01-01" });
    const hidden = actionDetailAnswerSchema.parse((await t.instructor.get(`/api/actions/${infant.id}`).expect(200)).body);
    expect(hidden.evaluation).toBeNull();
    const full = actionDetailAnswerSchema.parse((await t.quality.get(`/api/actions/${infant.id}`).expect(200)).body);
    expect(full.evaluation!.after).toMatchObject({ x: 0, n: 4 });
  });
});

describe("monthly run chart", () => {
  it("splits the aim's months at the start, each side with its own median, and judges the months after around the one before", async () => {
    // SOUTH, too shallow, by class month: 2025-11 B1 20 of 20 (before); 2026-02 D1 182 of 263 (the start's
    // month, started on the 15th: neither side); 2026-05 B1 4 of 10 and 2026-06 D1 0 of 20 (after).
    const action = await record({
      title: "South depth clinic by month",
      aim: "too_shallow",
      target: 20,
      siteId: t.net.sites.south.id,
      startDate: "2026-02-15",
    });
    const { chart } = actionMonthlyAnswerSchema.parse((await t.quality.get(`/api/actions/${action.id}/monthly`).expect(200)).body);
    expect(chart!.points.map((p) => [p.period, p.phase, p.x, p.n])).toEqual([
      ["2025-11", "before", 20, 20],
      ["2026-02", "transition", 182, 263],
      ["2026-05", "after", 4, 10],
      ["2026-06", "after", 0, 20],
    ]);
    expect(chart!.phases.map((p) => [p.phase, p.from, p.to, p.median])).toEqual([
      ["before", "2025-11", "2025-11", 1],
      ["after", "2026-05", "2026-06", 0.2],
    ]);
    // both months after lie below the median before (1.0): 2 useful points, one run of 2, no crossing; limits
    // for 2 useful points (Anhøj & Olesen 2014): run over round(log2(2) + 3) = 4, fewer than 0 crossings — no signal
    expect(chart).toMatchObject({ median: 1, useful: 2, longestRun: 2, longestRunLimit: 4, crossings: 0, crossingsLimit: 0, signal: false });
  });

  it("shows an instructor the months of their own action only", async () => {
    const own = await record({ title: "A1 monthly", instructorId: t.net.instructors.a1.id, startDate: "2026-01-01" });
    const network = await record({ title: "Network monthly", startDate: "2026-01-01" });
    const mine = actionMonthlyAnswerSchema.parse((await t.instructor.get(`/api/actions/${own.id}/monthly`).expect(200)).body);
    // A1's classes: 2025-08 (1 of 29 passed), 2026-04 (6 of 10)
    expect(mine.chart!.points.map((p) => [p.period, p.phase, p.x, p.n])).toEqual([
      ["2025-08", "before", 1, 29],
      ["2026-04", "after", 6, 10],
    ]);
    const others = actionMonthlyAnswerSchema.parse((await t.instructor.get(`/api/actions/${network.id}/monthly`).expect(200)).body);
    expect(others.chart).toBeNull();
    await t.funder.get(`/api/actions/${network.id}/monthly`).expect(403);
  });
});

describe("chart marks", () => {
  it("marks actions whose scope touches the chart's filters and whose start lies in its quarters", async () => {
    const north = await record({ title: "North infant refresher", siteId: t.net.sites.north.id, profile: "infant", startDate: "2026-04-20" });
    const marksFor = async (query: string) =>
      actionMarksAnswerSchema.parse((await t.coordinator.get(`/api/actions/marks?${query}`).expect(200)).body).marks.map((m) => m.id);
    expect(await marksFor("from=2026-Q1&to=2026-Q2")).toContain(north.id);
    expect(await marksFor("from=2026-Q1&to=2026-Q2&site=NORTH&profile=infant")).toContain(north.id);
    expect(await marksFor("from=2026-Q1&to=2026-Q2&instructor=A1")).toContain(north.id);
    expect(await marksFor("from=2026-Q1&to=2026-Q2&site=SOUTH")).not.toContain(north.id);
    expect(await marksFor("from=2026-Q1&to=2026-Q2&profile=adult")).not.toContain(north.id);
    expect(await marksFor("quarter=2026-Q1")).not.toContain(north.id);
  });
});
