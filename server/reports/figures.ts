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

/** A count, hidden by the primary rule unless a breakdown decided otherwise. */
export function countFigure(value: number, minCount: number, decided?: HiddenReason | null): CountFigure {
  const hidden = decided !== undefined ? decided : isSmall(value, minCount) ? "small" : null;
  if (hidden) return { value: null, hidden, text: hiddenText(hidden, minCount) };
  return { value, hidden: null, text: formatCount(value) };
}

/**
 * A proportion `successes / n` with its Wilson 95 % interval. Hidden when n is below the threshold or when
 * the group's count is hidden for another reason (`decided`).
 */
export function rateFigure(successes: number, n: number, minCount: number, decided?: HiddenReason | null): RateFigure {
  const count = countFigure(n, minCount, decided);
  const hidden = count.hidden;
  if (hidden) return { value: null, low: null, high: null, n: count, hidden, text: hiddenText(hidden, minCount), intervalText: "" };
  const interval = wilsonInterval(successes, n);
  if (!interval) return { value: null, low: null, high: null, n: count, hidden: null, text: "no attempts", intervalText: "" };
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

/** Events per 100 learners; hidden when the learners or the events are below the threshold (either would let the other be worked out). */
export function perHundredFigure(events: number | null, learners: number, minCount: number): PerHundredFigure {
  if (events === null) return { value: null, hidden: null, text: "not recorded" };
  if (isSmall(learners, minCount) || isSmall(events, minCount)) {
    return { value: null, hidden: "small", text: hiddenText("small", minCount) };
  }
  if (learners === 0) return { value: null, hidden: null, text: "no learners" };
  const value = (events / learners) * 100;
  return { value, hidden: null, text: value.toFixed(1) };
}
