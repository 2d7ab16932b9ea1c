// Whether one pass rate differs from another in a way worth putting into words. This is a plain-language
// reading, not a significance test: when each rate lies inside the other's 95 % interval the intervals
// overlap heavily and the report says "about the same" rather than inviting readers to see a trend in noise.
import type { ChangeVerdict, RateFigure } from "../../shared/schemas/report";

export function compareRates(current: RateFigure, earlier: RateFigure): ChangeVerdict | null {
  if (!isShown(current) || !isShown(earlier)) return null;
  const currentInsideEarlier = current.value >= earlier.low && current.value <= earlier.high;
  const earlierInsideCurrent = earlier.value >= current.low && earlier.value <= current.high;
  if (currentInsideEarlier && earlierInsideCurrent) return "about the same";
  return current.value > earlier.value ? "higher" : current.value < earlier.value ? "lower" : "about the same";
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
