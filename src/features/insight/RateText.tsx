// A pass rate in a table cell or a sentence: the rate, its 95 % interval beside or under it, or why there is
// none.
import type { Rate } from "../../../shared/schemas/insight";
import { formatInterval, formatPercent } from "./format";
import { Suppressed } from "./Suppressed";

export function RateText({ rate, minCount = 5, stacked = true }: { rate: Rate; minCount?: number; stacked?: boolean }) {
  if (rate.suppressed) return <Suppressed minCount={minCount} />;
  if (rate.rate === null) return <span className="text-muted">no attempts</span>;
  if (!stacked) {
    return (
      <span className="tabular-nums">
        <span className="font-medium">{formatPercent(rate.rate)}</span>{" "}
        <span className="text-muted">(95 % interval {formatInterval(rate.low, rate.high)})</span>
      </span>
    );
  }
  return (
    <span className="inline-flex flex-col items-end leading-tight">
      <span className="font-medium tabular-nums">{formatPercent(rate.rate)}</span>
      <span className="text-caption text-muted tabular-nums">
        <span className="sr-only">95 % interval </span>
        {formatInterval(rate.low, rate.high)}
      </span>
    </span>
  );
}
