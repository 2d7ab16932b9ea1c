// Retention on the report fixture (every attempt by its own learner), with two learners made to return in
// 2026-Q3: one first seen on 2025-08-10 (back after 332 days = 10.9 months), one on 2026-05-10 (back after
// 136 days = 4.5 months). Months are days ÷ 30.4375.
import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Db } from "../../../server/db/client";
import { attempts } from "../../../server/db/schema";
import { retention, retentionBin } from "../../../server/metrics/retention";
import { makeTestDb, seedPeople } from "../../helpers/testApp";
import { insertReportFixture } from "../report/fixture";

let db: Db;
beforeAll(async () => {
  db = makeTestDb();
  insertReportFixture(db, await seedPeople(db));
  const learnerOf = (id: string) => db.select({ learner: attempts.learner }).from(attempts).where(eq(attempts.id, id)).get()!.learner;
  // RF-A1 (class Q3-1, 2026-07-08, passed) is the learner of RF-A61 (class LY-1, 2025-08-10)
  db.update(attempts)
    .set({ learner: learnerOf("RF-A61") })
    .where(eq(attempts.id, "RF-A1"))
    .run();
  // RF-A30 (class Q3-6, 2026-09-23, failed) is the learner of RF-A41 (class Q2-1, 2026-05-10)
  db.update(attempts)
    .set({ learner: learnerOf("RF-A41") })
    .where(eq(attempts.id, "RF-A30"))
    .run();
});
afterAll(() => db.$client.close());

describe("retentionBin", () => {
  it("bins months as [0, 6), [6, 12), [12, 18), [18, 24), 24 or more", () => {
    expect([0, 5.99, 6, 11.9, 12, 18, 23.99, 24, 60].map(retentionBin)).toEqual(["0-6", "0-6", "6-12", "6-12", "12-18", "18-24", "18-24", "24+", "24+"]);
  });
});

describe("retention", () => {
  it("places each return by months since the learner's previous class and judges its first attempt", () => {
    const answer = retention(db, "2026-Q3", "2026-Q3");
    // 40 learner–class pairs in 2026-Q3, 26 first attempts passed; two of them are returns
    expect(answer.first_time).toMatchObject({ learners: 38, passed: 25 });
    const bins = Object.fromEntries(answer.returning.map((bin) => [bin.months, [bin.learners, bin.passed]]));
    expect(bins).toEqual({ "0-6": [1, 0], "6-12": [1, 1], "12-18": [0, 0], "18-24": [0, 0], "24+": [0, 0] });
    // Wilson 95 % for 25/38 (computed as in shared/stats/wilson, checked there against Newcombe 1998)
    expect(answer.first_time.rate).toBeCloseTo(25 / 38, 12);
    expect(answer.first_time.ci95).not.toBeNull();
    expect(answer.returning.find((bin) => bin.months === "12-18")!.rate).toBeNull();
  });

  it("counts a learner's first class as first time, whenever they come back later", () => {
    const answer = retention(db, "2025-Q3", "2026-Q2");
    // LY-1 (10 pairs) and Q2-1 (20 pairs) are everyone's first class
    expect(answer.first_time.learners).toBe(30);
    expect(answer.returning.every((bin) => bin.learners === 0)).toBe(true);
  });

  it("by patient type, judges the first attempt on that patient type and keeps the gap since any class", () => {
    // 2026-Q3 adult: 32 pairs with 22 first attempts passed, the two returns among them (RF-A1 passed, RF-A30 failed)
    const adult = retention(db, "2026-Q3", "2026-Q3", "adult");
    expect(adult.first_time).toMatchObject({ learners: 30, passed: 21 });
    expect(adult.returning.filter((bin) => bin.learners > 0).map((bin) => [bin.months, bin.learners, bin.passed])).toEqual([
      ["0-6", 1, 0],
      ["6-12", 1, 1],
    ]);
    // child: class Q3-3's 6 learners, 3 passed, nobody returning
    const child = retention(db, "2026-Q3", "2026-Q3", "child");
    expect(child.first_time).toMatchObject({ learners: 6, passed: 3 });
    expect(child.returning.every((bin) => bin.learners === 0)).toBe(true);
  });
});
