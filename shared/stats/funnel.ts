// Funnel-plot control limits for a proportion, after Spiegelhalter, "Funnel plots for comparing
// institutional performance", Stat Med 2005;24:1185–1202.
//
// A unit with n attempts is compared with a target proportion theta0. Two kinds of limit:
// - "normal": theta0 ± z · sqrt(theta0 (1 − theta0) / n).
// - "exact": the binomial quantile, smoothed by the interpolation of the paper's appendix A.1.1.
//   With R ~ Binomial(n, theta0), r_p is the smallest r with P(R ≤ r) ≥ p and
//   alpha = (P(R ≤ r_p) − p) / (P(R ≤ r_p) − P(R ≤ r_p − 1)); the limit is (r_p − alpha) / n.
//   Without the interpolation the limits would jump in steps of 1/n.
// Limits are clamped to [0, 1].
import { assertBinomialParameters, binomialLogPmf } from "./binomial";

export type FunnelLevel = 0.95 | 0.998;
export type FunnelMethod = "normal" | "exact";

export interface FunnelOptions {
  level: FunnelLevel;
  method: FunnelMethod;
}

export interface FunnelLimits {
  low: number;
  high: number;
}

export interface FunnelPoint extends FunnelLimits {
  n: number;
}

// Two-sided levels: 95 % (about 2 SD, "warning") and 99.8 % (about 3 SD, "control").
const LEVELS: Record<FunnelLevel, { z: number; lowerTail: number; upperTail: number }> = {
  0.95: { z: 1.959964, lowerTail: 0.025, upperTail: 0.975 },
  0.998: { z: 3.090232, lowerTail: 0.001, upperTail: 0.999 },
};

/**
 * Lower and upper funnel limits for a unit of size n around target theta0.
 * n = 0 carries no information, so the limits span the whole range [0, 1].
 */
export function funnelLimits(theta0: number, n: number, options: FunnelOptions): FunnelLimits {
  assertBinomialParameters(n, theta0, "funnelLimits");
  const level = LEVELS[options.level];
  if (!level) throw new RangeError(`funnelLimits: level must be 0.95 or 0.998 (got ${options.level})`);
  if (n === 0) return { low: 0, high: 1 };
  // A target of exactly 0 or 1 admits no variation: the funnel collapses onto the target.
  if (theta0 === 0 || theta0 === 1) return { low: theta0, high: theta0 };

  if (options.method === "normal") {
    const halfWidth = level.z * Math.sqrt((theta0 * (1 - theta0)) / n);
    return { low: clampToUnit(theta0 - halfWidth), high: clampToUnit(theta0 + halfWidth) };
  }
  if (options.method === "exact") {
    return {
      low: clampToUnit(interpolatedBinomialLimit(level.lowerTail, n, theta0)),
      high: clampToUnit(interpolatedBinomialLimit(level.upperTail, n, theta0)),
    };
  }
  throw new RangeError(`funnelLimits: method must be "normal" or "exact" (got ${String(options.method)})`);
}

/** (r_p − alpha) / n from appendix A.1.1, found with one pass over the cumulative distribution. */
function interpolatedBinomialLimit(p: number, n: number, theta0: number): number {
  let previousCumulative = 0; // P(R ≤ r − 1)
  for (let r = 0; r <= n; r += 1) {
    // At r = n the distribution is exhausted; using 1 avoids rounding leaving it just short of p.
    const cumulative = r === n ? 1 : Math.min(1, previousCumulative + Math.exp(binomialLogPmf(r, n, theta0)));
    if (cumulative >= p) {
      const alpha = (cumulative - p) / (cumulative - previousCumulative);
      return (r - alpha) / n;
    }
    previousCumulative = cumulative;
  }
  return 1; // not reached: the loop returns by r = n
}

/**
 * Points for drawing a funnel from n = 1 to nMax: `points` sizes spaced evenly on a log scale
 * (the funnel bends most at small n), rounded to whole numbers, duplicates dropped.
 */
export function funnelCurve(theta0: number, nMax: number, options: FunnelOptions & { points?: number }): FunnelPoint[] {
  if (!Number.isInteger(nMax) || nMax < 0) {
    throw new RangeError(`funnelCurve: nMax must be a whole number ≥ 0 (got ${nMax})`);
  }
  const pointCount = options.points ?? 100;
  if (!Number.isInteger(pointCount) || pointCount < 2) {
    throw new RangeError(`funnelCurve: points must be a whole number ≥ 2 (got ${pointCount})`);
  }
  if (nMax === 0) return [];

  const sizes = new Set<number>();
  for (let i = 0; i < pointCount; i += 1) {
    sizes.add(Math.round(Math.pow(nMax, i / (pointCount - 1))));
  }
  return [...sizes].sort((a, b) => a - b).map((n) => ({ n, ...funnelLimits(theta0, n, options) }));
}

/**
 * Where a unit falls against the funnel: "inside" both limits, beyond the 95 % limit only
 * ("above95" / "below95"), or beyond the 99.8 % limit ("above998" / "below998").
 * A proportion exactly on a limit counts as inside it.
 */
export type FunnelPosition = "inside" | "above95" | "below95" | "above998" | "below998";

/** Position of successes/n against the funnel around theta0; null when n is 0 (nothing to place). */
export function classifyAgainstFunnel(successes: number, n: number, theta0: number, method: FunnelMethod = "exact"): FunnelPosition | null {
  assertBinomialParameters(n, theta0, "classifyAgainstFunnel");
  if (!Number.isInteger(successes) || successes < 0 || successes > n) {
    throw new RangeError(`classifyAgainstFunnel: successes must be a whole number from 0 to n = ${n} (got ${successes})`);
  }
  if (n === 0) return null;
  const proportion = successes / n;
  const outer = funnelLimits(theta0, n, { level: 0.998, method });
  if (proportion > outer.high) return "above998";
  if (proportion < outer.low) return "below998";
  const inner = funnelLimits(theta0, n, { level: 0.95, method });
  if (proportion > inner.high) return "above95";
  if (proportion < inner.low) return "below95";
  return "inside";
}

function clampToUnit(value: number): number {
  return Math.min(1, Math.max(0, value));
}
