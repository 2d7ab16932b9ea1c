// Funnel plot pieces: the limit curve around the network rate at 95 % and 99.8 % (exact binomial,
// Spiegelhalter 2005) and the classification of a unit against it.
import type { z } from "zod";
import type { funnelCurvePointSchema } from "../../shared/schemas/insight";
import { funnelCurve } from "../../shared/stats";

type CurvePoint = z.infer<typeof funnelCurvePointSchema>;

/** Limits from n = 1 to nMax at both levels, on the same log-spaced sizes. */
export function funnelLimitCurve(networkRate: number | null, nMax: number, points = 60): CurvePoint[] {
  if (networkRate === null || nMax < 1) return [];
  const inner = funnelCurve(networkRate, nMax, { level: 0.95, method: "exact", points });
  const outer = funnelCurve(networkRate, nMax, { level: 0.998, method: "exact", points });
  return inner.map((point, i) => ({ n: point.n, low95: point.low, high95: point.high, low998: outer[i].low, high998: outer[i].high }));
}
