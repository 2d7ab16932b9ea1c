// One error's share of attempts per quarter with its 95 % interval, so a real change can be told from noise.
import * as Plot from "@observablehq/plot";
import { useCallback } from "react";
import type { ActionMark } from "../../../shared/schemas/actions";
import { actionMarkLayers, describeActionMarks } from "../actions/chartMarks";
import type { TechniqueErrorsAnswer } from "../../../shared/schemas/insight";
import { Chart, type ChartSize } from "../../components/Chart";
import type { Column } from "../../components/DataTable";
import { dusk } from "../../styles/palette";
import { changeVerdict, proportionDifference } from "../../../shared/stats/difference";
import { percent, percentNumber } from "../attempts/labels";
import { quarterLabel } from "../../../shared/period";

type TrendRow = NonNullable<TechniqueErrorsAnswer["selected"]>["trend"][number];

const columns: Column<TrendRow>[] = [
  { key: "quarter", header: "Quarter", value: (row) => row.quarter },
  { key: "attempts", header: "Attempts", value: (row) => row.attempts, align: "right" },
  { key: "count", header: "With the error", value: (row) => row.count, align: "right" },
  { key: "share", header: "Share (%)", value: (row) => percentNumber(row.share), render: (row) => percent(row.share), align: "right" },
  { key: "low", header: "95 % interval from (%)", value: (row) => percentNumber(row.low), render: (row) => percent(row.low), align: "right" },
  { key: "high", header: "95 % interval to (%)", value: (row) => percentNumber(row.high), render: (row) => percent(row.high), align: "right" },
];

function trendPlot(
  data: readonly TrendRow[],
  { width }: ChartSize,
  actions: readonly ActionMark[],
  quarterHref?: (quarter: string) => string,
): Plot.PlotOptions {
  const rows = (data as TrendRow[]).filter((row) => row.share !== null);
  const top = Math.min(1, Math.max(0.1, ...rows.map((row) => row.high ?? 0)) * 1.15);
  return {
    height: 260,
    marginBottom: width < 560 ? 50 : 36,
    x: { domain: (data as TrendRow[]).map((row) => row.quarter), tickFormat: quarterLabel, tickRotate: width < 560 ? -35 : 0, label: null },
    y: { domain: [0, top], tickFormat: (v: number) => `${Math.round(v * 100)} %`, label: "Share of attempts", grid: true },
    marks: [
      Plot.ruleX(rows, { x: "quarter", y1: "low", y2: "high", stroke: dusk[300], strokeWidth: 6, strokeLinecap: "round" }),
      Plot.line(rows, { x: "quarter", y: "share", stroke: dusk[700], strokeWidth: 1.5 }),
      Plot.dot(rows, {
        x: "quarter",
        y: "share",
        fill: dusk[700],
        r: 4,
        title: (row: TrendRow) => `${row.quarter}: ${percent(row.share)} (${row.count} of ${row.attempts})`,
        // a quarter's point opens that quarter's attempts with the error
        ...(quarterHref ? { href: (row: TrendRow) => (row.count > 0 ? quarterHref(row.quarter) : null) } : {}),
      }),
      Plot.ruleY([0]),
      ...actionMarkLayers(
        actions,
        (data as TrendRow[]).map((row) => row.quarter),
      ),
    ],
  };
}

const noActions: readonly ActionMark[] = [];

export function TechniqueErrorTrendChart({
  label,
  trend,
  actions = noActions,
  quarterHref,
}: {
  label: string;
  trend: readonly TrendRow[];
  actions?: readonly ActionMark[];
  quarterHref?: (quarter: string) => string;
}) {
  const plot = useCallback((data: readonly TrendRow[], size: ChartSize) => trendPlot(data, size, actions, quarterHref), [actions, quarterHref]);
  const shown = trend.filter((row) => row.share !== null);
  const first = shown[0];
  const last = shown[shown.length - 1];
  // the same test of change as everywhere else: the 95 % interval of the difference must exclude zero
  const difference = first && last && first !== last ? proportionDifference(last.count, last.attempts, first.count, first.attempts) : null;
  const clear = difference !== null && changeVerdict(difference) !== "no clear change";
  const description =
    shown.length === 0
      ? "No attempts in these quarters."
      : first === last
        ? `${percent(first.share)} of attempts in ${quarterLabel(first.quarter)}. Bars show the 95 % interval.`
        : `Share of attempts with “${label.toLowerCase()}” per quarter, from ${percent(first.share)} in ${quarterLabel(first.quarter)} to ${percent(last.share)} in ${quarterLabel(last.quarter)}. ` +
          `Bars show the 95 % interval; ${clear ? "the change from first to last is clear of chance (the 95 % interval of the difference excludes zero)" : "the change from first to last may be chance (the 95 % interval of the difference includes zero)"}.`;
  const marked =
    description +
    describeActionMarks(
      actions,
      trend.map((row) => row.quarter),
    );
  return (
    <Chart
      title="Trend by quarter"
      description={marked}
      data={trend}
      columns={columns}
      rowKey={(row) => row.quarter}
      plot={plot}
      exportFileName="error-trend"
    />
  );
}
