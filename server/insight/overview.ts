// The network overview: headline figures for the period, the quarterly pass-rate p-chart, the error Pareto
// and live-display against hidden-display results. One grouped scan of attempts (by quarter and feedback
// mode) feeds everything but the medians and the class logs.
import { and, eq, sql } from "drizzle-orm";
import { feedbackModes, type FeedbackMode } from "../../shared/domain";
import type { OverviewAnswer } from "../../shared/schemas/insight";
import { attemptErrorNames, type AttemptError } from "../../shared/scoring/scoreAttempt";
import { changeFrom, cohensKappa, pChart } from "../../shared/stats";
import type { Db } from "../db/client";
import { attempts, classes } from "../db/schema";
import { ownRowsOnly, type ResolvedFilters } from "./filters";
import { errorPareto } from "./pareto";
import { previousPeriod, trendQuarters } from "./quarters";
import { rateFor } from "./rates";
import { attemptConditions, classConditions, errorCountColumns, errorCountsOf, medianOfSorted, sortedUnion, sortedValues } from "./sql";
import { hidesGroup, type Viewer } from "./viewer";

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

export function overview(db: Db, viewer: Viewer, filters: ResolvedFilters): OverviewAnswer {
  const own = ownRowsOnly(viewer, filters);
  const hides = (n: number) => hidesGroup(viewer, n, own);
  const period = filters.period;
  const before = previousPeriod(period);
  const trend = trendQuarters(period);
  const scanFrom = trend.from < before.from ? trend.from : before.from;

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
    .where(attemptConditions(filters, { from: scanFrom, to: period.to }))
    .groupBy(attempts.quarter)
    .all();

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

  const hidden = hides(inPeriod.n);
  const passRate = rateFor(inPeriod.passed, inPeriod.n, hidden);
  const previousRate = rateFor(inPrevious.passed, inPrevious.n, hides(inPrevious.n));
  const change = changeFrom(passRate.rate, previousRate.rate);

  const logs = db
    .select({ classes: sql<number>`count(*)`, learners: sql<number>`coalesce(sum(${classes.learners}), 0)`, passed: sql<number>`coalesce(sum(${classes.passed}), 0)` })
    .from(classes)
    .where(classConditions(filters))
    .get()!;

  const pairs = inPeriod.pp + inPeriod.pf + inPeriod.fp + inPeriod.ff;
  const pairsHidden = hidden || hides(pairs);
  const kappa = cohensKappa([
    [inPeriod.pp, inPeriod.pf],
    [inPeriod.fp, inPeriod.ff],
  ]);

  const chart = pChart(trend.quarters.map((q) => ({ n: byQuarter.get(q)!.n, count: byQuarter.get(q)!.passed })));
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
    passRateChange: { previous: previousRate, absolute: change.absolute, relative: change.relative },
    recordedCompletion: rateFor(Math.min(logs.passed, logs.learners), logs.learners, hidden || hides(logs.learners)),
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
      points: trend.quarters.map((quarter, i) => {
        const point = chart.points[i];
        const rate = rateFor(point.count, point.n, hides(point.n));
        if (rate.suppressed) {
          return { quarter, attempts: null, passed: null, rate: null, low: null, high: null, lcl: null, ucl: null, outside: false, suppressed: true };
        }
        return { quarter, attempts: point.n, passed: point.count, rate: point.p, low: rate.low, high: rate.high, lcl: point.lcl, ucl: point.ucl, outside: point.outside, suppressed: false };
      }),
    },
    errors: errorPareto(inPeriod.errors, inPeriod.n, hidden),
    feedback: feedbackModes.map((mode) => {
      const tally = byFeedback.get(mode)!;
      const groupHidden = hides(tally.n);
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
