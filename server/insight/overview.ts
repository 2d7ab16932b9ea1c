// The network overview: headline figures for the period, the quarterly pass-rate p-chart, the error Pareto
// and live-display against hidden-display results. Two grouped scans of attempts feed it: the period in full
// (by quarter and feedback mode) and attempts and passes per quarter for the trend and the previous period.
//
// Shown to an instructor, each group is judged by the attempts of others in it (they know their own), and
// groups that add up to a shown total are hidden together when one alone would be revealed by subtraction.
import { and, eq, sql } from "drizzle-orm";
import { feedbackModes, type FeedbackMode } from "../../shared/domain";
import type { OverviewAnswer } from "../../shared/schemas/insight";
import { attemptErrorNames, type AttemptError } from "../../shared/scoring/scoreAttempt";
import { changeFrom, changeVerdict, cohensKappa, pChart, proportionDifference, runChartSignals } from "../../shared/stats";
import type { Db } from "../db/client";
import { attempts, classes } from "../db/schema";
import type { ResolvedFilters } from "./filters";
import { learnerOutcomes } from "../metrics/learnerOutcomes";
import { errorPareto } from "./pareto";
import { previousPeriod, trendQuarters } from "../../shared/period";
import { rateFor, rateOf } from "./rates";
import { attemptConditions, classConditions, errorCountColumns, errorCountsOf, medianOfSorted, sortedUnion, sortedValues } from "./sql";
import { hidesGroup, withComplementaryHiding, type Viewer } from "./viewer";

interface Tally {
  n: number;
  passed: number;
  /** instructor's result × Quarterbeat's: pass/pass, pass/fail, fail/pass, fail/fail */
  pp: number;
  pf: number;
  fp: number;
  ff: number;
  errors: Record<AttemptError, number>;
}

function emptyTally(): Tally {
  return { n: 0, passed: 0, pp: 0, pf: 0, fp: 0, ff: 0, errors: errorCountsOf({} as Record<AttemptError, number>) };
}

function add(into: Tally, row: Tally): void {
  into.n += row.n;
  into.passed += row.passed;
  into.pp += row.pp;
  into.pf += row.pf;
  into.fp += row.fp;
  into.ff += row.ff;
  for (const name of attemptErrorNames) into.errors[name] += row.errors[name];
}

/** Attempts (and those with an instructor's result) by quarter and feedback mode. */
interface Counted {
  quarter: string;
  feedback: FeedbackMode;
  n: number;
  pairs: number;
}

