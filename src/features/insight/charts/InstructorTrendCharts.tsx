// One instructor quarter by quarter: pass rate with its 95 % interval beside the network's rate, and the
// median score. Quarters without attempts leave a gap, never a zero.
import { Y_TITLE_MARGIN_TOP } from "./axisSpace";
import * as Plot from "@observablehq/plot";
import { useCallback } from "react";
import type { InstructorDetailAnswer } from "../../../../shared/schemas/insight";
import { Chart, type ChartSize } from "../../../components/Chart";
import type { Column } from "../../../components/DataTable";
import { ChartLegend, lineSwatch, shapeSwatch } from "../ChartLegend";
import { ink, percentTick, quarterTick, shareAxisTop } from "../chartStyle";
import { formatCount, formatInterval, formatPercent, formatScore, percentValue, roundTo } from "../format";
import { quarterLabel } from "../../../../shared/period";

export interface TrendRow {
  quarter: string;
  passRate: InstructorDetailAnswer["trend"][number]["passRate"];
  medianScore: number | null;
  /** The network's pass rate that quarter, with the same filters; null when not known. */
  network: number | null;
}

export function describeTrend(rows: readonly TrendRow[], who: string): string {
  const withData = rows.filter((r) => r.passRate.rate !== null);
  if (withData.length === 0) return `${who} has no attempts in these quarters.`;
  const first = withData[0];
  const last = withData[withData.length - 1];
  let text = `${who}'s pass rate went from ${formatPercent(first.passRate.rate)} in ${quarterLabel(first.quarter)} to ${formatPercent(last.passRate.rate)} in ${quarterLabel(last.quarter)}`;
  text += last.network !== null ? ` (network then: ${formatPercent(last.network)}).` : ".";
  const empty = rows.length - withData.length;
  if (empty > 0) text += ` ${empty} quarter${empty === 1 ? " has" : "s have"} no attempts.`;
  return text;
}

export const trendColumns: Column<TrendRow>[] = [
  { key: "quarter", header: "Quarter", value: (r) => r.quarter, render: (r) => quarterLabel(r.quarter) },
  { key: "attempts", header: "Attempts", value: (r) => r.passRate.n, render: (r) => formatCount(r.passRate.n), align: "right" },
  {
    key: "rate",
    header: "Pass rate (%)",
    value: (r) => percentValue(r.passRate.rate),
    render: (r) => (r.passRate.rate === null ? "no attempts" : formatPercent(r.passRate.rate)),
    align: "right",
  },
  {
    key: "interval",
    header: "95 % interval",
    value: (r) => (r.passRate.low === null ? null : formatInterval(r.passRate.low, r.passRate.high)),
    sortable: false,
    align: "right",
  },
  { key: "network", header: "Network pass rate (%)", value: (r) => percentValue(r.network), render: (r) => formatPercent(r.network), align: "right" },
  { key: "median", header: "Median score", value: (r) => roundTo(r.medianScore, 1), render: (r) => formatScore(r.medianScore), align: "right" },
];

