// Retention, calibration and manikin drift over HTTP on the demo network, as each role: the quality lead
// sees every instructor's calibration, an instructor only their own (others anonymous), and the drift
// comparison of their own site's manikins without others' class ids.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { driftAnswerSchema } from "../../shared/schemas/equipment";
import { calibrationAnswerSchema, retentionAnswerSchema } from "../../shared/schemas/learners";
import type { Db } from "../../server/db/client";
import { buildDirectory } from "../../server/demo/directory";
import { DEMO_SCENARIO } from "../../server/demo/scenario";
import { seedDemo } from "../../server/seed/seedDemo";
import { makeTestApp, makeTestDb, signIn, type Agent } from "../helpers/testApp";

let db: Db;
const agents = {} as Record<"coordinator" | "quality_lead" | "instructor" | "funder", Agent>;

beforeAll(async () => {
  db = makeTestDb();
  await seedDemo(db, { today: "2026-12-01" });
  const app = makeTestApp(db);
  for (const account of buildDirectory(DEMO_SCENARIO).accounts) {
    agents[account.role as keyof typeof agents] = await signIn(app, account.email, account.password);
  }
}, 180_000);
afterAll(() => db.$client.close());

describe("GET /api/learners/retention", () => {
  it("answers the quality lead and the coordinator with first-timers and the bins of returns", async () => {
    for (const role of ["quality_lead", "coordinator"] as const) {
      const res = await agents[role].get("/api/learners/retention?from=2025-Q1&to=2026-Q4");
      expect(res.status).toBe(200);
      const answer = retentionAnswerSchema.parse(res.body);
      expect(answer.period).toMatchObject({ from: "2025-Q1", to: "2026-Q4" });
      expect(answer.returning.map((b) => b.months)).toEqual(["0-6", "6-12", "12-18", "18-24", "24+"]);
      expect(answer.returning.find((b) => b.months === "6-12")!.learners).toBeGreaterThan(0);
      expect(answer.first_time.learners).toBeGreaterThan(0);
    }
  });

  it("narrows to a patient type on request", async () => {
    const all = retentionAnswerSchema.parse((await agents.quality_lead.get("/api/learners/retention?from=2025-Q1&to=2026-Q4")).body);
    const infant = retentionAnswerSchema.parse((await agents.quality_lead.get("/api/learners/retention?from=2025-Q1&to=2026-Q4&profile=infant")).body);
    expect(infant.profile).toBe("infant");
    expect(infant.first_time.learners).toBeGreaterThan(0);
    expect(infant.first_time.learners).toBeLessThan(all.first_time.learners);
  });

  it("is refused to instructors and funders", async () => {
    expect((await agents.instructor.get("/api/learners/retention")).status).toBe(403);
    expect((await agents.funder.get("/api/learners/retention")).status).toBe(403);
  });
});

describe("GET /api/learners/calibration", () => {
  it("gives the quality lead every instructor, with the lenient instructor ranked first", async () => {
    const res = await agents.quality_lead.get("/api/learners/calibration?from=2026-Q1&to=2026-Q4");
    expect(res.status).toBe(200);
    const answer = calibrationAnswerSchema.parse(res.body);
    expect(answer.rows).toHaveLength(12);
    expect(answer.others).toEqual([]);
    const lenient = answer.rows.find((r) => r.instructor.code === DEMO_SCENARIO.lenientInstructor.code)!;
    expect(lenient.lenient_rank).toBe(1);
    expect(lenient.lenient_ci95![0]).toBeGreaterThan(0.8);
    for (const row of answer.rows) {
      expect(row.judged).toBe(row.both_pass + row.instructor_pass_measured_fail + row.instructor_fail_measured_pass + row.both_fail);
      if (row.kappa !== null) expect(row.kappa_ci95![0]).toBeLessThanOrEqual(row.kappa);
    }
  });

  it("gives an instructor only their own row; everyone else only as anonymous shares", async () => {
    const res = await agents.instructor.get("/api/learners/calibration?from=2026-Q1&to=2026-Q4");
    expect(res.status).toBe(200);
    const answer = calibrationAnswerSchema.parse(res.body);
    expect(answer.rows.map((r) => r.instructor.code)).toEqual(["IN03"]);
    expect(answer.others.length + answer.othersHidden).toBe(11);
    expect(JSON.stringify(answer.others)).not.toMatch(/IN\d\d|"instructor"/);
    const quality = calibrationAnswerSchema.parse((await agents.quality_lead.get("/api/learners/calibration?from=2026-Q1&to=2026-Q4")).body);
    expect(answer.rows[0]).toEqual(quality.rows.find((r) => r.instructor.code === "IN03"));
  });

  it("refuses an instructor who asks for another instructor, and a funder", async () => {
    expect((await agents.instructor.get("/api/learners/calibration?instructor=IN11")).status).toBe(403);
    expect((await agents.funder.get("/api/learners/calibration")).status).toBe(403);
  });
});

describe("GET /api/equipment/drift", () => {
  it("flags the drifting manikin for the coordinator, with the class behind each difference", async () => {
    const res = await agents.coordinator.get("/api/equipment/drift?from=2026-Q1&to=2026-Q4");
    expect(res.status).toBe(200);
    const answer = driftAnswerSchema.parse(res.body);
    expect(answer.rule).toEqual({ minClasses: 5, minOffsetMm: 3 });
    const flagged = answer.manikins.filter((m) => m.flag === "check");
    expect(flagged.map((m) => m.manikin)).toEqual([DEMO_SCENARIO.driftingSensor.manikin]);
    expect(flagged[0].differences).toHaveLength(flagged[0].classes);
    expect(flagged[0].differences.every((d) => d.classId !== null)).toBe(true);
  });

  it("narrows the rows to one manikin or patient type, keeping the manikin's comparison with all its peers", async () => {
    const all = driftAnswerSchema.parse((await agents.coordinator.get("/api/equipment/drift?from=2026-Q1&to=2026-Q4")).body);
    const drifting = DEMO_SCENARIO.driftingSensor.manikin;
    const one = driftAnswerSchema.parse((await agents.coordinator.get(`/api/equipment/drift?from=2026-Q1&to=2026-Q4&manikin=${drifting}`)).body);
    expect(one.manikins).toEqual(all.manikins.filter((m) => m.manikin === drifting));
    const infants = driftAnswerSchema.parse((await agents.coordinator.get("/api/equipment/drift?from=2026-Q1&to=2026-Q4&profile=infant")).body);
    expect(infants.manikins.length).toBeGreaterThan(0);
    expect(infants.manikins.every((m) => m.profile === "infant")).toBe(true);
  });

  it("gives an instructor their own site's manikins without other classes' ids, and refuses another site", async () => {
    const res = await agents.instructor.get("/api/equipment/drift?from=2026-Q1&to=2026-Q4");
    expect(res.status).toBe(200);
    const answer = driftAnswerSchema.parse(res.body);
    expect(answer.manikins.length).toBeGreaterThan(0);
    expect(answer.manikins.every((m) => m.site === "WRM")).toBe(true);
    expect(answer.manikins.flatMap((m) => m.differences).every((d) => d.classId === null)).toBe(true);
    expect((await agents.instructor.get("/api/equipment/drift?site=LTQ")).status).toBe(403);
    expect((await agents.funder.get("/api/equipment/drift")).status).toBe(403);
  });
});
