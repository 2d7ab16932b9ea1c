// Live display against hidden display: the pass rate of attempts where learners saw depth and rate while
// compressing, beside attempts where the display was hidden.
import { useCallback } from "react";
import type { z } from "zod";
import type { feedbackGroupSchema } from "../../../../shared/schemas/insight";
import { Chart, type ChartSize } from "../../../components/Chart";
import type { Column } from "../../../components/DataTable";
import { ChartLegend, shapeSwatch } from "../ChartLegend";
import { ink } from "../chartStyle";
import { describeRate, formatCount, formatInterval, formatPercent, formatPoints, formatScore, percentValue, suppressedText } from "../format";
import { intervalBarsPlot } from "./intervalPlot";
import { NothingToChart } from "./NothingToChart";
import { feedbackNames } from "../../../../shared/vocabulary";
import { changeVerdict, proportionDifference } from "../../../../shared/stats/difference";

export type FeedbackGroup = z.infer<typeof feedbackGroupSchema>;

export function describeFeedback(groups: readonly FeedbackGroup[], minCount: number): string {
  const live = groups.find((g) => g.mode === "live");
  const hidden = groups.find((g) => g.mode === "hidden");
  const part = (g: FeedbackGroup | undefined) =>
    !g || (!g.suppressed && g.passRate.rate === null)
      ? "there were no attempts"
      : g.suppressed
        ? `the figures are hidden (${suppressedText(minCount)})`
        : `the pass rate was ${describeRate(g.passRate, minCount)} over ${formatCount(g.attempts)} attempts`;
  let text = `With the display live, ${part(live)}; with it hidden, ${part(hidden)}.`;
  if (live?.passRate.rate != null && hidden?.passRate.rate != null) {
    const gap = live.passRate.rate - hidden.passRate.rate;
    text += ` Live display is ${formatPoints(Math.abs(gap)).replace("+", "")} ${gap >= 0 ? "higher" : "lower"}.`;
    // the same test of a difference as everywhere else (shared/stats/difference)
    const { successes: x1, n: n1 } = live.passRate;
    const { successes: x2, n: n2 } = hidden.passRate;
    const difference = x1 !== null && n1 !== null && x2 !== null && n2 !== null ? proportionDifference(x1, n1, x2, n2) : null;
    if (difference) {
      const verdict = changeVerdict(difference);
      text +=
        verdict === "no clear change"
          ? " The 95 % interval of the difference includes no difference: the gap may be chance."
          : ` The 95 % interval of the difference lies wholly ${verdict === "up" ? "above" : "below"} zero: learners do clearly ${verdict === "up" ? "better" : "worse"} while they can see the display.`;
    }
  }
  return text;
}

export function feedbackColumns(minCount: number): Column<FeedbackGroup>[] {
  const hidden = suppressedText(minCount);
  return [
    { key: "mode", header: "Display", value: (g) => feedbackNames[g.mode] },
    { key: "attempts", header: "Attempts", value: (g) => g.attempts, render: (g) => (g.suppressed ? hidden : formatCount(g.attempts)), align: "right" },
    {
      key: "rate",
      header: "Pass rate (%)",
      value: (g) => percentValue(g.passRate.rate),
      render: (g) => (g.suppressed ? hidden : formatPercent(g.passRate.rate)),
      align: "right",
    },
    {
      key: "interval",
      header: "95 % interval",
      value: (g) => (g.passRate.low === null ? null : formatInterval(g.passRate.low, g.passRate.high)),
      sortable: false,
      align: "right",
    },
    {
      key: "median",
      header: "Median score",
      value: (g) => (g.medianScore === null ? null : Math.round(g.medianScore * 10) / 10),
      render: (g) => (g.suppressed ? hidden : formatScore(g.medianScore)),
      align: "right",
    },
  ];
}

export function FeedbackComparisonChart({ groups, minCount }: { groups: readonly FeedbackGroup[]; minCount: number }) {
  const plot = useCallback(
    (rows: readonly FeedbackGroup[], size: ChartSize) =>
      intervalBarsPlot(
        rows.map((g) => ({
          label: feedbackNames[g.mode],
          shortLabel: g.mode === "live" ? "Live" : "Hidden",
          rate: g.passRate.rate,
          low: g.passRate.low,
          high: g.passRate.high,
          fill: g.mode === "live" ? ink.main : ink.soft,
        })),
        size,
        120,
      ),
    [],
  );
  if (groups.every((g) => g.passRate.rate === null)) {
    return <NothingToChart title="Live display against hidden display" text={describeFeedback(groups, minCount)} />;
  }
  return (
    <Chart
      title="Live display against hidden display"
      description={describeFeedback(groups, minCount)}
      data={groups}
      columns={feedbackColumns(minCount)}
      rowKey={(g) => g.mode}
      plot={plot}
      exportFileName="pass-rate-by-display"
      legend={
        <ChartLegend
          items={[
            { label: "Live display", swatch: shapeSwatch("bar", ink.main) },
            { label: "Hidden display", swatch: shapeSwatch("bar", ink.soft) },
            { label: "95 % interval", swatch: <path d="M3 6h18M3 2v8M21 2v8" stroke={ink.text} strokeWidth="1.5" fill="none" /> },
          ]}
        />
      }
    />
  );
}
