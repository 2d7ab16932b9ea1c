// How the insight pages write numbers: shares as "29.5 %", intervals as "27.1–31.9 %", changes in
// percentage points, and the words for kappa and for a funnel position. One place, so every page, table
// and CSV agrees.
import type { z } from "zod";
import type { funnelPositionSchema, Rate } from "../../../shared/schemas/insight";

// counts are written by the one formatting module; pages that read them from here get the same text
export { formatCount } from "../../lib/formatting";

export type FunnelPosition = z.infer<typeof funnelPositionSchema>;

/**
 * Rounds half away from zero at `decimals`, as people round by hand (51.85 → 51.9). toFixed alone would
 * round the binary value, which is often a hair below the half (51.8499…).
 */
export function roundHalf(value: number, decimals: number): number {
  const factor = 10 ** decimals;
  const scaled = Number((Math.abs(value) * factor).toPrecision(12));
  return (Math.sign(value) * Math.round(scaled)) / factor;
}

export function formatFixed(value: number, decimals: number): string {
  return roundHalf(value, decimals).toFixed(decimals);
}

/** A share 0–1 as a percentage with one decimal: 0.2953 → "29.5 %"; missing → "–". */
export function formatPercent(share: number | null | undefined): string {
  if (share === null || share === undefined || !Number.isFinite(share)) return "–";
  return `${formatFixed(share * 100, 1)} %`;
}

/** A percentage that is already 0–100 (metrics such as depth_ok_pct): 80 → "80.0 %". */
export function formatPct(value: number | null | undefined): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return "–";
  return `${formatFixed(value, 1)} %`;
}

/** The share as a number of percent with one decimal, for sorting and CSV: 0.29534 → 29.5. */
export function percentValue(share: number | null | undefined): number | null {
  if (share === null || share === undefined || !Number.isFinite(share)) return null;
  return roundHalf(share * 100, 1);
}

/** "27.1–31.9 %"; missing → "–". */
export function formatInterval(low: number | null | undefined, high: number | null | undefined): string {
  if (low === null || low === undefined || high === null || high === undefined) return "–";
  return `${formatFixed(low * 100, 1)}–${formatFixed(high * 100, 1)} %`;
}

/** A difference of two shares in percentage points: 0.0399 → "+4.0 points", -0.012 → "−1.2 points". */
export function formatPoints(difference: number | null | undefined): string {
  if (difference === null || difference === undefined || !Number.isFinite(difference)) return "–";
  const points = difference * 100;
  const text = formatFixed(Math.abs(points), 1);
  if (text === "0.0") return "0.0 points";
  return `${points > 0 ? "+" : "−"}${text} points`;
}

/** Scores run 0–100; one decimal is finer than any difference worth acting on. */
export function formatScore(score: number | null | undefined): string {
  if (score === null || score === undefined || !Number.isFinite(score)) return "–";
  return formatFixed(score, 1);
}

export function roundTo(value: number | null | undefined, decimals: number): number | null {
  if (value === null || value === undefined || !Number.isFinite(value)) return null;
  return roundHalf(value, decimals);
}

/**
 * What a hidden group says instead of its value: never a zero that looks like a result. A group may be
 * hidden for its own size, for the few instructors in it, or because it would give a smaller one away, so
 * the words name no count; `suppressionTitle` explains the rule.
 */
export function suppressedText(_minCount: number): string {
  return "too few to show";
}

/** The rule behind a hidden value, for a tooltip. */
export function suppressionTitle(minCount: number): string {
  return `Hidden to protect learners and colleagues: a group is shown only with at least ${minCount} attempts of others from enough other instructors, and never when another figure would give a smaller group away.`;
}

/** A rate as one line: "29.5 % (95 % interval 27.1–31.9 %)", or why it has no value. */
export function describeRate(rate: Rate, minCount: number): string {
  if (rate.suppressed) return suppressedText(minCount);
  if (rate.rate === null) return "no attempts";
  return `${formatPercent(rate.rate)} (95 % interval ${formatInterval(rate.low, rate.high)})`;
}

/**
 * Words for Cohen's kappa, from the bands of Landis JR, Koch GG. The measurement of observer agreement for
 * categorical data. Biometrics 1977;33:159–174 (below 0 poor, to 0.20 slight, to 0.40 fair, to 0.60
 * moderate, to 0.80 substantial, above almost perfect).
 */
export function kappaWords(kappa: number | null | undefined): string {
  if (kappa === null || kappa === undefined || !Number.isFinite(kappa)) return "not enough pairs";
  if (kappa < 0) return "poor agreement";
  if (kappa <= 0.2) return "slight agreement";
  if (kappa <= 0.4) return "fair agreement";
  if (kappa <= 0.6) return "moderate agreement";
  if (kappa <= 0.8) return "substantial agreement";
  return "almost perfect agreement";
}

/** Where a pass rate sits on the funnel, in words a coordinator can act on. */
export const funnelPositionWords: Record<FunnelPosition, string> = {
  inside: "Within the expected range",
  above95: "Higher than expected (outside 95 % limit)",
  above998: "Well above the network (outside 99.8 % limit)",
  below95: "Lower than expected (outside 95 % limit)",
  below998: "Well below the network (outside 99.8 % limit)",
};

/** The same, short enough for a table column. */
export const funnelPositionShort: Record<FunnelPosition, string> = {
  inside: "Expected range",
  above95: "Above (95 % limit)",
  above998: "Well above (99.8 % limit)",
  below95: "Below (95 % limit)",
  below998: "Well below (99.8 % limit)",
};

export function funnelPositionText(position: FunnelPosition | null | undefined): string {
  return position ? funnelPositionWords[position] : "No attempts to place";
}
