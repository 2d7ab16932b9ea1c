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
 * A value written beside the threshold it is judged against, with as many decimals as it takes for the
 * written value to fall on the same side as the value itself: 69.6 against "at least 70" is written 69.6,
 * never 70 (which would seem to pass), and 70 stays 70.
 */
export function beside(
  value: number,
  threshold: number | undefined,
  meets: (written: number, threshold: number) => boolean,
  minDecimals = 0,
): string {
  if (threshold === undefined || !Number.isFinite(value)) return value.toFixed(minDecimals);
  const passes = meets(value, threshold);
  for (let decimals = minDecimals; decimals < 4; decimals += 1) {
    const written = value.toFixed(decimals);
    if (meets(Number(written), threshold) === passes) return written;
  }
  return value.toFixed(4);
}

export const atLeast = (value: number, threshold: number) => value >= threshold;
export const atMost = (value: number, threshold: number) => value <= threshold;

/** A percentage 0–100 beside an "at least" threshold, e.g. "69.6 %". */
export function percentBeside(value: number, min: number | undefined): string {
  return `${beside(value, min, atLeast)} %`;
}

/** A share 0–1 rounded to a number of percent with one decimal, for tables and CSV. */
export function percentNumber(share: number | null | undefined): number | null {
  if (share === null || share === undefined || !Number.isFinite(share)) return null;
  return Math.round(share * 1000) / 10;
}

export function wholeNumber(value: number | null | undefined): string {
  return formatCount(value === null || value === undefined ? value : Math.round(value));
}
