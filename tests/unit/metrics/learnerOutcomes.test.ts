// Outcomes per learner: the report fixture's 2026-Q3 (40 attempts, 26 passed, each by its own learner), with
// one learner made to return: their failed attempt moved before their passed one.
import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Db } from "../../../server/db/client";
import { attempts } from "../../../server/db/schema";
import { learnerOutcomes } from "../../../server/metrics/learnerOutcomes";
import { networkScope } from "../../../server/metrics/summaries";
import { makeTestDb, seedPeople } from "../../helpers/testApp";
import { insertReportFixture } from "../report/fixture";

let db: Db;
beforeAll(async () => {
  db = makeTestDb();
  insertReportFixture(db, await seedPeople(db));
});
afterAll(() => db.$client.close());

const q3 = () => learnerOutcomes(db, networkScope("2026-Q3", "2026-Q3"));

describe("learnerOutcomes", () => {
  it("counts each learner once: with one attempt each, first attempt and at least once agree", () => {
    expect(q3()).toEqual({ learners: 40, firstPassed: 26, everPassed: 26 });
  });

  it("judges a returning learner by their earliest attempt, and by any pass for 'at least once'", () => {
    // RF-A1 passed at 10:00; RF-A8 (failed) becomes the same learner's attempt at 09:00
    db.update(attempts).set({ learner: "RETURNS-1" }).where(eq(attempts.id, "RF-A1")).run();
    db.update(attempts).set({ learner: "RETURNS-1", startedAt: "2026-07-08T09:00:00Z" }).where(eq(attempts.id, "RF-A8")).run();
    // 39 learners; RETURNS-1 first failed, then passed: 25 first-attempt passes, still 26 who ever passed
    expect(q3()).toEqual({ learners: 39, firstPassed: 25, everPassed: 26 });
  });

  it("answers zeros where nothing matches", () => {
    expect(learnerOutcomes(db, networkScope("2019-Q1", "2019-Q1"))).toEqual({ learners: 0, firstPassed: 0, everPassed: 0 });
  });
});
