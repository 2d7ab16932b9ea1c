// GET /api/equipment against the fixture (tests/fixtures/insight/network.ts): the fleet, consumables per
// 100 learners and what needs attention under the equipment thresholds (project defaults).
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { equipmentAnswerSchema, type EquipmentAnswer } from "../../shared/schemas/equipment";
import { DEFAULT_POLICY } from "../../shared/scoring/policy";
import { equipmentReport } from "../../server/equipment/service";
import { resolveFilters } from "../../server/insight/filters";
import { viewerOf } from "../../server/insight/viewer";
import { findActiveUser } from "../../server/users/service";
import { startInsightApp, type InsightTestContext } from "../fixtures/insight/setup";

let t: InsightTestContext;
let e: EquipmentAnswer;
beforeAll(async () => {
  t = await startInsightApp();
  e = equipmentAnswerSchema.parse((await t.coordinator.get("/api/equipment").expect(200)).body);
});
afterAll(() => t.db.$client.close());

const today = () => new Date().toISOString().slice(0, 10);

describe("the fleet (coordinator, 2026-Q2)", () => {
  it("lists every manikin with its use per quarter, compressions since service and open faults", () => {
    expect(e.fleet.map((m) => m.assetId)).toEqual(["MK-N1", "MK-N2", "MK-S1"]);
    const [n1, n2, s1] = e.fleet;
    // MK-N1: A1's 29 attempts in 2025-Q3 and 10 in 2026-Q2, 100 compressions each; serviced 30 days ago,
    // after all of them
    expect(n1.usage.find((u) => u.quarter === "2025-Q3")).toEqual({ quarter: "2025-Q3", attempts: 29, compressions: 2900 });
    expect(n1.usage.find((u) => u.quarter === "2026-Q2")).toEqual({ quarter: "2026-Q2", attempts: 10, compressions: 1000 });
    expect(n1).toMatchObject({ compressionsSinceService: 0, openFaults: 0, site: { code: "NORTH" } });
    // MK-N2: never serviced, C1's 4 attempts
    expect(n2).toMatchObject({ compressionsSinceService: 400, lastServiceDate: null, patientType: "infant" });
    // MK-S1: serviced 2025-10-01; since then B1-2511 20 + D1-2601 263 + B1-2605 10 + D1-2606 20 = 313 attempts
    expect(s1).toMatchObject({ lastServiceDate: "2025-10-01", compressionsSinceService: 31_300, openFaults: 1 });
  });

  it("labels the thresholds as project defaults", () => {
    expect(e.thresholds.serviceEveryCompressions).toEqual({ value: 250_000, projectDefault: true, defaultValue: 250_000 });
    expect(e.thresholds.note).toMatch(/project defaults/);
    expect(e.asOf).toBe(today());
  });

  it("gives consumables per 100 learners by site and quarter from the class logs, with the equipment log's count beside them", () => {
    const north = e.consumables.find((c) => c.site.code === "NORTH" && c.quarter === "2026-Q2")!;
    const south = e.consumables.find((c) => c.site.code === "SOUTH" && c.quarter === "2026-Q2")!;
    // NORTH: learners 10 + 4 = 14; lungs 1 logged (and 2 in an MK-N1 event, the same work recorded per
    // manikin, not added) → 100 / 14 = 7.14 per 100
    expect(north).toMatchObject({ learners: 14, lungs: { fromClassLogs: 1, fromEvents: 2, total: 1 }, mouthpieces: { total: 14, per100Learners: 100 } });
    expect(north.lungs.per100Learners).toBeCloseTo(100 / 14, 10);
    // SOUTH: learners 10 + 20 = 30; batteries 1 logged (1 event beside it) → 3.33; mouthpieces 6 + 20 = 26 → 86.67
    expect(south).toMatchObject({ learners: 30, batteries: { fromClassLogs: 1, fromEvents: 1, total: 1 } });
    expect(south.batteries.per100Learners).toBeCloseTo(100 / 30, 10);
    expect(south.mouthpieces.per100Learners).toBeCloseTo(2600 / 30, 10);
    expect(e.consumables).toHaveLength(2);
  });

  it("lists what needs attention with the reason in words", () => {
    expect(e.attention.map((a) => [a.kind, a.manikin?.assetId ?? a.classId])).toEqual([
      ["service_by_days", "MK-N2"], // in use since 2020-01-01, never serviced
      ["service_by_days", "MK-S1"], // last serviced 2025-10-01, more than 365 days ago
      ["open_fault", "MK-S1"],
      ["mouthpiece_cleaning", "B1-2605"], // 6 cleans for 10 learners, 1 per learner expected
    ]);
    expect(e.attention[0].reason).toMatch(/no service recorded/);
    expect(e.attention[2].reason).toMatch(/1 reported fault is not yet resolved/);
    expect(e.attention[3].reason).toMatch(/6 mouthpiece cleans logged for 10 learners; at least 10 expected/);
  });

  it("flags service by compressions once a manikin passes the threshold", () => {
    const coordinator = findActiveUser(t.db, t.net.users.coordinator.id)!;
    const viewer = viewerOf(t.db, coordinator);
    const report = equipmentReport(
      t.db,
      { ...DEFAULT_POLICY.equipment, serviceEveryCompressions: 30_000 },
      { filters: resolveFilters(t.db, {}, viewer), onlyInstructorId: null, asOf: today() },
    );
    const byCompressions = report.attention.filter((a) => a.kind === "service_by_compressions");
    // MK-S1 31 300 > 30 000; MK-N2 400 and MK-N1 0 are below
    expect(byCompressions.map((a) => a.manikin?.assetId)).toEqual(["MK-S1"]);
    expect(byCompressions[0].reason).toMatch(/31,300 compressions since the last service on 1 October 2025; service is due every 30,000/);
    expect(report.thresholds.serviceEveryCompressions.projectDefault).toBe(false);
  });

  it("narrows by manikin and by patient type", async () => {
    const one = equipmentAnswerSchema.parse((await t.coordinator.get("/api/equipment?manikin=MK-S1").expect(200)).body);
    expect(one.fleet.map((m) => m.assetId)).toEqual(["MK-S1"]);
    const infant = equipmentAnswerSchema.parse((await t.coordinator.get("/api/equipment?profile=infant").expect(200)).body);
    expect(infant.fleet.map((m) => m.assetId)).toEqual(["MK-N2"]);
    const south = equipmentAnswerSchema.parse((await t.quality.get("/api/equipment?site=SOUTH").expect(200)).body);
    expect(south.fleet.map((m) => m.assetId)).toEqual(["MK-S1"]);
    expect(south.consumables.map((c) => c.site.code)).toEqual(["SOUTH"]);
  });
});

describe("an instructor's view", () => {
  it("holds their own site only, and only their own classes among the attention items", async () => {
    const own = equipmentAnswerSchema.parse((await t.instructor.get("/api/equipment").expect(200)).body);
    expect(own.fleet.map((m) => m.assetId)).toEqual(["MK-N1", "MK-N2"]);
    expect(own.consumables.map((c) => c.site.code)).toEqual(["NORTH"]);
    expect(own.attention.map((a) => [a.kind, a.manikin?.assetId])).toEqual([["service_by_days", "MK-N2"]]);
  });

  it("refuses another site", async () => {
    await t.instructor.get("/api/equipment?site=SOUTH").expect(403);
    await t.instructor.get("/api/equipment?site=NORTH").expect(200);
  });

  it("shows B1 the mouthpiece check of their own class", async () => {
    const b1 = equipmentAnswerSchema.parse((await t.otherInstructor.get("/api/equipment").expect(200)).body);
    expect(b1.attention.filter((a) => a.kind === "mouthpiece_cleaning").map((a) => a.classId)).toEqual(["B1-2605"]);
  });

  it("is not for funders", async () => {
    await t.funder.get("/api/equipment").expect(403);
  });
});
