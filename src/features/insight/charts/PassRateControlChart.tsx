// The measured pass rate per quarter as a p-chart: the centre line (all passes over all attempts of the
// baseline quarters) and 3-sigma control limits for each quarter's number of attempts (widened by Laney's σ_z
// when asked). A quarter outside the limits is
// drawn as a diamond and labelled, so it stands out without colour.
import { Y_TITLE_MARGIN_TOP } from "./axisSpace";
import * as Plot from "@observablehq/plot";
import { useCallback } from "react";
import { Link } from "react-router";
import type { z } from "zod";
import type { passRateSeriesSchema } from "../../../../shared/schemas/insight";
import { Chart, type ChartSize } from "../../../components/Chart";
import type { Column } from "../../../components/DataTable";
import { ChartLegend, lineSwatch, shapeSwatch } from "../ChartLegend";
import { NothingToChart } from "./NothingToChart";
import { ink, percentTick, shareAxisTop } from "../chartStyle";
import { formatCount, formatInterval, formatPercent, percentValue, suppressedText } from "../format";
import { quarterLabel } from "../../../../shared/period";
import type { ActionMark } from "../../../../shared/schemas/actions";
import { actionMarkLayers, describeActionMarks } from "../../actions/chartMarks";
import { formatDay } from "../../../lib/formatting";

export type PassRateSeries = z.infer<typeof passRateSeriesSchema>;
export type SeriesPoint = PassRateSeries["points"][number];

function side(point: SeriesPoint): "above" | "below" | null {
  if (!point.outside || point.rate === null) return null;
  return point.ucl !== null && point.rate > point.ucl ? "above" : "below";
}

export function describeSeries(series: PassRateSeries): string {
  const shown = series.points.filter((p) => p.rate !== null);
  if (shown.length === 0) return "No quarter in this range has attempts to chart.";
  const first = series.points[0].quarter;
  const last = series.points[series.points.length - 1];
  const outside = shown.filter((p) => p.outside);
  const parts = [
    `Measured pass rate each quarter from ${quarterLabel(first)} to ${quarterLabel(last.quarter)}, around a centre line of ${formatPercent(series.centre)} from the baseline quarters.`,
  ];
  if (last.rate !== null) parts.push(`The latest quarter is at ${formatPercent(last.rate)}.`);
  if (outside.length === 0) {
    parts.push("Every quarter stays inside the control limits: the ups and downs are what chance alone would give.");
  } else {
    const above = outside.filter((p) => side(p) === "above").map((p) => quarterLabel(p.quarter));
    const below = outside.filter((p) => side(p) === "below").map((p) => quarterLabel(p.quarter));
    const words = [above.length ? `above in ${above.join(", ")}` : "", below.length ? `below in ${below.join(", ")}` : ""].filter(Boolean);
    parts.push(`${outside.length} of ${shown.length} quarters fall outside the control limits (${words.join("; ")}): more change than chance alone explains.`);
  }
  const runs = series.runChart;
  if (runs) {
    parts.push(
      runs.shift
        ? `The run-chart rules signal a shift: ${runs.run > runs.longestRun ? `${runs.run} quarters in a row on one side of the median ${formatPercent(runs.median)} (more than ${runs.longestRun} is unlikely by chance)` : `only ${runs.crossings} crossings of the median ${formatPercent(runs.median)} (fewer than ${runs.fewestCrossings} is unlikely by chance)`}.`
        : `The run-chart rules find no shift: the longest run on one side of the median ${formatPercent(runs.median)} is ${runs.run} (a shift needs more than ${runs.longestRun}) and the series crosses it ${runs.crossings} time${runs.crossings === 1 ? "" : "s"}.`,
    );
  }
  const split = splitSentence(series);
  if (split) parts.push(split);
  const hidden = series.points.filter((p) => p.suppressed).length;
  if (hidden > 0) parts.push(`${hidden} quarter${hidden === 1 ? " is" : "s are"} hidden because they hold too few attempts.`);
  return parts.join(" ");
}

/** How a split chart judges the quarters after its split, in words; empty without a split. */
export function splitSentence(series: PassRateSeries): string {
  const { split } = series;
  if (split === null) return "";
  const start = `The chart is split at ${formatDay(split.date)}: from ${quarterLabel(split.quarter)} the quarters form a phase of their own`;
  if (split.centre === null || split.baseline === null) {
    return `${start}, judged against the limits before the split until it has four quarters with attempts to set its own centre line.`;
  }
  const range =
    split.baseline.from === split.baseline.to
      ? quarterLabel(split.baseline.from)
      : `${quarterLabel(split.baseline.from)} to ${quarterLabel(split.baseline.to)}`;
  return `${start}, with a centre line of ${formatPercent(split.centre)} from ${range} (${formatCount(split.baseline.attempts)} attempts).`;
}

