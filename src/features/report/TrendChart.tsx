// The report's quarter-by-quarter pass rate: each quarter with its 95 % interval, the centre line and the
// range chance alone would give (3-sigma control limits). Drawn like the overview's control chart so the
// two read alike; hidden quarters leave a gap and say so in the table.
import * as Plot from "@observablehq/plot";
import { useCallback } from "react";
import type { ReportData, TrendPoint } from "../../../shared/schemas/report";
import { Chart, type ChartSize } from "../../components/Chart";
import type { Column } from "../../components/DataTable";
import { ChartLegend, lineSwatch, shapeSwatch } from "../insight/ChartLegend";
import { ink, percentTick, shareAxisTop } from "../insight/chartStyle";
import { formatShare } from "./figures";
import { quarterLabel } from "../../../shared/period";
import { trendBaselineText } from "../../../shared/reportTrend";

type Trend = ReportData["trend"];

interface PlotPoint {
  quarter: string;
  rate: number;
  low: number | null;
  high: number | null;
  lcl: number | null;
  ucl: number | null;
  outside: boolean;
}

function side(point: TrendPoint): "above" | "below" | null {
  if (!point.outside || point.passRate.value === null) return null;
  return point.ucl !== null && point.passRate.value > point.ucl ? "above" : "below";
}

export function describeTrend(trend: Trend): string {
  const shown = trend.points.filter((p) => p.passRate.value !== null);
  if (shown.length === 0) return "No quarter in this range has a pass rate to chart.";
  const first = shown[0];
  const last = shown[shown.length - 1];
  const parts = [
    `Share of measured attempts that met the pass rule, from ${first.passRate.text} in ${quarterLabel(first.quarter)} to ${last.passRate.text} in ${quarterLabel(last.quarter)}` +
      (trend.centre === null
        ? "."
        : trend.baseline === undefined
          ? `, around an average of ${formatShare(trend.centre)}.`
          : `, around a centre line of ${formatShare(trend.centre)}.`),
  ];
  const baseline = trendBaselineText(trend);
  if (baseline) parts.push(baseline);
  const outside = shown.filter((p) => p.outside);
  if (outside.length === 0) parts.push("Every quarter stays within the range that chance alone would give.");
  else {
    const above = outside.filter((p) => side(p) === "above").map((p) => quarterLabel(p.quarter));
    const below = outside.filter((p) => side(p) === "below").map((p) => quarterLabel(p.quarter));
    const words = [above.length ? `above it in ${above.join(", ")}` : "", below.length ? `below it in ${below.join(", ")}` : ""].filter(Boolean);
    parts.push(`${outside.length} of ${shown.length} quarters lie outside the range chance alone would give (${words.join("; ")}).`);
  }
  const hidden = trend.points.filter((p) => p.passRate.hidden !== null).length;
  const empty = trend.points.length - shown.length - hidden;
  if (hidden > 0) parts.push(`${hidden} quarter${hidden === 1 ? " is" : "s are"} hidden to protect small groups.`);
  if (empty > 0) parts.push(`${empty} quarter${empty === 1 ? " has" : "s have"} no measured attempts.`);
  return parts.join(" ");
}

const columns: Column<TrendPoint>[] = [
  { key: "quarter", header: "Quarter", value: (p) => p.quarter, render: (p) => quarterLabel(p.quarter) },
  { key: "attempts", header: "Attempts", value: (p) => p.passRate.n.text, align: "right" },
  { key: "rate", header: "Pass rate", value: (p) => p.passRate.text, align: "right" },
  { key: "interval", header: "95 % interval", value: (p) => p.passRate.intervalText, sortable: false, align: "right" },
  { key: "lcl", header: "Lower limit", value: (p) => (p.lcl === null ? "" : formatShare(p.lcl)), align: "right" },
  { key: "ucl", header: "Upper limit", value: (p) => (p.ucl === null ? "" : formatShare(p.ucl)), align: "right" },
  {
    key: "outside",
    header: "Outside the limits",
    value: (p) => (p.passRate.value === null ? "" : side(p) === "above" ? "Yes, above" : side(p) === "below" ? "Yes, below" : "No"),
  },
];

