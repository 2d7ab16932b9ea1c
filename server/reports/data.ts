// The funder report's content for one period: reach, measured pass rate with its interval, comparisons,
// trend, common errors with the coordinator's actions, live vs hidden display, instructor agreement and
// equipment use. Every figure passes through small-cell suppression here, so nothing downstream (web page,
// PDF, e-mail, CSV) can show a hidden cell by mistake.
import { reportActions } from "./actions";
import { eq } from "drizzle-orm";
import { courseTypes, feedbackModes } from "../../shared/domain";
import type { ErrorRow, GroupResult, RateFigure, ReportComparison, ReportData, TrendPoint } from "../../shared/schemas/report";
import { comparisonPeriods, parsePeriod, periodMonths, quartersOf, trailingQuarters, type ReportPeriod } from "../../shared/period";
import { GUIDELINE_SOURCES, SAFETY_NOTE, patientTypes, type NetworkPolicy } from "../../shared/scoring/policy";
import { attemptErrorNames } from "../../shared/scoring/scoreAttempt";
import { changeFrom, cohensKappa, pareto, pChart } from "../../shared/stats";
import type { Db } from "../db/client";
import { quarterNotes } from "../db/schema";
import { currentPolicy } from "../policy/service";
import { badRequest } from "../errors";
import { getSetting } from "../settings/store";
import { compareRates, differencePoints } from "./compare";
import { countFigure, formatPoints, hiddenText, perHundredFigure, rateFigure } from "./figures";
import { writeNarrative } from "./narrative";
import { passTallyByQuarter, reportNumbers, reportScope, type PassTally } from "./queries";
import { suppressBreakdown } from "../../shared/suppression";
import { courseTypeNames, errorLabels, feedbackNames, patientTypeNames, retentionGroupNames } from "../../shared/vocabulary";
import { learnerOutcomes } from "../metrics/learnerOutcomes";
import { retention } from "../metrics/retention";

export const TREND_QUARTERS = 8;
export const DEFAULT_NETWORK_NAME = "Quarterbeat training network";


export function networkName(db: Db): string {
  return getSetting(db, "network_name") ?? DEFAULT_NETWORK_NAME;
}

export function readQuarterNotes(db: Db, period: string): string {
  return db.select({ actions: quarterNotes.actions }).from(quarterNotes).where(eq(quarterNotes.quarter, period)).get()?.actions ?? "";
}

export function saveQuarterNotes(db: Db, period: string, actions: string, userId: number | null): void {
  const updatedAt = new Date().toISOString();
  db.insert(quarterNotes)
    .values({ quarter: period, actions, updatedBy: userId, updatedAt })
    .onConflictDoUpdate({ target: quarterNotes.quarter, set: { actions, updatedBy: userId, updatedAt } })
    .run();
}

function addTallies(tallies: PassTally[]): PassTally {
  return tallies.reduce((sum, t) => ({ attempts: sum.attempts + t.attempts, passed: sum.passed + t.passed }), { attempts: 0, passed: 0 });
}

/** Groups of attempts whose counts add up to the shown total: suppressed together. */
function groupResults(
  groups: { key: string; label: string; tally: PassTally }[],
  min: number,
  totalShown: boolean,
): GroupResult[] {
  const decision = suppressBreakdown(
    groups.map((g) => g.tally.attempts),
    min,
    totalShown,
  );
  return groups.map((group, i) => ({
    key: group.key,
    label: group.label,
    attempts: countFigure(group.tally.attempts, min, decision.cells[i]),
    passRate: rateFigure(group.tally.passed, group.tally.attempts, min, decision.cells[i]),
  }));
}

/**
 * Retention as a network figure. The groups together make up the period's learner–class pairs, so they are
 * suppressed as a breakdown whose total could be known (shared/suppression.ts).
 */
function retentionResults(db: Db, quarters: string[], min: number): NonNullable<ReportData["retention"]> {
  const answer = retention(db, quarters[0], quarters[quarters.length - 1]);
  const groups = [
    { key: "first_time", label: retentionGroupNames.first_time, tally: { attempts: answer.first_time.learners, passed: answer.first_time.passed } },
    ...answer.returning.map((bin) => ({ key: bin.months, label: retentionGroupNames[bin.months], tally: { attempts: bin.learners, passed: bin.passed } })),
  ];
  const [firstTime, ...returning] = groupResults(groups, min, true).map((g) => ({ key: g.key, label: g.label, learners: g.attempts, firstAttemptPassRate: g.passRate }));
  return { firstTime, returning };
}

export interface BuildOptions {
  /** When the report is made; fixed by callers that need the same output twice. */
  now?: Date;
  /** List the improvement actions started by the end of the period (the coordinator's choice). */
  includeActions?: boolean;
}

