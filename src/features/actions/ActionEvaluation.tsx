// An action's evaluation: the aim before and after the start, their difference with its 95 % interval, the
// target, and a run chart of the aim per quarter around the baseline median with the run-chart signals.
import * as Plot from "@observablehq/plot";
import { useCallback } from "react";
import { quarterLabel, rangeLabel } from "../../../shared/period";
import type { ActionEvaluation as Evaluation, ActionRow, AimTally, EvaluationPoint } from "../../../shared/schemas/actions";
import { actionWords, aimFigureName, aimGoesUp } from "../../../shared/vocabulary";
import { Chart, type ChartSize } from "../../components/Chart";
import type { Column } from "../../components/DataTable";
import { SafetyNote } from "../../components/SafetyNote";
import { ChartLegend, lineSwatch, shapeSwatch } from "../insight/ChartLegend";
import { ink, percentTick, quarterTick, shareAxisTop } from "../insight/chartStyle";
import { formatCount, formatPercent, formatPoints, percentValue } from "../insight/format";

const phaseNames: Record<EvaluationPoint["phase"], string> = { before: "Before", transition: "Start quarter (neither side)", after: "After" };

function tallyText(tally: AimTally | null): string {
  if (!tally) return "No attempts";
  return `${formatPercent(tally.rate)} (${formatCount(tally.x)} of ${formatCount(tally.n)} attempts, ${rangeLabel(tally)})`;
}

/** The difference in words, called higher or lower only when its interval excludes zero. */
export function differenceText(evaluation: Evaluation): string {
  const { difference, verdict } = evaluation;
  if (!difference || !verdict) return "No comparison yet: both sides of the start need attempts.";
  const interval = `95 % interval ${formatPoints(difference.low)} to ${formatPoints(difference.high)}`;
  if (verdict === "no clear change") return `${formatPoints(difference.difference)} (${interval}): no clear change — the interval includes zero.`;
  return `${formatPoints(difference.difference)} (${interval}): ${verdict === "up" ? "higher" : "lower"} after the start.`;
}

function runChartText(evaluation: Evaluation): string {
  const runs = evaluation.runChart;
  if (!runs) return "The run-chart rules need baseline quarters and at least two points off the baseline median.";
  const median = formatPercent(runs.baselineMedian);
  if (!runs.signal) {
    return `No shift signalled: the longest run on one side of the baseline median ${median} is ${runs.longestRun} (a shift needs more than ${runs.longestRunLimit}) and the series crosses it ${runs.crossings} time${runs.crossings === 1 ? "" : "s"} (a shift needs fewer than ${runs.crossingsLimit}). With few points the rules rarely signal.`;
  }
  return runs.longestRun > runs.longestRunLimit
    ? `A shift is signalled: ${runs.longestRun} points in a row on one side of the baseline median ${median} (more than ${runs.longestRunLimit} is unlikely by chance).`
    : `A shift is signalled: only ${runs.crossings} crossings of the baseline median ${median} (fewer than ${runs.crossingsLimit} is unlikely by chance).`;
}

const columns: Column<EvaluationPoint>[] = [
  { key: "period", header: "Quarter", value: (p) => p.period, render: (p) => quarterLabel(p.period) },
  { key: "phase", header: "Phase", value: (p) => phaseNames[p.phase] },
  { key: "x", header: "Counted", value: (p) => p.x, align: "right" },
  { key: "n", header: "Attempts", value: (p) => p.n, align: "right" },
  { key: "rate", header: "Share (%)", value: (p) => percentValue(p.rate), render: (p) => formatPercent(p.rate), align: "right" },
];

