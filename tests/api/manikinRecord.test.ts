// GET /api/equipment/manikins/:assetId against the fixture (tests/fixtures/insight/network.ts): one manikin's
// service state, use, log and depth comparison, the same figures as its fleet row, and an instructor kept to
// their own site's manikins. The drift thresholds come from the network's settings.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { driftAnswerSchema, equipmentAnswerSchema, manikinRecordSchema } from "../../shared/schemas/equipment";
import { DEFAULT_POLICY, type NetworkPolicy } from "../../shared/scoring/policy";
import { startInsightApp, type InsightTestContext } from "../fixtures/insight/setup";

let t: InsightTestContext;
beforeAll(async () => {
  t = await startInsightApp();
});
afterAll(() => t.db.$client.close());

describe("a manikin's record (coordinator)", () => {
  it("holds the same service state and use as the manikin's row in the fleet", async () => {
    const fleet = equipmentAnswerSchema.parse((await t.coordinator.get("/api/equipment?from=2025-Q3&to=2026-Q2").expect(200)).body).fleet;
    const record = manikinRecordSchema.parse((await t.coordinator.get("/api/equipment/manikins/MK-S1?from=2025-Q3&to=2026-Q2").expect(200)).body);
    expect(record.manikin).toEqual(fleet.find((m) => m.assetId === "MK-S1"));
    // serviced 2025-10-01; B1-2511 20 + D1-2601 263 + B1-2605 10 + D1-2606 20 attempts of 100 compressions since
    expect(record.manikin).toMatchObject({ lastServiceDate: "2025-10-01", compressionsSinceService: 31_300, openFaults: 1 });
    expect(record.attention.map((a) => a.kind)).toContain("open_fault");
    expect(record.attention.every((a) => a.manikin?.assetId === "MK-S1")).toBe(true);
  });

  it("lists the equipment log newest first with notes and whether a fault was resolved", async () => {
    const record = manikinRecordSchema.parse((await t.coordinator.get("/api/equipment/manikins/MK-S1").expect(200)).body);
    expect(record.logTotal).toBe(4);
    expect(record.log.map((line) => [line.date, line.event, line.resolved])).toEqual([
      ["2026-06-02", "fault", false],
      ["2026-06-01", "battery_replaced", false],
      ["2026-03-02", "fault", true],
      ["2025-10-01", "serviced", false],
    ]);
    expect(record.log[0].note).toBe("Depth sensor reads zero");
  });

  it("has no depth comparison for a manikin that never shared a class with a peer", async () => {
    const record = manikinRecordSchema.parse((await t.coordinator.get("/api/equipment/manikins/MK-N1").expect(200)).body);
    expect(record.drift).toBeNull();
    expect(record.rule).toEqual({ minClasses: 5, minOffsetMm: 3 });
  });

  it("answers 404 for an unknown asset id", async () => {
    const res = await t.coordinator.get("/api/equipment/manikins/NO-SUCH").expect(404);
    expect(res.body.error.message).toMatch(/NO-SUCH/);
  });
});

describe("a manikin's record (instructor)", () => {
  it("opens a manikin of their own site", async () => {
    const record = manikinRecordSchema.parse((await t.instructor.get("/api/equipment/manikins/MK-N1").expect(200)).body);
    expect(record.manikin.site?.code).toBe("NORTH");
  });

  it("answers another site's manikin as missing", async () => {
    await t.instructor.get("/api/equipment/manikins/MK-S1").expect(404);
  });
});

describe("drift thresholds in the settings", () => {
  it("flags by the network's shared-class count and offset, not fixed numbers", async () => {
    const before = driftAnswerSchema.parse((await t.quality.get("/api/equipment/drift").expect(200)).body);
    expect(before.rule).toEqual({ minClasses: DEFAULT_POLICY.equipment.driftMinClasses, minOffsetMm: DEFAULT_POLICY.equipment.driftMinOffsetMm });
    const policy = structuredClone(DEFAULT_POLICY) as NetworkPolicy;
    policy.equipment.driftMinClasses = 8;
    policy.equipment.driftMinOffsetMm = 4.5;
    await t.coordinator.put("/api/settings/policy", { policy, note: "Judge drift later and from a larger offset" }).expect(200);
    const after = driftAnswerSchema.parse((await t.quality.get("/api/equipment/drift").expect(200)).body);
    expect(after.rule).toEqual({ minClasses: 8, minOffsetMm: 4.5 });
    const record = manikinRecordSchema.parse((await t.quality.get("/api/equipment/manikins/MK-N1").expect(200)).body);
    expect(record.rule).toEqual({ minClasses: 8, minOffsetMm: 4.5 });
  });

  it("refuses a count of shared classes that is not a whole number above 0, naming the field", async () => {
    const policy = structuredClone(DEFAULT_POLICY) as NetworkPolicy;
    policy.equipment.driftMinClasses = 0;
    const res = await t.coordinator.put("/api/settings/policy", { policy, note: "broken" }).expect(422);
    expect(res.body.error.details.map((d: { path: string }) => d.path)).toContain("policy.equipment.driftMinClasses");
  });
});