export function TrendChart({ trend }: { trend: Trend }) {
  const centre = trend.centre;
  const plot = useCallback(
    (points: readonly TrendPoint[], { width }: ChartSize): Plot.PlotOptions => {
      const shown: PlotPoint[] = points
        .filter((p) => p.passRate.value !== null)
        .map((p) => ({ quarter: p.quarter, rate: p.passRate.value!, low: p.passRate.low, high: p.passRate.high, lcl: p.lcl, ucl: p.ucl, outside: p.outside }));
      const outside = shown.filter((p) => p.outside);
      const narrow = width < 500;
      // On a phone eight quarters only fit as two short lines: "Q3" over "2026".
      const tick = (q: string) => (narrow ? `${q.slice(5)}\n${q.slice(0, 4)}` : quarterLabel(q));
      return {
        height: narrow ? 260 : 320,
        marginLeft: 48,
        marginRight: narrow ? 12 : 80,
        marginTop: 24,
        marginBottom: narrow ? 40 : 30,
        x: { type: "point", domain: points.map((p) => p.quarter), tickFormat: tick, label: null, padding: 0.4 },
        y: { domain: [0, shareAxisTop(shown.flatMap((p) => [p.ucl, p.high, p.rate]))], tickFormat: percentTick, label: "Pass rate", grid: true },
        marks: [
          centre === null ? null : Plot.ruleY([centre], { stroke: ink.main, strokeWidth: 1.5 }),
          narrow || centre === null
            ? null
            : Plot.text([centre], {
                x: points[points.length - 1].quarter,
                y: (c: number) => c,
                text: () => `${trend.baseline === undefined ? "average" : "centre"} ${formatShare(centre)}`,
                dx: 10,
                textAnchor: "start",
                fill: ink.text,
              }),
          Plot.line(shown, { x: "quarter", y: "ucl", curve: "step", stroke: ink.limit, strokeDasharray: "5 4" }),
          Plot.line(shown, { x: "quarter", y: "lcl", curve: "step", stroke: ink.limit, strokeDasharray: "5 4" }),
          Plot.ruleX(shown, { x: "quarter", y1: "low", y2: "high", stroke: ink.soft, strokeWidth: 3 }),
          Plot.line(shown, { x: "quarter", y: "rate", stroke: ink.main, strokeWidth: 1.5 }),
          Plot.dot(
            shown.filter((p) => !p.outside),
            { x: "quarter", y: "rate", r: 4.5, fill: ink.main, stroke: "white", title: (p: PlotPoint) => `${quarterLabel(p.quarter)}: ${formatShare(p.rate)}` },
          ),
          Plot.dot(outside, {
            x: "quarter",
            y: "rate",
            symbol: "diamond",
            r: 7,
            fill: ink.accent,
            stroke: ink.text,
            strokeWidth: 1.5,
            title: (p: PlotPoint) => `${quarterLabel(p.quarter)}: ${formatShare(p.rate)}, outside the range chance would give`,
          }),
        ],
      };
    },
    [centre, trend.baseline],
  );

  return (
    <Chart
      title="Pass rate quarter by quarter"
      description={describeTrend(trend)}
      data={trend.points}
      columns={columns}
      rowKey={(p) => p.quarter}
      plot={plot}
      exportFileName="funder-report-pass-rate-by-quarter"
      legend={
        <ChartLegend
          items={[
            {
              label: "Pass rate (bar: 95 % interval)",
              swatch: (
                <>
                  <path d="M12 0v12" stroke={ink.soft} strokeWidth="3" />
                  {shapeSwatch("circle", ink.main, "white")}
                </>
              ),
            },
            { label: "Average of the quarters shown", swatch: lineSwatch(ink.main) },
            { label: "Range chance alone would give (control limits)", swatch: lineSwatch(ink.limit, "5 4") },
            { label: "Outside that range", swatch: shapeSwatch("diamond", ink.accent, ink.text) },
          ]}
        />
      }
    />
  );
}
