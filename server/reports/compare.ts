// Whether one pass rate differs from another in a way worth putting into words: the same test the overview
// uses (the 95 % interval of the difference, Newcombe's hybrid score, must exclude zero), so the report and
// the pages never read one change two ways.
import type { ChangeVerdict, RateFigure } from "../../shared/schemas/report";
import { changeVerdict, proportionDifference } from "../../shared/stats/difference";

export function compareRates(current: RateFigure, earlier: RateFigure): ChangeVerdict | null {
  if (!isShown(current) || !isShown(earlier) || current.n.value === null || earlier.n.value === null) return null;
  const difference = proportionDifference(successesOf(current, current.n.value), current.n.value, successesOf(earlier, earlier.n.value), earlier.n.value);
  return difference ? changeVerdict(difference) : null;
}

/** A shown rate is successes / n exactly; rounding recovers the whole count from the stored fraction. */
function successesOf(rate: ShownRate, n: number): number {
  return Math.round(rate.value * n);
}

type ShownRate = RateFigure & { value: number; low: number; high: number };

export function isShown(rate: RateFigure): rate is ShownRate {
  return rate.value !== null && rate.low !== null && rate.high !== null;
}

/** Difference in percentage points, current minus earlier; null when either is not shown. */
export function differencePoints(current: RateFigure, earlier: RateFigure): number | null {
  if (!isShown(current) || !isShown(earlier)) return null;
  return (current.value - earlier.value) * 100;
}