/** A report period named by a request or a command; anything else is answered as a bad request. */
export function reportPeriod(text: unknown): ReportPeriod {
  const period = typeof text === "string" ? parsePeriod(text) : null;
  if (!period) throw badRequest(`"${String(text)}" is not a report period. Use a quarter such as 2026-Q3 or a year such as 2026.`);
  return period;
}

export function buildReportData(db: Db, periodText: string, options: BuildOptions = {}): ReportData {
  const period = reportPeriod(periodText);
  const quarters = quartersOf(period);
  const { policy, version } = currentPolicy(db);
  const min = policy.suppressionMinCount;
  const numbers = reportNumbers(db, quarters);
  const measuredLearners = learnerOutcomes(db, reportScope(quarters));
  const hasData = numbers.classes > 0 || numbers.attempts.attempts > 0;

  // Reach
  const classes = countFigure(numbers.classes, min);
  const learners = countFigure(numbers.learners, min);
  const attemptsShown = countFigure(numbers.attempts.attempts, min);
  const classSplit = suppressBreakdown(
    courseTypes.map((c) => numbers.byCourse[c].classes),
    min,
    classes.hidden === null,
  );
  const learnerSplit = suppressBreakdown(
    courseTypes.map((c) => numbers.byCourse[c].learners),
    min,
    learners.hidden === null,
  );
  const byCourse = courseTypes.map((course, i) => ({
    key: course,
    label: courseTypeNames[course],
    classes: countFigure(numbers.byCourse[course].classes, min, classSplit.cells[i]),
    learners: countFigure(numbers.byCourse[course].learners, min, learnerSplit.cells[i]),
  }));

  // Pass rate, comparisons and trend
  const passRate = rateFigure(numbers.attempts.passed, numbers.attempts.attempts, min);
  const comparisonList = comparisonPeriods(period);
  const trendQuarters = trailingQuarters(period, TREND_QUARTERS);
  const neededQuarters = [...new Set([...trendQuarters, ...comparisonList.flatMap((c) => quartersOf(c.period))])];
  const tallies = passTallyByQuarter(db, neededQuarters);

  const comparisons: ReportComparison[] = comparisonList.map(({ label, period: earlier }) => {
    const tally = addTallies(quartersOf(earlier).map((q) => tallies.get(q)!));
    const earlierRate = rateFigure(tally.passed, tally.attempts, min);
    const verdict = compareRates(passRate, earlierRate);
    const points = differencePoints(passRate, earlierRate);
    return {
      label,
      period: earlier.id,
      passRate: earlierRate,
      changePoints: points,
      relativeChange: points === null ? null : changeFrom(passRate.value, earlierRate.value).relative,
      verdict,
      text: comparisonText(label, passRate, earlierRate, verdict, points),
    };
  });

  const trendTallies = trendQuarters.map((q) => tallies.get(q)!);
  const chart = pChart(trendTallies.map((t) => ({ n: t.attempts, count: t.passed })));
  const trendPoints: TrendPoint[] = trendQuarters.map((quarter, i) => {
    const rate = rateFigure(trendTallies[i].passed, trendTallies[i].attempts, min);
    const point = chart.points[i];
    // a hidden quarter's limits would give away its size, so they go with it
    const shown = rate.hidden === null && point.p !== null;
    return { quarter, passRate: rate, lcl: shown ? point.lcl : null, ucl: shown ? point.ucl : null, outside: shown && point.outside };
  });

  // Errors (Pareto). Shares of the total give the total away, so the breakdown is treated as having one.
  const paretoRows = pareto(Object.fromEntries(attemptErrorNames.map((name, bit) => [name, numbers.errorCounts[bit]])));
  const errorSplit = suppressBreakdown(
    paretoRows.map((r) => r.count),
    min,
    true,
  );
  let prefixShown = true;
  const errorRows: ErrorRow[] = paretoRows.map((row, i) => {
    const hidden = errorSplit.total ?? errorSplit.cells[i];
    prefixShown = prefixShown && hidden === null;
    return {
      name: row.name,
      label: errorLabels[row.name as keyof typeof errorLabels] ?? row.name,
      count: countFigure(row.count, min, hidden),
      share: hidden === null ? row.share : null,
      cumulativeShare: prefixShown ? row.cumulativeShare : null,
    };
  });

  // Live vs hidden display
  const feedbackGroups = groupResults(
    feedbackModes.map((mode) => ({ key: mode, label: feedbackNames[mode], tally: numbers.byFeedback[mode] })),
    min,
    attemptsShown.hidden === null,
  );
  const [live, hiddenDisplay] = feedbackGroups;

  // Instructors' judgement vs measurement
  const kappa = cohensKappa(numbers.agreement);
  const pairs = countFigure(kappa.n, min);
  const kappaShown = pairs.hidden === null && kappa.kappa !== null;
  const completions = Math.min(numbers.completions, numbers.learners);

  // Equipment
  const manikinsUsed = countFigure(numbers.manikinsUsed, min);

  const data: ReportData = {
    period: period.id,
    kind: period.kind,
    periodLabel: periodMonths(period),
    quarters,
    networkName: networkName(db),
    generatedAt: (options.now ?? new Date()).toISOString(),
    policyVersion: version,
    suppressionMinCount: min,
    hasData,
    reach: {
      classes,
      learners,
      sites: countFigure(numbers.sites, min),
      instructors: countFigure(numbers.instructors, min),
      attempts: attemptsShown,
      byCourse,
    },
    passRate,
    comparisons,
    trend: { points: trendPoints, centre: chart.centre },
    byPatientType: groupResults(
      patientTypes.map((p) => ({ key: p, label: patientTypeNames[p], tally: numbers.byPatientType[p] })),
      min,
      attemptsShown.hidden === null,
    ),
    errors: { rows: errorRows, attemptsWithErrors: countFigure(numbers.attemptsWithErrors, min), actions: readQuarterNotes(db, period.id) },
    feedback: {
      live,
      hidden: hiddenDisplay,
      differencePoints: differencePoints(live.passRate, hiddenDisplay.passRate),
      verdict: compareRates(live.passRate, hiddenDisplay.passRate),
    },
    agreement: {
      pairs,
      kappa: kappaShown ? kappa.kappa : null,
      observedAgreement: kappaShown ? kappa.p0 : null,
      kappaText: kappaShown ? kappa.kappa!.toFixed(2) : pairs.hidden ? hiddenText(pairs.hidden, min) : "not available",
      completionRate: rateFigure(completions, numbers.learners, min),
      everPassedRate: rateFigure(measuredLearners.everPassed, measuredLearners.learners, min),
      objectivePassRate: passRate,
    },
    equipment: {
      manikinsUsed,
      compressions: countFigure(numbers.compressions, min),
      compressionsPerManikin: manikinsUsed.hidden === null && numbers.manikinsUsed > 0 ? numbers.compressions / numbers.manikinsUsed : null,
      lungsPer100Learners: perHundredFigure(numbers.lungsReplaced, numbers.learners, min),
      mouthpiecesPer100Learners: perHundredFigure(numbers.mouthpiecesCleaned, numbers.learners, min),
      batteriesPer100Learners: perHundredFigure(numbers.batteriesReplaced, numbers.learners, min),
      services: countFigure(numbers.services, min),
      faults: countFigure(numbers.faults, min),
    },
    methods: methodsText(policy, version, numbers.policyVersions),
    narrative: [],
    retention: retentionResults(db, quarters, min),
    ...(options.includeActions ? { improvementActions: reportActions(db, period) } : {}),
  };
  data.narrative = writeNarrative(data);
  return data;
}

