// Quantiles, median, interquartile range and percentile rank of a sample.
//
// quantile() uses R's default definition, type 7 (Hyndman & Fan 1996): for a sorted sample
// x[0..n-1], the p-quantile sits at position h = (n - 1) * p and is interpolated linearly
// between x[floor(h)] and x[ceil(h)]. It is written out here rather than borrowed so the
// definition cannot change with a library version; tests compare it with simple-statistics.
//
// Empty samples give null instead of NaN. Non-finite values or p outside [0, 1] are
// programming errors and throw a RangeError naming the problem.

function sortedCopy(values: readonly number[], caller: string): number[] {
  values.forEach((value, index) => {
    if (!Number.isFinite(value)) {
      throw new RangeError(`${caller}: value at index ${index} is not a finite number (${value})`);
    }
  });
  return [...values].sort((a, b) => a - b);
}

function quantileOfSorted(sorted: readonly number[], p: number): number {
  const position = (sorted.length - 1) * p;
  const lower = Math.floor(position);
  const upper = Math.ceil(position);
  const fraction = position - lower;
  if (fraction === 0) return sorted[lower];
  return sorted[lower] + fraction * (sorted[upper] - sorted[lower]);
}

/** R type-7 p-quantile of `values` (0 ≤ p ≤ 1); null when `values` is empty. */
export function quantile(values: readonly number[], p: number): number | null {
  if (!Number.isFinite(p) || p < 0 || p > 1) {
    throw new RangeError(`quantile: p must be between 0 and 1 (got ${p})`);
  }
  const sorted = sortedCopy(values, "quantile");
  if (sorted.length === 0) return null;
  return quantileOfSorted(sorted, p);
}

/** Median (type-7 0.5-quantile, i.e. the mean of the two middle values for even n); null when empty. */
export function median(values: readonly number[]): number | null {
  return quantile(values, 0.5);
}

/** Interquartile range Q3 − Q1 with type-7 quartiles; null when empty. */
export function iqr(values: readonly number[]): number | null {
  const sorted = sortedCopy(values, "iqr");
  if (sorted.length === 0) return null;
  return quantileOfSorted(sorted, 0.75) - quantileOfSorted(sorted, 0.25);
}

/**
 * Percentile rank of `x` within `values`, as a percentage 0–100:
 *   100 × (count of values strictly below x + ½ × count of values equal to x) / count of values.
 * Ties share the middle of their block, so a value equal to every sample scores 50.
 * Null when `values` is empty.
 */
export function percentileRank(values: readonly number[], x: number): number | null {
  if (!Number.isFinite(x)) {
    throw new RangeError(`percentileRank: x must be a finite number (got ${x})`);
  }
  const sorted = sortedCopy(values, "percentileRank");
  if (sorted.length === 0) return null;
  let below = 0;
  let equal = 0;
  for (const value of sorted) {
    if (value < x) below += 1;
    else if (value === x) equal += 1;
  }
  return (100 * (below + equal / 2)) / sorted.length;
}