export function overview(db: Db, viewer: Viewer, filters: ResolvedFilters): OverviewAnswer {
  const period = filters.period;
  const before = previousPeriod(period);
  const trend = trendQuarters(period);
  const scan = { from: trend.from < before.from ? trend.from : before.from, to: period.to };

  const where = attemptConditions(filters);
  // the period in full (results, agreement, error bits; grouped in the covering index's order, no sort) …
  const periodRows = db
    .select({
      quarter: attempts.quarter,
      feedback: attempts.feedback,
      n: sql<number>`count(*)`,
      passed: sql<number>`sum(${attempts.passed})`,
      pp: sql<number>`sum(${attempts.instructorResult} = 'pass' AND ${attempts.passed} = 1)`,
      pf: sql<number>`sum(${attempts.instructorResult} = 'pass' AND ${attempts.passed} = 0)`,
      fp: sql<number>`sum(${attempts.instructorResult} = 'fail' AND ${attempts.passed} = 1)`,
      ff: sql<number>`sum(${attempts.instructorResult} = 'fail' AND ${attempts.passed} = 0)`,
      ...errorCountColumns(),
    })
    .from(attempts)
    .where(where)
    .groupBy(attempts.quarter, attempts.feedback)
    .all();
  // … and only attempts and passes for the trend quarters and the previous period
  const quarterRows = db
    .select({ quarter: attempts.quarter, n: sql<number>`count(*)`, passed: sql<number>`sum(${attempts.passed})` })
    .from(attempts)
    .where(attemptConditions(filters, scan))
    .groupBy(attempts.quarter)
    .all();
  // an instructor's own attempts in the same groups, to judge each group by the attempts of others
  const me = viewer.seesEveryone ? null : viewer.ownInstructorId;
  const ownRows: Counted[] =
    me === null
      ? []
      : db
          .select({ quarter: attempts.quarter, feedback: attempts.feedback, n: sql<number>`count(*)`, pairs: sql<number>`count(${attempts.instructorResult})` })
          .from(attempts)
          .where(attemptConditions({ ...filters, instructorId: me }, scan))
          .groupBy(attempts.quarter, attempts.feedback)
          .all();
  const own = (quarters: readonly string[], feedback?: FeedbackMode) =>
    ownRows
      .filter((row) => quarters.includes(row.quarter) && (feedback === undefined || row.feedback === feedback))
      .reduce((sum, row) => ({ n: sum.n + row.n, pairs: sum.pairs + row.pairs }), { n: 0, pairs: 0 });

  const inPeriod = emptyTally();
  const byFeedback = new Map<FeedbackMode, Tally>(feedbackModes.map((mode) => [mode, emptyTally()]));
  for (const row of periodRows) {
    const tally: Tally = { ...row, errors: errorCountsOf(row) };
    add(inPeriod, tally);
    add(byFeedback.get(row.feedback)!, tally);
  }
  const byQuarter = new Map(trend.quarters.map((q) => [q, { n: 0, passed: 0 }]));
  const inPrevious = { n: 0, passed: 0 };
  for (const row of quarterRows) {
    if (byQuarter.has(row.quarter)) byQuarter.set(row.quarter, row);
    if (row.quarter >= before.from && row.quarter <= before.to) {
      inPrevious.n += row.n;
      inPrevious.passed += row.passed;
    }
  }

  const hidden = hidesGroup(viewer, inPeriod.n - own(period.quarters).n);
  const passRate = rateFor(inPeriod.passed, inPeriod.n, hidden);
  const previousRate = rateFor(inPrevious.passed, inPrevious.n, hidesGroup(viewer, inPrevious.n - own(before.quarters).n));
  const change = changeFrom(passRate.rate, previousRate.rate);
  // learners measured in the period (by pseudonymous code), judged like every group by the learners of others
  const measured = learnerOutcomes(db, where);
  const ownMeasured = me === null ? 0 : learnerOutcomes(db, attemptConditions({ ...filters, instructorId: me })).learners;
  const measuredHidden = hidden || hidesGroup(viewer, measured.learners - ownMeasured);

  // the same test of change as the funder report: called only when its 95 % interval excludes zero
  const difference =
    passRate.suppressed || previousRate.suppressed ? null : proportionDifference(inPeriod.passed, inPeriod.n, inPrevious.passed, inPrevious.n);

  // feedback modes add up to the period; the quarters of a range do too
  const feedbackOthers = feedbackModes.map((mode) => byFeedback.get(mode)!.n - own(period.quarters, mode).n);
  const feedbackHidden = withComplementaryHiding(viewer, feedbackOthers, feedbackOthers.map((n) => hidesGroup(viewer, n)));
  const quarterOthers = trend.quarters.map((q) => byQuarter.get(q)!.n - own([q]).n);
  const quarterHidden = quarterOthers.map((n) => hidesGroup(viewer, n));
  const seriesHidden = period.quarters.length > 1 ? withComplementaryHiding(viewer, quarterOthers, quarterHidden) : quarterHidden;

  const logs = db
    .select({ classes: sql<number>`count(*)`, learners: sql<number>`coalesce(sum(${classes.learners}), 0)`, passed: sql<number>`coalesce(sum(${classes.passed}), 0)` })
    .from(classes)
    .where(classConditions(filters))
    .get()!;
  const ownLearners =
    me === null ? 0 : db.select({ learners: sql<number>`coalesce(sum(${classes.learners}), 0)` }).from(classes).where(classConditions({ ...filters, instructorId: me })).get()!.learners;

  const pairs = inPeriod.pp + inPeriod.pf + inPeriod.fp + inPeriod.ff;
  const pairsHidden = hidden || hidesGroup(viewer, pairs - own(period.quarters).pairs);
  const kappa = cohensKappa([
    [inPeriod.pp, inPeriod.pf],
    [inPeriod.fp, inPeriod.ff],
  ]);

  // hidden quarters stay out of the centre line too, so it cannot be used to work them out
  const chart = pChart(trend.quarters.map((q, i) => (seriesHidden[i] ? { n: 0, count: 0 } : { n: byQuarter.get(q)!.n, count: byQuarter.get(q)!.passed })));
  // scores per feedback mode, sorted; the period's median is that of both lists together
  const scores = new Map(
    feedbackModes.map((mode) => [mode, hidden ? new Float64Array() : sortedValues(db, attempts.score, and(where, eq(attempts.feedback, mode))!)]),
  );

  return {
    period,
    previousPeriod: before,
    suppressionMinCount: viewer.suppressionMinCount,
    suppressed: hidden,
    learners: hidden ? null : logs.learners,
    classes: hidden ? null : logs.classes,
    attempts: hidden ? null : inPeriod.n,
    passRate,
    passRateChange: {
      previous: previousRate,
      absolute: change.absolute,
      relative: change.relative,
      low: difference?.low ?? null,
      high: difference?.high ?? null,
      verdict: difference ? changeVerdict(difference) : null,
    },
    learnerOutcomes: {
      measured: measuredHidden ? null : measured.learners,
      firstAttempt: rateFor(measured.firstPassed, measured.learners, measuredHidden),
      everPassed: rateFor(measured.everPassed, measured.learners, measuredHidden),
    },
    recordedCompletion: rateFor(Math.min(logs.passed, logs.learners), logs.learners, hidden || hidesGroup(viewer, logs.learners - ownLearners)),
    agreement: pairsHidden
      ? { pairs: null, table: null, observed: null, expected: null, kappa: null, suppressed: true }
      : {
          pairs,
          table: [
            [inPeriod.pp, inPeriod.pf],
            [inPeriod.fp, inPeriod.ff],
          ],
          observed: kappa.p0,
          expected: kappa.pe,
          kappa: kappa.kappa,
          suppressed: false,
        },
    medianScore: hidden ? null : medianOfSorted(sortedUnion(scores.get("live")!, scores.get("hidden")!)),
    series: {
      centre: chart.centre,
      runChart: runChartSignals(chart.points.flatMap((point, i) => (seriesHidden[i] || point.p === null ? [] : [point.p]))),
      points: trend.quarters.map((quarter, i) => {
        if (seriesHidden[i]) {
          return { quarter, attempts: null, passed: null, rate: null, low: null, high: null, lcl: null, ucl: null, outside: false, suppressed: true };
        }
        const point = chart.points[i];
        const rate = rateOf(point.count, point.n);
        return { quarter, attempts: point.n, passed: point.count, rate: point.p, low: rate.low, high: rate.high, lcl: point.lcl, ucl: point.ucl, outside: point.outside, suppressed: false };
      }),
    },
    errors: errorPareto(inPeriod.errors, inPeriod.n, hidden),
    feedback: feedbackModes.map((mode, i) => {
      const tally = byFeedback.get(mode)!;
      const groupHidden = feedbackHidden[i];
      return {
        mode,
        attempts: groupHidden ? null : tally.n,
        passRate: rateFor(tally.passed, tally.n, groupHidden),
        medianScore: groupHidden ? null : medianOfSorted(scores.get(mode)!),
        suppressed: groupHidden,
      };
    }),
  };
}
