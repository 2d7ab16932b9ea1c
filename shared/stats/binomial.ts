// Binomial distribution: log probability mass and cumulative distribution function.
// Terms are built in log space (log-gamma for the binomial coefficient) so large n never
// overflows factorials or underflows powers before they are combined.
// Precision: log n! is large (about 1e6 at n = 1e5), so the difference of three log-gammas
// carries an absolute error near 1e-16 × log n!; probabilities are good to about 1e-13 at
// n = 1000 and 1e-10 at n = 100 000, far finer than any funnel or chart needs.
import { gammaln } from "simple-statistics";

/** log C(n, k) via log-gamma. */
export function logBinomialCoefficient(n: number, k: number): number {
  return gammaln(n + 1) - gammaln(k + 1) - gammaln(n - k + 1);
}

/** log P(R = k) for R ~ Binomial(n, theta); −Infinity when k is impossible. */
export function binomialLogPmf(k: number, n: number, theta: number): number {
  if (!Number.isInteger(k) || k < 0 || k > n) return Number.NEGATIVE_INFINITY;
  // The ends of the probability range are certain outcomes; log(0) would give NaN via 0 × −∞.
  if (theta === 0) return k === 0 ? 0 : Number.NEGATIVE_INFINITY;
  if (theta === 1) return k === n ? 0 : Number.NEGATIVE_INFINITY;
  return logBinomialCoefficient(n, k) + k * Math.log(theta) + (n - k) * Math.log1p(-theta);
}

/** P(R ≤ r) for R ~ Binomial(n, theta); 0 for r < 0, 1 for r ≥ n. */
export function binomialCdf(r: number, n: number, theta: number): number {
  assertBinomialParameters(n, theta, "binomialCdf");
  if (r < 0) return 0;
  if (r >= n) return 1;
  const last = Math.floor(r);
  let total = 0;
  for (let k = 0; k <= last; k += 1) {
    total += Math.exp(binomialLogPmf(k, n, theta));
  }
  // Rounding in the sum may overshoot 1 by a few ulps.
  return Math.min(1, total);
}

export function assertBinomialParameters(n: number, theta: number, caller: string): void {
  if (!Number.isInteger(n) || n < 0) {
    throw new RangeError(`${caller}: n must be a whole number ≥ 0 (got ${n})`);
  }
  if (!Number.isFinite(theta) || theta < 0 || theta > 1) {
    throw new RangeError(`${caller}: theta must be between 0 and 1 (got ${theta})`);
  }
}
