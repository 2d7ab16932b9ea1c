// Each instructor's judgement against the measurement, on the report fixture's 2026-Q3: the first six
// measured failures of adult attempts were passed by their instructor, the other four failed.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Db } from "../../../server/db/client";
import { calibrationByInstructor } from "../../../server/metrics/calibration";
import { makeTestDb, seedPeople } from "../../helpers/testApp";
import { insertReportFixture } from "../report/fixture";

let db: Db;
beforeAll(async () => {
  db = makeTestDb();
  insertReportFixture(db, await seedPeople(db));
});
afterAll(() => db.$client.close());

describe("calibrationByInstructor", () => {
  it("gives each instructor's table, lenient and strict shares and kappa (worked by hand)", () => {
    const [a1, b1] = calibrationByInstructor(db, "2026-Q3");
    // A1, class Q3-1: 7 measured passes passed, its 1 measured failure passed too
    expect(a1).toMatchObject({ instructor: "A1", judged: 8, both_pass: 7, instructor_pass_measured_fail: 1, instructor_fail_measured_pass: 0, both_fail: 0 });
    expect(a1.lenient_share).toBe(1);
    expect(a1.strict_share).toBe(0);
    // p0 = 7/8 = pe (the instructor passed everyone), so kappa = 0
    expect(a1.kappa).toBeCloseTo(0, 12);
    // B1, classes Q3-2, Q3-4, Q3-6: 15 passes passed; of 9 failures, 5 passed and 4 failed
    expect(b1).toMatchObject({ instructor: "B1", judged: 24, both_pass: 15, instructor_pass_measured_fail: 5, instructor_fail_measured_pass: 0, both_fail: 4 });
    expect(b1.lenient_share).toBeCloseTo(5 / 9, 12);
    // p0 = 19/24, pe = (20/24)(15/24) + (4/24)(9/24) = 336/576, kappa = (19/24 − 336/576) / (1 − 336/576) = 0.5
    expect(b1.kappa).toBeCloseTo(0.5, 12);
  });

  it("lists nobody for a quarter without judgements", () => {
    expect(calibrationByInstructor(db, "2026-Q2")).toEqual([]);
  });
});
