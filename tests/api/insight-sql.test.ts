// The SQL pieces of the insight services against plain JavaScript over the same rows: medians per group
// (window functions) and over all rows (typed-array sort) must equal shared/stats `median` (R type 7).
import { and, eq, sql } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { median } from "../../shared/stats";
import { attempts } from "../../server/db/schema";
import { groupSummaries, medianOf, medianOfSorted, scoreSummariesByInstructor, sortedUnion, sortedValues } from "../../server/insight/sql";
import { makeTestDb } from "../helpers/testApp";
import { seedInsightNetwork } from "../fixtures/insight/network";
import type { Db } from "../../server/db/client";

let db: Db;
beforeAll(async () => {
  db = makeTestDb();
  await seedInsightNetwork(db);
  // a few thousand more attempts with scattered, tied and repeated scores on one class
  const base = db.select().from(attempts).limit(1).get()!;
  let seed = 12345;
  const random = () => ((seed = (seed * 1103515245 + 12345) % 2 ** 31) / 2 ** 31);
  db.$client.transaction(() => {
    for (let i = 0; i < 3000; i++) {
      const score = random() < 0.2 ? 70 : Math.round(random() * 10000) / 100;
      db.insert(attempts)
        .values({ ...base, id: `EXTRA-${i}`, score, instructorId: 1 + (i % 4), feedback: i % 3 === 0 ? "live" : "hidden", quarter: i % 2 ? "2026-Q2" : "2026-Q1" })
        .run();
    }
  })();
});
afterAll(() => db.$client.close());

/** The same figures in plain JavaScript over every row. */
function jsSummaries(where: ReturnType<typeof sql>, group: "instructorId" | "quarter") {
  const rows = db.select().from(attempts).where(where).all();
  const groups = new Map<string | number, (typeof rows)[number][]>();
  for (const row of rows) groups.set(row[group], [...(groups.get(row[group]) ?? []), row]);
  return new Map(
    [...groups].map(([k, members]) => [
      k,
      { n: members.length, passed: members.filter((m) => m.passed).length, median: median(members.map((m) => m.score)) },
    ]),
  );
}

describe("medians computed in SQL", () => {
  const filters = [
    sql`1 = 1`,
    sql`${attempts.quarter} = '2026-Q2'`,
    sql`${attempts.feedback} = 'live' AND ${attempts.siteId} = 2`,
    sql`${attempts.profile} = 'infant'`,
  ];
  it.each(filters.map((where, i) => [i, where] as const))("per group equal shared median, counts and passes (filter %i)", (_i, where) => {
    expect(groupSummaries(db, attempts.score, attempts.instructorId, where)).toEqual(jsSummaries(where, "instructorId"));
    expect(groupSummaries(db, attempts.score, attempts.quarter, where)).toEqual(jsSummaries(where, "quarter"));
    expect(scoreSummariesByInstructor(db, where)).toEqual(jsSummaries(where, "instructorId"));
  });

  it.each(filters.map((where, i) => [i, where] as const))("over all rows equal shared median (filter %i)", (_i, where) => {
    const values = db.select({ v: attempts.score }).from(attempts).where(where).all().map((r) => r.v);
    expect(medianOf(db, attempts.score, where)).toBe(median(values));
  });

  it("combines two sorted lists into the median of both", () => {
    const live = sortedValues(db, attempts.score, and(eq(attempts.feedback, "live"))!);
    const hidden = sortedValues(db, attempts.score, and(eq(attempts.feedback, "hidden"))!);
    const all = db.select({ v: attempts.score }).from(attempts).all().map((r) => r.v);
    expect(medianOfSorted(sortedUnion(live, hidden))).toBe(median(all));
  });

  it("gives null for no rows, and the value itself for one", () => {
    expect(medianOf(db, attempts.score, sql`0 = 1`)).toBeNull();
    expect(groupSummaries(db, attempts.score, attempts.instructorId, sql`0 = 1`).size).toBe(0);
    expect(medianOf(db, attempts.score, eq(attempts.id, "A1-2604-001"))).toBe(95);
  });

  it("matches the worked example of Hyndman & Fan type 7: 1..10 → 5.5", () => {
    // R: median(1:10) = 5.5 (type 7 = mean of the 5th and 6th values)
    expect(medianOfSorted(Float64Array.from([1, 2, 3, 4, 5, 6, 7, 8, 9, 10]))).toBe(5.5);
  });
});
