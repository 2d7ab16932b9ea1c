// Metrics that pile up at their ceiling: when most attempts reach 100 % (full recoil, hands-on time), the
// median is 100 and ranks built on it are ties. There the useful figures are the share of attempts at 100 %
// and the 10th percentile (how low the weakest tenth falls), both read from the value distributions.
import { medianOfCounts, quantileOfCounts, type ValueCounts } from "./summaries";

/** A share-of-compressions metric cannot go above this. */
export const METRIC_CEILING = 100;

export interface CeilingFigures {
  /** Share of attempts at the ceiling; null without attempts. */
  shareAtCeiling: number | null;
  /** Type-7 10th percentile; null without attempts. */
  p10: number | null;
}

export function ceilingFigures(counts: ValueCounts): CeilingFigures {
  const n = counts.reduce((sum, entry) => sum + entry.count, 0);
  if (n === 0) return { shareAtCeiling: null, p10: null };
  const atCeiling = counts.filter((entry) => entry.value >= METRIC_CEILING).reduce((sum, entry) => sum + entry.count, 0);
  return { shareAtCeiling: atCeiling / n, p10: quantileOfCounts(counts, 0.1) };
}

/** Whether the median of a distribution sits at the ceiling. */
export function medianAtCeiling(counts: ValueCounts): boolean {
  const median = medianOfCounts(counts);
  return median !== null && median >= METRIC_CEILING;
}
