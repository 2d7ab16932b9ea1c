// Funnel plot pieces: the limit curve around the network rate at 95 % and 99.8 % (normal approximation,
// widened by √φ when the instructors are overdispersed; Spiegelhalter 2005) and the funnel block of an answer.
import type { z } from "zod";
import type { funnelCurvePointSchema, funnelSchema } from "../../shared/schemas/insight";
import { scaledFunnelLimits } from "../../shared/stats";
import type { InstructorFunnel, InstructorFunnelUnit } from "../metrics/instructorFunnel";

type CurvePoint = z.infer<typeof funnelCurvePointSchema>;
type FunnelBlock = z.infer<typeof funnelSchema>;

/** Limits from n = 1 to nMax at both levels, on sizes spaced evenly on a log scale (the funnel bends most at small n). */
export function funnelLimitCurve(networkRate: number | null, nMax: number, scale = 1, points = 60): CurvePoint[] {
  if (networkRate === null || nMax < 1) return [];
  const sizes = new Set<number>();
  for (let i = 0; i < points; i += 1) sizes.add(Math.round(Math.pow(nMax, i / (points - 1))));
  return [...sizes].sort((a, b) => a - b).map((n) => ({ n, ...scaledFunnelLimits(networkRate, n, scale) }));
}

/** The funnel block of an answer; `hidden` withholds everything drawn from other instructors' figures. */
/**
 * The funnel's network rate, dispersion and limit curve. `shownIds`, when given, limits the curve's extent to
 * the units shown, so that the size of the largest hidden one is not given away.
 */
export function funnelBlock(funnel: InstructorFunnel, hidden = false, shownIds?: ReadonlySet<number>): FunnelBlock {
  const networkRate = hidden ? null : funnel.networkRate;
  const units = [...funnel.units].filter(([id]) => shownIds === undefined || shownIds.has(id)).map(([, unit]) => unit);
  // an effective size equal to the attempts can come out a hair above them in floating point
  const nMax = Math.ceil(Math.max(0, ...units.map((unit) => Math.max(unit.n, unit.effectiveN ?? 0))) - 1e-9);
  return {
    networkRate,
    method: "normal",
    adjust: funnel.adjust,
    phi: hidden ? null : funnel.dispersion.phi,
    overdispersed: hidden ? false : funnel.dispersion.overdispersed,
    scale: hidden ? 1 : funnel.dispersion.scale,
    curve: funnelLimitCurve(networkRate, nMax, hidden ? 1 : funnel.dispersion.scale),
  };
}

/** One instructor's comparison fields; all null when the network is hidden or they have no attempts. */
export function funnelComparison(unit: InstructorFunnelUnit | undefined, hidden = false) {
  if (!unit || hidden || unit.n === 0) return { expected: null, z: null, adjustedRate: null, effectiveAttempts: null, position: null };
  return { expected: unit.expected, z: unit.z, adjustedRate: unit.adjustedRate, effectiveAttempts: unit.effectiveN, position: unit.position };
}
