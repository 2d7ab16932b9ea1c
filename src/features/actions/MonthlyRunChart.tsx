// The action's aim by calendar month in its scope, split at the start: the months before and after it each
// carry their own median line, and the run-chart rules (Anhøj & Olesen 2014) say in words whether the months
// after the start left the level of the months before it.
import * as Plot from "@observablehq/plot";
import { useQuery } from "@tanstack/react-query";
import { useCallback } from "react";
import type { ActionRow } from "../../../shared/schemas/actions";
import type { MonthlyRunChart as Answer, MonthPoint, PhaseCentre } from "../../../shared/schemas/runChart";
import { aimFigureName } from "../../../shared/vocabulary";
import { Chart, type ChartSize } from "../../components/Chart";
import type { Column } from "../../components/DataTable";
import { ErrorState, LoadingState } from "../../components/States";
import { formatDay, formatMonth } from "../../lib/formatting";
import { ChartLegend, lineSwatch, shapeSwatch } from "../insight/ChartLegend";
import { ink, percentTick, shareAxisTop } from "../insight/chartStyle";
import { formatCount, formatPercent } from "../insight/format";
import { actionQueries } from "./queries";

const phaseNames: Record<MonthPoint["phase"] & string, string> = { before: "Before", transition: "Start month (neither side)", after: "After" };

function phaseOf(chart: Answer, phase: PhaseCentre["phase"]): PhaseCentre | undefined {
  return chart.phases.find((p) => p.phase === phase);
}

/** Whether the months after the start shifted, in plain words. */
export function monthlySignalText(chart: Answer): string {
  const before = phaseOf(chart, "before");
  const after = phaseOf(chart, "after");
  if (!before) return "No month before the start has attempts, so there is no level to compare with.";
  if (!after) return "No month after the start has attempts yet.";
  const levels = `The median is ${formatPercent(after.median)} after the start against ${formatPercent(before.median)} before it.`;
  if (chart.longestRunLimit === null || chart.crossingsLimit === null || chart.useful < 2) {
    return `${levels} Too few months after the start lie off the median before it to judge a shift.`;
  }
  if (!chart.signal) {
    return `${levels} No shift is signalled: the longest run of months after the start on one side of the median before it is ${chart.longestRun} (a shift needs more than ${chart.longestRunLimit}) and they cross it ${chart.crossings} time${chart.crossings === 1 ? "" : "s"} (a shift needs fewer than ${chart.crossingsLimit}). With few months the rules rarely signal.`;
  }
  return chart.longestRun > chart.longestRunLimit
    ? `${levels} A shift is signalled: ${chart.longestRun} months in a row after the start lie on one side of the median before it (more than ${chart.longestRunLimit} is unlikely by chance).`
    : `${levels} A shift is signalled: the months after the start cross the median before it only ${chart.crossings} time${chart.crossings === 1 ? "" : "s"} (fewer than ${chart.crossingsLimit} is unlikely by chance).`;
}

const columns: Column<MonthPoint>[] = [
  { key: "period", header: "Month", value: (p) => p.period, render: (p) => formatMonth(p.period) },
  { key: "phase", header: "Phase", value: (p) => (p.phase ? phaseNames[p.phase] : "") },
  { key: "x", header: "Counted", value: (p) => p.x, render: (p) => formatCount(p.x), align: "right" },
  { key: "n", header: "Attempts", value: (p) => p.n, render: (p) => formatCount(p.n), align: "right" },
  { key: "rate", header: "Share (%)", value: (p) => Math.round(p.rate * 1000) / 10, render: (p) => formatPercent(p.rate), align: "right" },
];

