// Overdispersion of funnel-plot z-scores, after Spiegelhalter, "Handling over-dispersion of performance
// indicators", Qual Saf Health Care 2005;14:347–351. Real units differ by more than binomial chance, so plain
// limits flag too many. The dispersion φ is the mean squared z-score after winsorising at the 10th and 90th
// percentiles (so a few true outliers do not inflate it); the units are overdispersed when I·φ exceeds the
// 95th percentile of χ² with I − 1 degrees of freedom, and only then are the limits widened by √φ.
import { chiSquaredQuantile } from "./chiSquared";
import type { FunnelPosition } from "./funnel";
import { quantile } from "./quantiles";

/** Two-sided normal quantiles of the funnel's 95 % and 99.8 % limits. */
export const Z_FUNNEL_95 = 1.959964;
export const Z_FUNNEL_998 = 3.090232;

export interface Dispersion {
  /** Winsorised mean squared z; null with fewer than two units. */
  phi: number | null;
  /** Units the estimate rests on. */
  units: number;
  /** The 95th percentile of χ² with I − 1 degrees of freedom; null with fewer than two units. */
  threshold: number | null;
  overdispersed: boolean;
  /** √φ when overdispersed, else 1: what the limits are multiplied by. */
  scale: number;
}

/** φ and the test for a set of z-scores (units without a z-score are left out by the caller). */
export function dispersionOf(zScores: readonly number[], winsorise = 0.1): Dispersion {
  const units = zScores.length;
  if (units < 2) return { phi: null, units, threshold: null, overdispersed: false, scale: 1 };
  const low = quantile(zScores, winsorise)!;
  const high = quantile(zScores, 1 - winsorise)!;
  const phi = zScores.reduce((sum, z) => sum + Math.min(high, Math.max(low, z)) ** 2, 0) / units;
  const threshold = chiSquaredQuantile(0.95, units - 1);
  const overdispersed = units * phi > threshold;
  return { phi, units, threshold, overdispersed, scale: overdispersed ? Math.sqrt(phi) : 1 };
}

/** Where a z-score falls against limits of ±1.96·scale and ±3.09·scale; a z exactly on a limit is inside. */
export function positionOfZ(z: number, scale = 1): FunnelPosition {
  if (z > Z_FUNNEL_998 * scale) return "above998";
  if (z < -Z_FUNNEL_998 * scale) return "below998";
  if (z > Z_FUNNEL_95 * scale) return "above95";
  if (z < -Z_FUNNEL_95 * scale) return "below95";
  return "inside";
}

/** Normal-approximation limits around `rate` at n attempts, widened by `scale`, clamped to [0, 1]. */
export function scaledFunnelLimits(rate: number, n: number, scale = 1) {
  const sd = Math.sqrt((rate * (1 - rate)) / n);
  const clamp = (x: number) => Math.min(1, Math.max(0, x));
  return {
    low95: clamp(rate - Z_FUNNEL_95 * scale * sd),
    high95: clamp(rate + Z_FUNNEL_95 * scale * sd),
    low998: clamp(rate - Z_FUNNEL_998 * scale * sd),
    high998: clamp(rate + Z_FUNNEL_998 * scale * sd),
  };
}
