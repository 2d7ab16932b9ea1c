// The shift and no-data signals on a small constructed network (tests/fixtures/alerts/shiftNetwork.ts), and
// the rule that finds a shift at the end of a series.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { currentSignals } from "../../server/alerts/signals";
import { shiftAtEnd } from "../../server/alerts/shiftSignals";
import { digestText } from "../../server/alerts/importAlerts";
import type { Db } from "../../server/db/client";
import { SHIFT_MONTHS, passesOf, seedShiftNetwork } from "../fixtures/alerts/shiftNetwork";
import { makeTestDb } from "../helpers/testApp";

describe("shift and no-data signals", () => {
  let db: Db;
  beforeAll(async () => {
    db = makeTestDb();
    await seedShiftNetwork(db);
  });
  afterAll(() => db.$client.close());

  it("finds the run below the median that reaches the newest month, for the network and NORTH, keyed by where it began", () => {
    const { shift } = currentSignals(db, "2026-07-01");
    // 18 monthly rates: 5 at 7/8, 5 at 5/8, 8 at 1/8, so the median is 5/8 and the 13 useful points are 5 above
    // then 8 below. Anhøj & Olesen (PLoS One 2014;9:e113825): a run longer than round(log2(13) + 3) = 7 signals.
    expect(shift.map((s) => s.key).sort()).toEqual(["shift:NORTH:below:2025-11", "shift:network:below:2025-11"]);
    const north = shift.find((s) => s.siteCode === "NORTH")!;
    expect(north).toMatchObject({ direction: "below", since: "2025-11", through: "2026-06", months: 8, runLimit: 7 });
  });

  it("leaves out months of a site whose attempts come from too few instructors to be shown", () => {
    // EAST follows the same pattern, but from two instructors: under 3 (the default suppressionMinInstructors)
    const { shift } = currentSignals(db, "2026-07-01");
    expect(shift.some((s) => s.siteCode === "EAST")).toBe(false);
  });

  it("finds an active site with data in the quarter before the newest and none in the newest", () => {
    const { noData } = currentSignals(db, "2026-07-01");
    // SOUTH and WEST sent a class log in 2026-Q1 and nothing in 2026-Q2; WEST is inactive
    expect(noData).toEqual([{ key: "no-data:SOUTH:2026-Q2", siteCode: "SOUTH", quarter: "2026-Q2", previous: "2026-Q1" }]);
  });

  it("words both in the digest as reasons to look", () => {
    const text = digestText(currentSignals(db, "2026-07-01"));
    expect(text).toContain("not proof of its cause");
    expect(text).toMatch(/- Site NORTH: below its median in 8 months from November 2025 to June 2026/);
    expect(text).toMatch(/- The network: below its median/);
    expect(text).toContain("Sites with no attempts or class logs in 2026 Q2 so far, after some in 2026 Q1:\n  - SOUTH:");
  });
});

describe("a shift at the end of a series", () => {
  const series = (rates: number[]) => rates.map((rate, i) => ({ period: SHIFT_MONTHS[i], rate }));

  it("is found in the constructed pattern and not once the series crosses back", () => {
    const rates = SHIFT_MONTHS.map((_, i) => passesOf(i) / 8);
    expect(shiftAtEnd(series(rates))).toMatchObject({ direction: "below", since: "2025-11", months: 8 });
    // the newest month back above the median (still 5/8): the run of 7 below is no longer than the limit of 7,
    // but 2 crossings in 13 useful points are fewer than 3, the 5th percentile of Binomial(12, 0.5)
    // (P(X ≤ 2) = 79/4096 ≈ 0.019, P(X ≤ 3) = 299/4096 ≈ 0.073), so the series still signals, now from the
    // newest month's side
    const crossedBack = [...rates.slice(0, 17), 7 / 8];
    expect(shiftAtEnd(series(crossedBack))).toMatchObject({ direction: "above", since: "2026-06", months: 1 });
  });

  it("is not found in a series that alternates around its median", () => {
    expect(shiftAtEnd(series(SHIFT_MONTHS.map((_, i) => (i % 2 === 0 ? 0.7 : 0.5))))).toBeNull();
  });
});
