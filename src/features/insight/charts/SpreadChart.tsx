// Where I sit among all instructors: each instructor's median score against their pass rate, others as
// anonymous hollow circles, me as a labelled star.
import { Y_TITLE_MARGIN_TOP } from "./axisSpace";
import * as Plot from "@observablehq/plot";
import { useCallback } from "react";
import type { StandingAnswer } from "../../../../shared/schemas/insight";
import { Chart, type ChartSize } from "../../../components/Chart";
import type { Column } from "../../../components/DataTable";
import { ChartLegend, shapeSwatch } from "../ChartLegend";
import { ink, percentTick } from "../chartStyle";
import { formatPercent, formatScore, percentValue, roundTo } from "../format";

export type SpreadPoint = StandingAnswer["spread"]["points"][number];
interface Row extends SpreadPoint {
  index: number;
}

export function describeSpread(points: readonly SpreadPoint[], minAttempts: number): string {
  const me = points.find((p) => p.isMe);
  const others = points.filter((p) => !p.isMe);
  if (!me) return "You have no attempts in this period to place among the instructors.";
  if (others.length === 0)
    return `Your median score is ${formatScore(me.medianScore)} and your pass rate ${formatPercent(me.passRate)}. No other instructor has ${minAttempts} or more attempts to compare with.`;
  const lowerScore = others.filter((p) => p.medianScore < me.medianScore).length;
  const lowerRate = others.filter((p) => p.passRate < me.passRate).length;
  const of = (count: number) => (count === others.length ? `all ${others.length} others` : `${count} of the ${others.length} others`);
  return `Each point is one instructor with at least ${minAttempts} attempts (${others.length} others, shown without names). You are the star: median score ${formatScore(me.medianScore)}, pass rate ${formatPercent(me.passRate)}. Your median score is above ${of(lowerScore)}; your pass rate is above ${of(lowerRate)}.`;
}

const columns: Column<Row>[] = [
  {
    key: "who",
    header: "Instructor",
    value: (p) => (p.isMe ? "You" : "Another instructor"),
    render: (p) => (p.isMe ? <strong>You</strong> : "Another instructor"),
  },
  { key: "score", header: "Median score", value: (p) => roundTo(p.medianScore, 1), render: (p) => formatScore(p.medianScore), align: "right" },
  { key: "rate", header: "Pass rate (%)", value: (p) => percentValue(p.passRate), render: (p) => formatPercent(p.passRate), align: "right" },
];

export function SpreadChart({ points, minAttempts, instructorsLeftOut }: { points: readonly SpreadPoint[]; minAttempts: number; instructorsLeftOut: number }) {
  const rows: Row[] = points.map((p, index) => ({ ...p, index }));
  const plot = useCallback((data: readonly Row[], { width }: ChartSize): Plot.PlotOptions => {
    const scores = data.map((p) => p.medianScore);
    const low = Math.max(0, Math.floor((Math.min(...scores) - 5) / 10) * 10);
    const high = Math.min(100, Math.ceil((Math.max(...scores) + 5) / 10) * 10);
    return {
      height: width < 500 ? 280 : 340,
      marginLeft: 48,
      marginRight: 24,
      marginTop: Y_TITLE_MARGIN_TOP,
      marginBottom: 44,
      x: { domain: [low, high], label: "Median score", labelAnchor: "center", labelOffset: 38, grid: true },
      y: { domain: [0, 1], tickFormat: percentTick, label: "Pass rate", grid: true },
      marks: [
        Plot.dot(
          data.filter((p) => !p.isMe),
          {
            x: "medianScore",
            y: "passRate",
            r: 5,
            fill: "white",
            stroke: ink.main,
            strokeWidth: 1.5,
            title: (p: Row) => `Another instructor: median ${formatScore(p.medianScore)}, pass rate ${formatPercent(p.passRate)}`,
          },
        ),
        Plot.dot(
          data.filter((p) => p.isMe),
          { x: "medianScore", y: "passRate", symbol: "star", r: 10, fill: ink.accent, stroke: ink.text, strokeWidth: 1.5 },
        ),
        Plot.text(
          data.filter((p) => p.isMe),
          {
            x: "medianScore",
            y: "passRate",
            text: () => "You",
            dx: 14,
            textAnchor: "start",
            fontWeight: 700,
            fill: ink.text,
            stroke: "white",
            strokeWidth: 3,
            paintOrder: "stroke",
          } as Plot.TextOptions,
        ),
      ],
    };
  }, []);
  const leftOut =
    instructorsLeftOut > 0
      ? ` ${instructorsLeftOut} instructor${instructorsLeftOut === 1 ? " is" : "s are"} left out (fewer than ${minAttempts} attempts, or too few instructors to show).`
      : "";
  return (
    <Chart
      title="Where you sit among instructors"
      description={describeSpread(points, minAttempts) + leftOut}
      data={rows}
      columns={columns}
      rowKey={(p) => p.index}
      plot={plot}
      exportFileName="instructor-spread"
      legend={
        <ChartLegend
          items={[
            { label: "You", swatch: shapeSwatch("star", ink.accent, ink.text) },
            { label: "Another instructor", swatch: shapeSwatch("circle", "white", ink.main) },
          ]}
        />
      }
    />
  );
}
