// Quarters as the insight routes need them: which quarters hold attempts, and the windows around a period.
import { sql } from "drizzle-orm";
import { previousQuarter, quartersBetween } from "../../shared/quarter";
import type { Period } from "../../shared/schemas/insight";
import type { Db } from "../db/client";
import { attempts } from "../db/schema";
import { cached } from "./cache";

/**
 * Quarters that have attempts, newest first. Walks the quarter index one distinct value at a time (a
 * recursive skip-scan), so it costs a few index seeks however many attempts there are.
 */
export function quartersWithData(db: Db): string[] {
  return cached(db, "quarters", () =>
    db
      .all<{ quarter: string }>(
        sql`WITH RECURSIVE q(quarter) AS (
              SELECT max(${attempts.quarter}) FROM ${attempts}
              UNION ALL
              SELECT (SELECT max(${attempts.quarter}) FROM ${attempts} WHERE ${attempts.quarter} < q.quarter) FROM q
              WHERE q.quarter IS NOT NULL
            )
            SELECT quarter FROM q WHERE quarter IS NOT NULL`,
      )
      .map((row) => row.quarter),
  );
}

function shiftBack(quarter: string, by: number): string {
  let current = quarter;
  for (let i = 0; i < by; i += 1) current = previousQuarter(current);
  return current;
}

export function periodOf(from: string, to: string): Period {
  return { from, to, quarters: quartersBetween(from, to) };
}

/** The period of the same length just before `period` (the quarter before a single quarter). */
export function previousPeriod(period: Period): Period {
  const length = period.quarters.length;
  return periodOf(shiftBack(period.from, length), shiftBack(period.from, 1));
}

/** The quarters a trend shows: every quarter of a range, or the last `count` quarters up to a single quarter. */
export function trendQuarters(period: Period, count = 8): Period {
  return period.quarters.length > 1 ? period : periodOf(shiftBack(period.to, count - 1), period.to);
}
