// Quantiles of the χ² distribution, for the overdispersion test of funnel plots. The distribution function
// is the regularised lower incomplete gamma P(k/2, x/2), by its series for x < a + 1 and its continued
// fraction otherwise (Press et al., Numerical Recipes, 3rd ed., §6.2); the quantile is found by bisection,
// which cannot fail to converge. simple-statistics' chi-squared table has two decimals and stops at 100
// degrees of freedom, too coarse and too short for a network of instructors.
import { gammaln } from "simple-statistics";

const EPSILON = 1e-15;
const MAX_ITERATIONS = 1000;

function lowerGammaSeries(a: number, x: number): number {
  let term = 1 / a;
  let sum = term;
  for (let k = 1; k < MAX_ITERATIONS; k += 1) {
    term *= x / (a + k);
    sum += term;
    if (Math.abs(term) < Math.abs(sum) * EPSILON) break;
  }
  return sum * Math.exp(-x + a * Math.log(x) - gammaln(a));
}

function upperGammaFraction(a: number, x: number): number {
  // modified Lentz's method
  const tiny = 1e-300;
  let b = x + 1 - a;
  let c = 1 / tiny;
  let d = 1 / b;
  let h = d;
  for (let i = 1; i < MAX_ITERATIONS; i += 1) {
    const an = -i * (i - a);
    b += 2;
    d = an * d + b;
    if (Math.abs(d) < tiny) d = tiny;
    c = b + an / c;
    if (Math.abs(c) < tiny) c = tiny;
    d = 1 / d;
    const delta = d * c;
    h *= delta;
    if (Math.abs(delta - 1) < EPSILON) break;
  }
  return Math.exp(-x + a * Math.log(x) - gammaln(a)) * h;
}

/** P(X ≤ x) for X ~ χ² with `df` degrees of freedom. */
export function chiSquaredCdf(x: number, df: number): number {
  checkDf(df, "chiSquaredCdf");
  if (!(x > 0)) return 0;
  const a = df / 2;
  const half = x / 2;
  return half < a + 1 ? lowerGammaSeries(a, half) : 1 - upperGammaFraction(a, half);
}

/** The p-quantile of χ² with `df` degrees of freedom (R's qchisq(p, df)). */
export function chiSquaredQuantile(p: number, df: number): number {
  checkDf(df, "chiSquaredQuantile");
  if (!(p >= 0 && p < 1)) throw new RangeError(`chiSquaredQuantile: p must be at least 0 and below 1 (got ${p})`);
  if (p === 0) return 0;
  let low = 0;
  let high = Math.max(1, df);
  while (chiSquaredCdf(high, df) < p) high *= 2;
  for (let i = 0; i < 200 && high - low > 1e-12 * high; i += 1) {
    const mid = (low + high) / 2;
    if (chiSquaredCdf(mid, df) < p) low = mid;
    else high = mid;
  }
  return (low + high) / 2;
}

function checkDf(df: number, caller: string) {
  if (!(df > 0) || !Number.isFinite(df)) throw new RangeError(`${caller}: degrees of freedom must be above 0 (got ${df})`);
}
