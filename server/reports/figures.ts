// Turns raw counts into the report's figures: the value when it may be shown, the reason when not, and the
// display text the web page and the PDF both print.
import { wilsonInterval } from "../../shared/stats";
import type { CountFigure, HiddenReason, PerHundredFigure, RateFigure } from "../../shared/schemas/report";
import { isSmall } from "../../shared/suppression";

export function hiddenText(reason: HiddenReason, minCount: number): string {
  return reason === "small" ? `fewer than ${minCount}` : "not shown";
}

/** 1234 → "1,234" (fixed separator, so the text is the same on every machine). */
export function formatCount(value: number): string {
  return Math.round(value)
    .toString()
    .replace(/\B(?=(\d{3})+(?!\d))/g, ",");
}

/** 0.6823 → "68.2 %" */
export function formatPercent(share: number): string {
  return `${(share * 100).toFixed(1)} %`;
}

/** [0.61, 0.746] → "61.0–74.6 %" */
export function formatInterval(low: number, high: number): string {
  return `${(low * 100).toFixed(1)}–${(high * 100).toFixed(1)} %`;
}

/** +6.8 → "6.8 percentage points" */
export function formatPoints(points: number): string {
  const size = Math.abs(points).toFixed(1);
  return `${size} percentage ${size === "1.0" ? "point" : "points"}`;
}

/** What a figure of nothing reads: no activity is not a small group, so it is never "fewer than". */
export const NO_DATA = "no data";

/** What a hidden rate or per-100 figure reads: its denominator group is hidden, and the rate is no count. */
export const HIDDEN_RATE = "hidden";

/** The primary rule alone: a count of 1 to min − 1 describes a small group. */
export function primaryReason(value: number, minCount: number): HiddenReason | null {
  return value > 0 && isSmall(value, minCount) ? "small" : null;
}

/**
 * A count of people or their activity. Hidden as the report family's decision says (`decided`), or by the
 * primary rule when no decision covers it; zero reads "no data".
 */
export function countFigure(value: number, minCount: number, decided?: HiddenReason | null): CountFigure {
  const hidden = decided !== undefined ? decided : primaryReason(value, minCount);
  if (hidden) return { value: null, hidden, text: hiddenText(hidden, minCount) };
  return { value, hidden: null, text: value === 0 ? NO_DATA : formatCount(value) };
}

/** A count that describes no person (sites, manikins, services, faults): always shown. */
export function plainCount(value: number): CountFigure {
  return { value, hidden: null, text: formatCount(value) };
}

/**
 * A proportion `successes / n` with its Wilson 95 % interval. Hidden exactly when its group of n is hidden
 * (`decided`, or the primary rule on n), and then it reads "hidden": a rate is never "fewer than" anything.
 */
export function rateFigure(successes: number, n: number, minCount: number, decided?: HiddenReason | null): RateFigure {
  const count = countFigure(n, minCount, decided);
  const hidden = count.hidden;
  if (hidden) return { value: null, low: null, high: null, n: count, hidden, text: HIDDEN_RATE, intervalText: "" };
  const interval = wilsonInterval(successes, n);
  if (!interval) return { value: null, low: null, high: null, n: count, hidden: null, text: NO_DATA, intervalText: "" };
  const value = successes / n;
  return {
    value,
    low: interval[0],
    high: interval[1],
    n: count,
    hidden: null,
    text: formatPercent(value),
    intervalText: formatInterval(interval[0], interval[1]),
  };
}

/**
 * Events per 100 learners. The events (consumables) describe no person, so only the learners can hide it:
 * when their count is hidden (`decided`, or the primary rule), the figure reads "hidden".
 */
export function perHundredFigure(events: number | null, learners: number, minCount: number, decided?: HiddenReason | null): PerHundredFigure {
  if (events === null) return { value: null, hidden: null, text: "not recorded" };
  const hidden = decided !== undefined ? decided : primaryReason(learners, minCount);
  if (hidden) return { value: null, hidden, text: HIDDEN_RATE };
  if (learners === 0) return { value: null, hidden: null, text: NO_DATA };
  const value = (events / learners) * 100;
  return { value, hidden: null, text: value.toFixed(1) };
}
