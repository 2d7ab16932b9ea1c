// Quarters as the insight routes need them: which quarters hold attempts, and the windows around a period.
import { previousQuarter, quartersBetween } from "../../shared/quarter";
import type { Period } from "../../shared/schemas/insight";
import type { Db } from "../db/client";
import { quartersWithAttempts } from "../metrics/summaries";
import { cached } from "./cache";

/** Quarters that have attempts, newest first (from the attempt summaries: a few hundred rows at most). */
export function quartersWithData(db: Db): string[] {
  return cached(db, "quarters", () => quartersWithAttempts(db));
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
