// The coordinator's quarter tracker: what has arrived per instructor, who may read it, and refused input.
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { trackerAnswerSchema } from "../../shared/schemas/tracker";
import { importFiles } from "../../server/imports/service";
import { startInsightApp, type InsightTestContext } from "../fixtures/insight/setup";

const fixture = (name: string) => path.resolve(__dirname, "../fixtures/import", name);

let t: InsightTestContext;
beforeAll(async () => {
  t = await startInsightApp();
});
afterAll(() => t.db.$client.close());

describe("quarter tracker", () => {
  it("lists each instructor's classes and attempts of the quarter", async () => {
    const answer = trackerAnswerSchema.parse((await t.coordinator.get("/api/tracker?quarter=2026-Q2").expect(200)).body);
    const byCode = Object.fromEntries(answer.instructors.map((row) => [row.code, [row.classes, row.attempts]]));
    // tests/fixtures/insight/network.ts: one class each in 2026-Q2, with 10, 10, 4 and 20 attempts
    expect(byCode).toEqual({ A1: [1, 10], B1: [1, 10], C1: [1, 4], D1: [1, 20] });
    const empty = trackerAnswerSchema.parse((await t.coordinator.get("/api/tracker?quarter=2024-Q1").expect(200)).body);
    expect(empty.instructors.every((row) => row.classes === 0 && row.attempts === 0)).toBe(true);
  });

  it("shows when an instructor's class log was imported and counts the refused rows naming them", async () => {
    const { summaries } = await importFiles(t.db, { kind: "classes", inputs: [{ path: fixture("classes-bad.csv") }], source: "cli", skipInvalid: true });
    expect(summaries[0].status).toBe("imported");
    const answer = trackerAnswerSchema.parse((await t.coordinator.get("/api/tracker?quarter=2026-Q3").expect(200)).body);
    const a1 = answer.instructors.find((row) => row.code === "A1")!;
    // every row of the file names A1: the one valid class arrives, the others wait to be fixed
    expect(a1.classes).toBe(summaries[0].inserted);
    expect(a1.rejectedRows).toBe(summaries[0].rejected);
    expect(a1.rejectedRows).toBeGreaterThan(0);
    expect(a1.lastImportAt).not.toBeNull();
    expect(answer.instructors.find((row) => row.code === "B1")).toMatchObject({ classes: 0, rejectedRows: 0, lastImportAt: null });
    expect(answer.unassignedRejectedRows).toBe(0);
  });

  it("is the coordinator's alone and refuses a quarter it cannot read", async () => {
    for (const agent of [t.quality, t.instructor, t.funder]) await agent.get("/api/tracker").expect(403);
    const res = await t.coordinator.get("/api/tracker?quarter=2026-Q5").expect(422);
    expect(res.body.error.details[0].path).toBe("quarter");
  });
});
