// How the report's figures read on the page. The API already made each figure's text ("68.2 %",
// "fewer than 5", "not shown", "hidden" for a rate, "no data"), the same words as the PDF; these helpers only add layout and the reason a
// figure is hidden.
import { formatCount, formatDecimal } from "../../lib/formatting";
import clsx from "clsx";
import type { CountFigure, HiddenReason, PerHundredFigure, RateFigure } from "../../../shared/schemas/report";

export const hiddenReasons: Record<HiddenReason, string> = {
  small: "hidden because it comes from too few people or events to show without risk of identifying someone.",
  "protects-other": "hidden so that figures shown here or in another quarter's or year's report cannot give away a small figure by subtraction.",
};

/** A count, per-100 figure or rate's text; hidden ones are muted and say why on hover and to screen readers. */
export function FigureText({ figure, className }: { figure: CountFigure | PerHundredFigure | RateFigure; className?: string }) {
  if (!figure.hidden) return <span className={clsx("tabular-nums", className)}>{figure.text}</span>;
  return (
    <span className={clsx("text-muted italic", className)} title={`This figure is ${hiddenReasons[figure.hidden]}`}>
      {figure.text}
    </span>
  );
}

/** "38.1 % (95 % interval 34.9–41.4 %)", or the hidden text alone. */
export function rateWithInterval(rate: RateFigure): string {
  if (rate.hidden || !rate.intervalText) return rate.text;
  return `${rate.text} (95 % interval ${rate.intervalText})`;
}

/** A share 0–1 as "36.7 %"; "–" when missing. */
export function formatShare(share: number | null): string {
  return share === null ? "–" : `${formatDecimal(share * 100, 1)} %`;
}

export function formatWhole(value: number | null): string {
  return formatCount(value);
}

/** Signed percentage points, "+16.2 points", "−0.3 points". */
export function formatPoints(points: number): string {
  const sign = points > 0 ? "+" : points < 0 ? "−" : "±";
  return `${sign}${formatDecimal(Math.abs(points), 1)} percentage points`;
}

/** The size of a change in percentage points, without its sign: "17.4 percentage points". */
export function formatPointsSize(points: number): string {
  return `${formatDecimal(Math.abs(points), 1)} percentage points`;
}