function comparisonText(
  label: string,
  current: RateFigure,
  earlier: RateFigure,
  verdict: ReportComparison["verdict"],
  points: number | null,
): string {
  if (current.value === null) return `Too few attempts in this period to compare with ${label}.`;
  if (earlier.value === null) return `Too few attempts in ${label} to compare with.`;
  if (verdict === "no clear change" || verdict === null || points === null) return `No clear change from ${label} (${earlier.text}).`;
  return `${verdict === "up" ? "Up" : "Down"} ${formatPoints(points)} on ${label} (${earlier.text}).`;
}

function methodsText(policy: NetworkPolicy, version: number, scoredUnder: number[]): ReportData["methods"] {
  const rule = policy.passRule;
  return {
    scoredUnderVersions: scoredUnder,
    bands: patientTypes.map((p) => {
      const band = policy.bands[p];
      return {
        key: p,
        label: patientTypeNames[p],
        depth: `${band.depthMinMm}–${band.depthMaxMm} mm`,
        rate: `${band.rateMin}–${band.rateMax} per minute`,
        recoil: `released to within ${band.recoilMaxMm} mm`,
      };
    }),
    passRule: [
      `at least ${rule.minDepthOkPct} % of compressions at the target depth`,
      `at least ${rule.minRateOkPct} % of compressions at the target rate`,
      `at least ${rule.minRecoilOkPct} % of compressions fully released`,
      `hands on the chest for at least ${rule.minHandsOnPct} % of the attempt`,
      `no interruption longer than ${rule.maxLongestPauseS} s`,
    ],
    passRuleNote: `The pass rule is network policy (version ${version}), not a guideline value.`,
    sources: GUIDELINE_SOURCES.map((s) => s.citation),
    safetyNote: SAFETY_NOTE,
    suppressionNote:
      `To protect learners and instructors, any count below ${policy.suppressionMinCount}, and any rate made from fewer than ` +
      `${policy.suppressionMinCount}, reads "fewer than ${policy.suppressionMinCount}". Where a shown total would give a ` +
      `hidden figure away, another figure is hidden too and reads "not shown".`,
  };
}
