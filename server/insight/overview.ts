// The network overview: headline figures for the period, the quarterly pass-rate p-chart, the error Pareto
// and live-display against hidden-display results, read from the attempt summaries (metrics/summaries): the
// period by feedback display, and attempts and passes per quarter for the trend and the previous period.
//
// Shown to an instructor (or any viewer who does not see everyone), each figure is shown only when the
// released grid allows its scope (./release): the period, the previous period, each quarter of the trend and
// each feedback display are judged alike, so no two shown figures subtract to a small group.
import { sql } from "drizzle-orm";
import { feedbackModes, type FeedbackMode } from "../../shared/domain";
import type { OverviewAnswer } from "../../shared/schemas/insight";
import type { OverviewChartOptions } from "../../shared/schemas/chartSettings";
import { changeFrom, changeVerdict, cohensKappa, proportionDifference } from "../../shared/stats";
import type { Db } from "../db/client";
import { classes } from "../db/schema";
import { addTally, emptyTally, judgedOf, medianOfCounts, mergeCounts, talliesBy, valueCountsBy, type ValueCounts } from "../metrics/summaries";
import type { ResolvedFilters } from "./filters";
import { passRateSeries } from "./passRateSeries";
import { learnerOutcomes } from "../metrics/learnerOutcomes";
import { techniqueErrorPareto } from "./pareto";
import { previousPeriod, trendQuarters } from "../../shared/period";
import { rateFor } from "./rates";
import { classConditions, scopeOf } from "./sql";
import { mayShow } from "./release";
import { hidesGroup, type Viewer } from "./viewer";

export function overview(
  db: Db,
  viewer: Viewer,
  filters: ResolvedFilters,
  chart: OverviewChartOptions = { limits: "binomial", splitAt: null },
): OverviewAnswer {
  const period = filters.period;
  const before = previousPeriod(period);
  const trend = trendQuarters(period);
  const scan = { from: trend.from < before.from ? trend.from : before.from, to: period.to };

  // the period in full by feedback display, and attempts and passes per quarter for the trend and the previous
  // period, from the attempt summaries
  const byFeedback = talliesBy<FeedbackMode>(db, scopeOf(filters), "feedback");
  const inPeriod = [...byFeedback.values()].reduce(addTally, emptyTally());
  const byQuarterTally = talliesBy<string>(db, scopeOf(filters, scan), "quarter");
  const me = viewer.seesEveryone ? null : viewer.ownInstructorId;
  const tallyOfMode = (mode: FeedbackMode) => byFeedback.get(mode) ?? emptyTally();
  const byQuarter = new Map(trend.quarters.map((q) => [q, { n: byQuarterTally.get(q)?.n ?? 0, passed: byQuarterTally.get(q)?.passed ?? 0 }]));
  const inPrevious = { n: 0, passed: 0 };
  for (const [quarter, tally] of byQuarterTally) {
    if (quarter >= before.from && quarter <= before.to) {
      inPrevious.n += tally.n;
      inPrevious.passed += tally.passed;
    }
  }

  const hidden = !mayShow(db, viewer, scopeOf(filters));
  const passRate = rateFor(inPeriod.passed, inPeriod.n, hidden);
  const previousRate = rateFor(inPrevious.passed, inPrevious.n, !mayShow(db, viewer, scopeOf(filters, before)));
  const change = changeFrom(passRate.rate, previousRate.rate);
  // learners measured in the period (by pseudonymous code), judged like every group by the learners of others
  const measured = learnerOutcomes(db, scopeOf(filters));
  const ownMeasured = me === null ? 0 : learnerOutcomes(db, scopeOf({ ...filters, instructorId: me })).learners;
  const measuredHidden = hidden || hidesGroup(viewer, measured.learners - ownMeasured);

  // the same test of change as the funder report: called only when its 95 % interval excludes zero
  const difference = passRate.suppressed || previousRate.suppressed ? null : proportionDifference(inPeriod.passed, inPeriod.n, inPrevious.passed, inPrevious.n);

  // each feedback display and each quarter of the trend is a figure of its own, judged by the same grid
  // (a display the filters leave out holds nothing, and nothing is shown as nothing)
  const feedbackHidden = feedbackModes.map((mode) => (filters.feedback ?? mode) === mode && !mayShow(db, viewer, { ...scopeOf(filters), feedback: mode }));
  const seriesHidden = trend.quarters.map((quarter) => !mayShow(db, viewer, scopeOf(filters, { from: quarter, to: quarter })));

  const logs = db
    .select({
      classes: sql<number>`count(*)`,
      learners: sql<number>`coalesce(sum(${classes.learners}), 0)`,
      passed: sql<number>`coalesce(sum(${classes.passed}), 0)`,
    })
    .from(classes)
    .where(classConditions(filters))
    .get()!;
  const ownLearners =
    me === null
      ? 0
      : db
          .select({ learners: sql<number>`coalesce(sum(${classes.learners}), 0)` })
          .from(classes)
          .where(classConditions({ ...filters, instructorId: me }))
          .get()!.learners;

  const pairs = judgedOf(inPeriod);
  const pairsHidden = hidden || !mayShow(db, viewer, scopeOf(filters), "judged");
  const kappa = cohensKappa([
    [inPeriod.pp, inPeriod.pf],
    [inPeriod.fp, inPeriod.ff],
  ]);

  // scores per feedback display; the period's median is that of both distributions together
  const scores = hidden ? new Map<FeedbackMode, ValueCounts>() : valueCountsBy<FeedbackMode>(db, "score", scopeOf(filters), "feedback");
  const scoresOf = (mode: FeedbackMode) => scores.get(mode) ?? [];

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
    medianScore: hidden ? null : medianOfCounts(mergeCounts(...feedbackModes.map(scoresOf))),
    // centre and limits from stated baseline quarters, never from the quarters being judged (./passRateSeries)
    series: passRateSeries(db, viewer, filters, { quarters: trend.quarters, byQuarter, hidden: seriesHidden, limits: chart.limits, splitAt: chart.splitAt }),
    errors: techniqueErrorPareto(inPeriod.errors, inPeriod.n, hidden),
    feedback: feedbackModes.map((mode, i) => {
      const tally = tallyOfMode(mode);
      const groupHidden = feedbackHidden[i];
      return {
        mode,
        attempts: groupHidden ? null : tally.n,
        passRate: rateFor(tally.passed, tally.n, groupHidden),
        medianScore: groupHidden ? null : medianOfCounts(scoresOf(mode)),
        suppressed: groupHidden,
      };
    }),
  };
}