function RunChart({ action, evaluation }: { action: ActionRow; evaluation: Evaluation }) {
  const median = evaluation.runChart?.baselineMedian ?? null;
  const target = action.target / 100;
  const plot = useCallback(
    (points: readonly EvaluationPoint[], { width }: ChartSize): Plot.PlotOptions => ({
      height: width < 500 ? 240 : 300,
      marginLeft: 48,
      marginTop: 24,
      marginBottom: width < 560 ? 40 : 30,
      x: { type: "point", domain: points.map((p) => p.period), tickFormat: quarterTick(width), label: null, padding: 0.4 },
      y: { domain: [0, shareAxisTop([...points.map((p) => p.rate), target])], tickFormat: percentTick, label: aimFigureName(action.aim), grid: true },
      marks: [
        median === null ? null : Plot.ruleY([median], { stroke: ink.main, strokeWidth: 1.5 }),
        Plot.ruleY([target], { stroke: ink.accentDark, strokeDasharray: "2 3" }),
        Plot.line(points, { x: "period", y: "rate", stroke: ink.soft, strokeWidth: 1.5 }),
        Plot.dot(points, {
          x: "period",
          y: "rate",
          r: 5,
          symbol: (p: EvaluationPoint) => (p.phase === "before" ? "circle" : p.phase === "after" ? "diamond" : "square"),
          fill: (p: EvaluationPoint) => (p.phase === "after" ? ink.accent : ink.main),
          stroke: ink.text,
          title: (p: EvaluationPoint) => `${quarterLabel(p.period)} (${phaseNames[p.phase]}): ${formatPercent(p.rate)}`,
        }),
      ],
    }),
    [median, target, action.aim],
  );
  if (evaluation.points.length === 0) return <p className="text-small text-muted">No quarter of this scope has attempts yet.</p>;
  return (
    <Chart
      title={`${aimFigureName(action.aim)} by quarter`}
      description={`${aimFigureName(action.aim)} per quarter around the baseline median. ${runChartText(evaluation)}`}
      data={evaluation.points}
      columns={columns}
      rowKey={(p) => p.period}
      plot={plot}
      exportFileName={`action-${action.id}-by-quarter`}
      legend={
        <ChartLegend
          items={[
            { label: "Before", swatch: shapeSwatch("circle", ink.main, ink.text) },
            { label: "After", swatch: shapeSwatch("diamond", ink.accent, ink.text) },
            { label: "Baseline median", swatch: lineSwatch(ink.main) },
            { label: actionWords.target, swatch: lineSwatch(ink.accentDark, "2 3") },
          ]}
        />
      }
    />
  );
}

export function ActionEvaluation({ action, evaluation }: { action: ActionRow; evaluation: Evaluation | null }) {
  if (!evaluation) {
    return (
      <p className="text-small text-muted">The figures of this scope include small groups of other instructors' attempts, so they are not shown to you.</p>
    );
  }
  const wanted = aimGoesUp(action.aim) ? "at or above" : "at or below";
  return (
    <div className="flex flex-col gap-4">
      <dl className="grid gap-3 sm:grid-cols-2">
        <div>
          <dt className="text-small font-semibold">{actionWords.before}</dt>
          <dd data-testid="before">{tallyText(evaluation.before)}</dd>
        </div>
        <div>
          <dt className="text-small font-semibold">{actionWords.after}</dt>
          <dd data-testid="after">{tallyText(evaluation.after)}</dd>
        </div>
        <div>
          <dt className="text-small font-semibold">Difference (after − before)</dt>
          <dd data-testid="difference">{differenceText(evaluation)}</dd>
        </div>
        <div>
          <dt className="text-small font-semibold">{actionWords.target}</dt>
          <dd>
            {formatPercent(action.target / 100)} ({wanted}):{" "}
            {evaluation.targetMet === null ? "not known yet" : evaluation.targetMet ? "reached after the start" : "not reached after the start"}
          </dd>
        </div>
      </dl>
      <p className="text-small text-muted">
        Quarters are the finest period the figures are kept for. The start falls in {quarterLabel(evaluation.startQuarter)}; that quarter counts on neither side
        unless the action starts on its first day. The baseline is up to four quarters before it.
      </p>
      <p className="text-small">{runChartText(evaluation)}</p>
      <RunChart action={action} evaluation={evaluation} />
      <p className="text-small text-muted">{actionWords.caution}</p>
      <SafetyNote compact />
    </div>
  );
}