export function PassRateTrendChart({ rows, who }: { rows: readonly TrendRow[]; who: string }) {
  const plot = useCallback((data: readonly TrendRow[], { width }: ChartSize): Plot.PlotOptions => {
    const shown = data
      .filter((r) => r.passRate.rate !== null)
      .map((r) => ({ quarter: r.quarter, rate: r.passRate.rate, low: r.passRate.low, high: r.passRate.high }));
    const network = data.filter((r) => r.network !== null);
    const top = shareAxisTop([...shown.map((r) => r.high), ...network.map((r) => r.network)]);
    return {
      height: width < 500 ? 260 : 300,
      marginLeft: 48,
      marginRight: 16,
      marginTop: Y_TITLE_MARGIN_TOP,
      marginBottom: width < 560 ? 40 : 30,
      x: { type: "point", domain: data.map((r) => r.quarter), tickFormat: quarterTick(width), label: null, padding: 0.4 },
      y: { domain: [0, top], tickFormat: percentTick, label: "Measured pass rate", grid: true },
      marks: [
        Plot.line(network, { x: "quarter", y: "network", stroke: ink.network, strokeDasharray: "6 4", strokeWidth: 1.5 }),
        Plot.dot(network, { x: "quarter", y: "network", symbol: "square", r: 3, fill: ink.network }),
        Plot.ruleX(shown, { x: "quarter", y1: "low", y2: "high", stroke: ink.soft, strokeWidth: 3 }),
        Plot.line(shown, { x: "quarter", y: "rate", stroke: ink.main, strokeWidth: 2 }),
        Plot.dot(shown, {
          x: "quarter",
          y: "rate",
          r: 5,
          fill: ink.main,
          stroke: "white",
          title: (r: { quarter: string; rate: number }) => `${quarterLabel(r.quarter)}: ${formatPercent(r.rate)}`,
        }),
      ],
    };
  }, []);
  return (
    <Chart
      title="Pass rate by quarter"
      description={describeTrend(rows, who)}
      data={rows}
      columns={trendColumns}
      rowKey={(r) => r.quarter}
      plot={plot}
      exportFileName="instructor-pass-rate-by-quarter"
      legend={
        <ChartLegend
          items={[
            {
              label: `${who} (bar: 95 % interval)`,
              swatch: (
                <>
                  <path d="M12 0v12" stroke={ink.soft} strokeWidth="3" />
                  {shapeSwatch("circle", ink.main, "white")}
                </>
              ),
            },
            {
              label: "Network",
              swatch: (
                <>
                  {lineSwatch(ink.network, "6 4", 1.5)}
                  <rect x="10" y="4" width="4" height="4" fill={ink.network} />
                </>
              ),
            },
          ]}
        />
      }
    />
  );
}

const scoreColumns: Column<TrendRow>[] = [
  trendColumns[0],
  trendColumns[1],
  {
    key: "median",
    header: "Median score",
    value: (r) => roundTo(r.medianScore, 1),
    render: (r) => (r.medianScore === null ? "no attempts" : formatScore(r.medianScore)),
    align: "right",
  },
];

export function describeScores(rows: readonly TrendRow[], who: string): string {
  const withData = rows.filter((r) => r.medianScore !== null);
  if (withData.length === 0) return `${who} has no attempts in these quarters.`;
  const first = withData[0];
  const last = withData[withData.length - 1];
  return `${who}'s median score went from ${formatScore(first.medianScore)} in ${quarterLabel(first.quarter)} to ${formatScore(last.medianScore)} in ${quarterLabel(last.quarter)}, out of 100.`;
}

export function MedianScoreTrendChart({ rows, who }: { rows: readonly TrendRow[]; who: string }) {
  const plot = useCallback((data: readonly TrendRow[], { width }: ChartSize): Plot.PlotOptions => {
    const shown = data.filter((r) => r.medianScore !== null);
    const low = Math.max(0, Math.floor((Math.min(100, ...shown.map((r) => r.medianScore!)) - 10) / 10) * 10);
    return {
      height: width < 500 ? 240 : 280,
      marginLeft: 48,
      marginRight: 16,
      marginTop: Y_TITLE_MARGIN_TOP,
      marginBottom: width < 560 ? 40 : 30,
      x: { type: "point", domain: data.map((r) => r.quarter), tickFormat: quarterTick(width), label: null, padding: 0.4 },
      y: { domain: [low, 100], label: "Median score", grid: true },
      marks: [
        Plot.line(shown, { x: "quarter", y: "medianScore", stroke: ink.main, strokeWidth: 2 }),
        Plot.dot(shown, { x: "quarter", y: "medianScore", r: 5, fill: ink.main, stroke: "white" }),
        Plot.text(shown, { x: "quarter", y: "medianScore", text: (r: TrendRow) => formatScore(r.medianScore), dy: -12, fill: ink.text }),
      ],
    };
  }, []);
  return (
    <Chart
      title="Median score by quarter"
      description={describeScores(rows, who)}
      data={rows}
      columns={scoreColumns}
      rowKey={(r) => r.quarter}
      plot={plot}
      exportFileName="instructor-median-score-by-quarter"
    />
  );
}