function MonthlyPlot({ action, chart }: { action: ActionRow; chart: Answer }) {
  const startMonth = action.startDate.slice(0, 7);
  const plot = useCallback(
    (points: readonly MonthPoint[], { width }: ChartSize): Plot.PlotOptions => {
      // each side's median drawn across that side's months only, so the two levels stand apart
      const medianOf = (phase: PhaseCentre["phase"]) => phaseOf(chart, phase)?.median ?? null;
      const centres = points.flatMap((p) => {
        const median = p.phase === "before" || p.phase === "after" ? medianOf(p.phase) : null;
        return median === null ? [] : [{ period: p.period, median, phase: p.phase }];
      });
      // many months, or a narrow chart: slanted labels, with room below and to the left for them
      const slanted = points.length > 12 || (width < 560 && points.length > 4);
      const marginLeft = slanted ? 60 : 48;
      // slanted labels need about 22 px each along the axis: on a narrow chart only every second or third month is named
      const step = Math.max(1, Math.ceil(22 / ((width - marginLeft - 20) / Math.max(1, points.length))));
      return {
        height: width < 500 ? 260 : 320,
        marginLeft,
        marginTop: 24,
        marginBottom: slanted ? 64 : 40,
        x: {
          type: "band",
          domain: points.map((p) => p.period),
          ticks: points.filter((_, i) => i % step === 0).map((p) => p.period),
          tickFormat: formatMonth,
          tickRotate: slanted ? -45 : 0,
          label: null,
          padding: 0,
        },
        y: { domain: [0, shareAxisTop(points.map((p) => p.rate))], tickFormat: percentTick, label: aimFigureName(action.aim), grid: true },
        marks: [
          Plot.tickY(centres, {
            x: "period",
            y: "median",
            stroke: (c: (typeof centres)[number]) => (c.phase === "after" ? ink.accentDark : ink.main),
            strokeWidth: 2,
          }),
          points.some((p) => p.period === startMonth) ? Plot.ruleX([startMonth], { stroke: ink.limit, strokeDasharray: "4 3" }) : null,
          Plot.line(points, { x: "period", y: "rate", stroke: ink.soft, strokeWidth: 1.5 }),
          Plot.dot(points, {
            x: "period",
            y: "rate",
            r: 4.5,
            symbol: (p: MonthPoint) => (p.phase === "after" ? "diamond" : p.phase === "transition" ? "square" : "circle"),
            fill: (p: MonthPoint) => (p.phase === "after" ? ink.accent : ink.main),
            stroke: ink.text,
            title: (p: MonthPoint) =>
              `${formatMonth(p.period)} (${p.phase ? phaseNames[p.phase] : ""}): ${formatPercent(p.rate)}, ${formatCount(p.x)} of ${formatCount(p.n)}`,
          }),
        ],
      };
    },
    [chart, action.aim, startMonth],
  );
  return (
    <Chart
      title={`${aimFigureName(action.aim)} by month`}
      description={`${aimFigureName(action.aim)} per calendar month of the class date, split at the start on ${formatDay(action.startDate)}. ${monthlySignalText(chart)}`}
      data={chart.points}
      columns={columns}
      rowKey={(p) => p.period}
      plot={plot}
      exportFileName={`action-${action.id}-by-month`}
      legend={
        <ChartLegend
          items={[
            { label: "Before the start", swatch: shapeSwatch("circle", ink.main, ink.text) },
            { label: "After the start", swatch: shapeSwatch("diamond", ink.accent, ink.text) },
            { label: "Median before", swatch: lineSwatch(ink.main) },
            { label: "Median after", swatch: lineSwatch(ink.accentDark) },
            { label: "Start", swatch: lineSwatch(ink.limit, "4 3", 1.5) },
          ]}
        />
      }
    />
  );
}

export function MonthlyRunChart({ action }: { action: ActionRow }) {
  const monthly = useQuery(actionQueries.monthly(action.id));
  if (monthly.isPending) return <LoadingState label="Loading the months…" />;
  if (monthly.isError) return <ErrorState error={monthly.error} title="The months could not be loaded" onRetry={() => monthly.refetch()} />;
  const chart = monthly.data;
  if (!chart) {
    return (
      <p className="text-small text-muted">
        Months are finer than the figures shared with instructors, so the monthly chart is shown for your own actions only.
      </p>
    );
  }
  if (chart.points.length === 0) return <p className="text-small text-muted">No month of this scope has attempts yet.</p>;
  return (
    <div className="flex flex-col gap-3">
      <p className="text-small" data-testid="monthly-signal">
        {monthlySignalText(chart)}
      </p>
      <MonthlyPlot action={action} chart={chart} />
      <p className="text-small text-muted">
        One point per calendar month of the class date. The line through each part is the median of that part alone: the months before the start and the months
        after it are summarised separately, so a change of level shows as a step. The start&apos;s own month counts on neither side unless the action starts on
        its first day. The run-chart rules (Anhøj &amp; Olesen, 2014) judge the months after the start against the median before it.
      </p>
    </div>
  );
}
