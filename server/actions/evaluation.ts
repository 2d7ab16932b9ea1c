// Before/after evaluation of an improvement action on its aim, from the per-quarter attempt summaries.
//
// Quarters are the finest period the summaries keep, so the evaluation works in quarters: "before" is the
// BASELINE_QUARTERS quarters before the quarter holding the start date, "after" every quarter from the next
// one on. The start's own quarter mixes attempts from both sides and counts as neither (a transition), unless
// the action starts on its first day. The difference after − before carries Newcombe's hybrid score interval
// (shared/stats/difference.ts); the run-chart rules (Anhøj & Olesen 2014, shared/stats/runChart.ts) look at
// every point around the median of the baseline points.
import { median, proportionDifference, changeVerdict, runChartSignals } from "../../shared/stats";
import { nextQuarter, quarterDates, quarterOf, quartersBetween, shiftQuarter } from "../../shared/period";
import type { ActionEvaluation, ActionRow, AimTally, EvaluationPoint } from "../../shared/schemas/actions";
import { aimGoesUp } from "../../shared/vocabulary";
import type { Db } from "../db/client";
import { quartersWithData } from "../insight/quarters";
import { hidesGroup, type Viewer } from "../insight/viewer";
import { networkScope, talliesBy, type SummaryScope, type Tally } from "../metrics/summaries";

/** How many quarters before the start make the baseline. */
export const BASELINE_QUARTERS = 4;

export type ActionScope = Pick<ActionRow, "siteId" | "instructorId" | "profile">;

export function summaryScopeOf(action: ActionScope, from: string, to: string): SummaryScope {
  return { ...networkScope(from, to), siteId: action.siteId, instructorId: action.instructorId, profile: action.profile };
}

/** The aim's count in a tally: passes for the pass rate, attempts failing on the error otherwise. */
function aimCount(action: Pick<ActionRow, "aim">, tally: Tally): number {
  return action.aim === "passRate" ? tally.passed : tally.errors[action.aim];
}

function sumOf(points: readonly EvaluationPoint[]): AimTally | null {
  if (points.length === 0) return null;
  const x = points.reduce((sum, point) => sum + point.x, 0);
  const n = points.reduce((sum, point) => sum + point.n, 0);
  return { from: points[0].period, to: points[points.length - 1].period, x, n, rate: n > 0 ? x / n : null };
}

/** The window of quarters an evaluation reads: the baseline's first to the newest quarter with attempts. */
export function evaluationWindow(db: Db, startDate: string): { startQuarter: string; from: string; to: string } {
  const startQuarter = quarterOf(startDate);
  const from = shiftQuarter(startQuarter, -BASELINE_QUARTERS);
  const latest = quartersWithData(db)[0] ?? startQuarter;
  return { startQuarter, from, to: latest > startQuarter ? latest : startQuarter };
}

/** The aim per quarter of the window, with each quarter's phase; quarters without attempts are left out. */
export function evaluationPoints(db: Db, action: ActionScope & Pick<ActionRow, "aim" | "startDate">): { startQuarter: string; points: EvaluationPoint[] } {
  const { startQuarter, from, to } = evaluationWindow(db, action.startDate);
  const firstAfter = quarterDates(startQuarter).first === action.startDate ? startQuarter : nextQuarter(startQuarter);
  const tallies = talliesBy<string>(db, summaryScopeOf(action, from, to), "quarter");
  const points = quartersBetween(from, to).flatMap((period): EvaluationPoint[] => {
    const tally = tallies.get(period);
    if (!tally || tally.n === 0) return [];
    const phase = period >= firstAfter ? "after" : period < startQuarter ? "before" : "transition";
    const x = aimCount(action, tally);
    return [{ period, phase, x, n: tally.n, rate: x / tally.n }];
  });
  return { startQuarter, points };
}

export function evaluateAction(db: Db, action: ActionRow): ActionEvaluation {
  const { startQuarter, points } = evaluationPoints(db, action);
  const before = sumOf(points.filter((point) => point.phase === "before"));
  const after = sumOf(points.filter((point) => point.phase === "after"));
  const difference = before && after ? proportionDifference(after.x, after.n, before.x, before.n) : null;
  const target = action.target / 100;
  const baselineMedian = median(points.filter((point) => point.phase === "before").map((point) => point.rate!));
  const signals =
    baselineMedian === null
      ? null
      : runChartSignals(
          points.map((point) => point.rate!),
          baselineMedian,
        );
  return {
    resolution: "quarter",
    startQuarter,
    before,
    after,
    difference,
    verdict: difference ? changeVerdict(difference) : null,
    targetMet: after?.rate == null ? null : aimGoesUp(action.aim) ? after.rate >= target : after.rate <= target,
    points,
    runChart: signals && {
      baselineMedian: signals.median,
      useful: signals.useful,
      longestRun: signals.run,
      longestRunLimit: signals.longestRun,
      crossings: signals.crossings,
      crossingsLimit: signals.fewestCrossings,
      signal: signals.shift,
    },
  };
}

/**
 * The evaluation as this viewer may see it. Readers of every instructor's rows see it whole; an instructor
 * sees it for their own scope, and for a site's or the network's only when no quarter's attempts of other
 * instructors form a group small enough to be suppressed (shared/suppression.ts).
 */
export function evaluationFor(db: Db, viewer: Viewer, action: ActionRow): ActionEvaluation | null {
  const evaluation = evaluateAction(db, action);
  if (viewer.seesEveryone) return evaluation;
  if (viewer.ownInstructorId === null) return null;
  if (action.instructorId === viewer.ownInstructorId) return evaluation;
  const { from, to } = evaluationWindow(db, action.startDate);
  const own = talliesBy<string>(db, { ...summaryScopeOf(action, from, to), instructorId: viewer.ownInstructorId }, "quarter");
  const hidden = evaluation.points.some((point) => hidesGroup(viewer, point.n - (own.get(point.period)?.n ?? 0)));
  return hidden ? null : evaluation;
}
