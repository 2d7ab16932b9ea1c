// Wilson score interval for a binomial proportion, without continuity correction
// (Wilson 1927; method 3 in Newcombe, Stat Med 1998;17:857–872).

/** z for a two-sided 95 % interval: the 0.975 quantile of the standard normal. */
export const Z_95 = 1.959964;

/**
 * Wilson score interval [low, high] for `successes` out of `n`; null when n is 0.
 * Bounds are clamped to [0, 1] so rounding never pushes them outside the proportion range.
 */
export function wilsonInterval(successes: number, n: number, z: number = Z_95): [number, number] | null {
  if (!Number.isInteger(n) || n < 0) {
    throw new RangeError(`wilsonInterval: n must be a whole number ≥ 0 (got ${n})`);
  }
  if (!Number.isInteger(successes) || successes < 0 || successes > n) {
    throw new RangeError(`wilsonInterval: successes must be a whole number from 0 to n = ${n} (got ${successes})`);
  }
  if (!Number.isFinite(z) || z <= 0) {
    throw new RangeError(`wilsonInterval: z must be a positive number (got ${z})`);
  }
  if (n === 0) return null;

  const p = successes / n;
  const z2 = z * z;
  const centre = p + z2 / (2 * n);
  const spread = z * Math.sqrt((p * (1 - p)) / n + z2 / (4 * n * n));
  const denominator = 1 + z2 / n;
  const low = (centre - spread) / denominator;
  const high = (centre + spread) / denominator;
  return [clampToUnit(low), clampToUnit(high)];
}

function clampToUnit(value: number): number {
  return Math.min(1, Math.max(0, value));
}