/** The centre line each quarter is judged against: the phase after a split has its own once it has one. */
function centreOf(series: PassRateSeries, quarter: string): number | null {
  const { split } = series;
  return split !== null && split.centre !== null && quarter >= split.quarter ? split.centre : series.centre;
}

export function seriesColumns(minCount: number, series?: PassRateSeries, quarterHref?: (quarter: string) => string): Column<SeriesPoint>[] {
  const hidden = suppressedText(minCount);
  // with a split, each quarter's own centre line: the reader of the table cannot see where it steps
  const centreColumn: Column<SeriesPoint>[] =
    series?.split?.centre == null
      ? []
      : [
          {
            key: "centre",
            header: "Centre line (%)",
            value: (p) => percentValue(centreOf(series, p.quarter)),
            render: (p) => formatPercent(centreOf(series, p.quarter)),
            align: "right",
          },
        ];
  return [
    ...centreColumn,
    {
      key: "quarter",
      header: "Quarter",
      value: (p) => p.quarter,
      // the table view is the keyboard's way to the quarter's attempts that the chart's points give the mouse
      render: (p) =>
        quarterHref && p.attempts ? (
          <Link to={quarterHref(p.quarter)} className="font-semibold text-dusk-700 underline underline-offset-2 hover:text-dusk-900">
            {quarterLabel(p.quarter)}
          </Link>
        ) : (
          quarterLabel(p.quarter)
        ),
    },
    { key: "attempts", header: "Attempts", value: (p) => p.attempts, render: (p) => (p.suppressed ? hidden : formatCount(p.attempts)), align: "right" },
    { key: "passed", header: "Passed", value: (p) => p.passed, render: (p) => (p.suppressed ? hidden : formatCount(p.passed)), align: "right" },
    {
      key: "rate",
      header: "Pass rate (%)",
      value: (p) => percentValue(p.rate),
      render: (p) => (p.suppressed ? hidden : formatPercent(p.rate)),
      align: "right",
    },
    { key: "interval", header: "95 % interval", value: (p) => (p.low === null ? null : formatInterval(p.low, p.high)), sortable: false, align: "right" },
    { key: "lcl", header: "Lower control limit (%)", value: (p) => percentValue(p.lcl), render: (p) => formatPercent(p.lcl), align: "right" },
    { key: "ucl", header: "Upper control limit (%)", value: (p) => percentValue(p.ucl), render: (p) => formatPercent(p.ucl), align: "right" },
    {
      key: "outside",
      header: "Outside the limits",
      value: (p) => (p.rate === null ? null : side(p) === "above" ? "Yes, above" : side(p) === "below" ? "Yes, below" : "No"),
    },
  ];
}

const noActions: readonly ActionMark[] = [];

/** Labels clear of the diamonds, with a white halo so an action's dashed line does not run through them. */
const haloText = { fill: ink.text, fontWeight: 600, stroke: "white", strokeWidth: 3, paintOrder: "stroke" } as const;

