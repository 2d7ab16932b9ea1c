// How the drill-down pages write errors and numbers (dates and counts: src/lib/formatting.ts); the words themselves are in shared/vocabulary.
import { formatCount } from "../../lib/formatting";
import type { AttemptError } from "../../../shared/scoring/scoreAttempt";
import { errorLabels } from "../../../shared/vocabulary";

export function errorLabel(error: AttemptError): string {
  return errorLabels[error];
}

/** A share 0–1 as "41.8 %"; null as "–". */
export function percent(share: number | null | undefined, decimals = 1): string {
  if (share === null || share === undefined || !Number.isFinite(share)) return "–";
  return `${(share * 100).toFixed(decimals)} %`;
}

/** A percentage already 0–100 as "41.8 %". */
export function percentOf100(value: number | null | undefined, decimals = 0): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return "–";
  return `${value.toFixed(decimals)} %`;
}

/**
 * How many decimals (from `minDecimals`, at most 4) a value compared with a threshold needs so that, written,
 * it falls on the same side of the threshold as the value itself and equals it only when the value does, and
 * its difference from the threshold, written with as many decimals, keeps its sign: 69.6 against a pass mark
 * of 70 is written 69.6 (margin −0.4), never 70, and 70.04 is written 70.04 (margin +0.04).
 */
export function decisiveDecimals(value: number, threshold: number, minDecimals = 0): number {
  if (!Number.isFinite(value) || !Number.isFinite(threshold)) return minDecimals;
  const side = Math.sign(value - threshold);
  for (let decimals = minDecimals; decimals < 4; decimals += 1) {
    const written = Number(value.toFixed(decimals));
    const margin = Number((value - threshold).toFixed(decimals));
    if (Math.sign(written - threshold) === side && Math.sign(margin) === side) return decimals;
  }
  return 4;
}

/** A value beside its threshold, with the decimals that keep it on its side ("69.6"). */
export function besideThreshold(value: number, threshold: number, minDecimals = 0): string {
  return value.toFixed(decisiveDecimals(value, threshold, minDecimals));
}

/**
 * How far a value is from its threshold, in words that say which side is good: "0.4 short" of an "at least"
 * mark, "0.4 over" an "at most" limit, "14 to spare" when met, "exactly on the mark" when equal; written with
 * the decimals that keep it from reading as zero.
 */
export function marginWords(value: number, threshold: number, comparison: "atLeast" | "atMost", unit: string, minDecimals = 0): string {
  const difference = value - threshold;
  if (difference === 0) return "exactly on the mark";
  const amount = Math.abs(difference).toFixed(decisiveDecimals(value, threshold, minDecimals));
  const written = `${amount} ${amount === "1" && unit === "points" ? "point" : unit}`;
  const met = comparison === "atLeast" ? difference > 0 : difference < 0;
  return met ? `${written} to spare` : `${written} ${comparison === "atLeast" ? "short" : "over"}`;
}

/** 1 → "1st", 22 → "22nd", 13 → "13th". */
export function ordinal(n: number): string {
  const tens = n % 100;
  const suffix = tens >= 11 && tens <= 13 ? "th" : n % 10 === 1 ? "st" : n % 10 === 2 ? "nd" : n % 10 === 3 ? "rd" : "th";
  return `${n}${suffix}`;
}

/** A share 0–1 rounded to a number of percent with one decimal, for tables and CSV. */
export function percentNumber(share: number | null | undefined): number | null {
  if (share === null || share === undefined || !Number.isFinite(share)) return null;
  return Math.round(share * 1000) / 10;
}

export function wholeNumber(value: number | null | undefined): string {
  return formatCount(value === null || value === undefined ? value : Math.round(value));
}