export function PassRateControlChart({
  series,
  minCount,
  title = "Measured pass rate by quarter",
  actions = noActions,
  quarterHref,
}: {
  series: PassRateSeries;
  minCount: number;
  title?: string;
  /** Improvement actions to mark at the quarter they start in. */
  actions?: readonly ActionMark[];
  /** Where a quarter's point leads (that quarter's attempts); without it the points are pictures only. */
  quarterHref?: (quarter: string) => string;
}) {
  // without a single quarter to show, a centre line alone would only hint at the hidden figures
  const nothingShown = series.points.every((p) => p.rate === null);
  const centre = nothingShown ? null : series.centre;
  const phased = !nothingShown && series.split !== null && series.split.centre !== null;
  const plot = useCallback(
    (points: readonly SeriesPoint[], { width }: ChartSize): Plot.PlotOptions => {
      const shown = points.filter((p) => p.rate !== null);
      const outside = shown.filter((p) => p.outside);
      const link = quarterHref ? { href: (p: SeriesPoint) => quarterHref(p.quarter) } : {};
      const top = shareAxisTop(shown.flatMap((p) => [p.ucl, p.high, p.rate]));
      return {
        height: width < 500 ? 260 : 320,
        marginLeft: 48,
        marginRight: width < 500 ? 12 : 72,
        marginTop: Y_TITLE_MARGIN_TOP,
        marginBottom: width < 500 ? 40 : 30,
        x: {
          type: "point",
          domain: points.map((p) => p.quarter),
          tickFormat: (q: string) => (width < 500 ? `${q.slice(5)}\n${q.slice(0, 4)}` : quarterLabel(q)),
          label: null,
          padding: 0.4,
        },
        y: { domain: [0, top], tickFormat: percentTick, label: "Measured pass rate", grid: true },
        marks: [
          // one centre line, or with a split a step from the centre before it to the new phase's at the boundary
          phased
            ? Plot.line(points, { x: "quarter", y: (p: SeriesPoint) => centreOf(series, p.quarter), curve: "step", stroke: ink.main, strokeWidth: 1.5 })
            : centre === null
              ? null
              : Plot.ruleY([centre], { stroke: ink.main, strokeWidth: 1.5 }),
          width < 500 || centreOf(series, points[points.length - 1].quarter) === null || nothingShown
            ? null
            : Plot.text([centreOf(series, points[points.length - 1].quarter)], {
                x: () => points[points.length - 1].quarter,
                y: (c: number) => c,
                text: (c: number) => `centre ${formatPercent(c)}`,
                dx: 14,
                dy: -8,
                textAnchor: "start",
                fill: ink.text,
              }),
          Plot.line(shown, { x: "quarter", y: "ucl", curve: "step", stroke: ink.limit, strokeDasharray: "5 4" }),
          Plot.line(shown, { x: "quarter", y: "lcl", curve: "step", stroke: ink.limit, strokeDasharray: "5 4" }),
          Plot.ruleX(shown, { x: "quarter", y1: "low", y2: "high", stroke: ink.soft, strokeWidth: 3 }),
          Plot.line(shown, { x: "quarter", y: "rate", stroke: ink.main, strokeWidth: 1.5 }),
          Plot.dot(
            shown.filter((p) => !p.outside),
            {
              x: "quarter",
              y: "rate",
              r: 4.5,
              fill: ink.main,
              stroke: "white",
              title: (p: SeriesPoint) => `${quarterLabel(p.quarter)}: ${formatPercent(p.rate)}`,
              ...link,
            },
          ),
          Plot.dot(outside, {
            x: "quarter",
            y: "rate",
            symbol: "diamond",
            r: 7,
            fill: ink.accent,
            stroke: ink.text,
            strokeWidth: 1.5,
            title: (p: SeriesPoint) => `${quarterLabel(p.quarter)}: ${formatPercent(p.rate)}, outside the control limits`,
            ...link,
          }),
          // on narrow screens the diamonds alone mark these quarters (the words would overlap)
          width < 500
            ? null
            : Plot.text(
                outside.filter((p) => side(p) === "above"),
                { x: "quarter", y: "rate", text: () => "above", dy: -20, ...haloText },
              ),
          width < 500
            ? null
            : Plot.text(
                outside.filter((p) => side(p) === "below"),
                { x: "quarter", y: "rate", text: () => "below", dy: 21, ...haloText },
              ),
          ...actionMarkLayers(
            actions,
            points.map((p) => p.quarter),
          ),
        ],
      };
    },
    [centre, actions, phased, series, nothingShown, quarterHref],
  );

  if (nothingShown) {
    const hidden = series.points.some((p) => p.suppressed);
    return (
      <NothingToChart
        title={title}
        text={hidden ? `No quarter in this range can be shown: each has ${suppressedText(minCount)}, or none.` : "No quarter in this range has attempts."}
      />
    );
  }
  return (
    <Chart
      title={title}
      description={
        describeSeries(series) +
        describeActionMarks(
          actions,
          series.points.map((p) => p.quarter),
        )
      }
      data={series.points}
      columns={seriesColumns(minCount, series, quarterHref)}
      rowKey={(p) => p.quarter}
      plot={plot}
      exportFileName="pass-rate-by-quarter"
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
            { label: phased ? "Centre line (stepping at the split)" : "Centre line", swatch: lineSwatch(ink.main) },
            { label: "Control limits", swatch: lineSwatch(ink.limit, "5 4") },
            { label: "Outside the limits", swatch: shapeSwatch("diamond", ink.accent, ink.text) },
            ...(describeActionMarks(
              actions,
              series.points.map((p) => p.quarter),
            )
              ? [{ label: "Improvement action starts", swatch: lineSwatch(ink.accentDark, "3 3") }]
              : []),
          ]}
        />
      }
    />
  );
}
