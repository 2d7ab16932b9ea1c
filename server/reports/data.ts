// The funder report's content for one period: reach, measured pass rate with its interval, comparisons,
// trend, common errors with the coordinator's actions, live vs hidden display, instructor agreement and
// equipment use. Every figure passes through small-cell suppression here, so nothing downstream (web page,
// PDF, e-mail, CSV, API) can show a hidden cell by mistake; which counts hide is decided once for every report
// of every period together (./family.ts), so no report can be subtracted from another to reveal one.
import { reportActions } from "./actions";
import { eq } from "drizzle-orm";
import { courseTypes, feedbackModes } from "../../shared/domain";
import type { ErrorRow, GroupResult, HiddenReason, RateFigure, ReportComparison, ReportData, TrendPoint } from "../../shared/schemas/report";
import { hiddenReasonOf } from "../../shared/suppression";
import { comparisonPeriods, parsePeriod, periodMonths, quartersBetween, quartersOf, trailingQuarters, type ReportPeriod } from "../../shared/period";
import { GUIDELINE_SOURCES, SAFETY_NOTE, patientTypes, type NetworkPolicy } from "../../shared/scoring/policy";
import { attemptErrorNames } from "../../shared/scoring/scoreAttempt";
import { changeFrom, cohensKappa, pareto, pChart } from "../../shared/stats";
import type { Db } from "../db/client";
import { quarterNotes } from "../db/schema";
import { currentPolicy } from "../policy/service";
import { badRequest } from "../errors";
import { getSetting } from "../settings/store";
import { compareRates, differencePoints } from "./compare";
import { familyRelease, type FamilyBreakdown, type FamilyMeasure, type FamilyRelease } from "./family";
import { countFigure, formatPoints, hiddenText, perHundredFigure, plainCount, rateFigure } from "./figures";
import { writeNarrative } from "./narrative";
import { passTallyByQuarter, reportNumbers, reportScope, type PassTally } from "./queries";
import { courseTypeNames, errorLabels, feedbackNames, patientTypeNames, retentionGroupNames } from "../../shared/vocabulary";
import { learnerOutcomes } from "../metrics/learnerOutcomes";
import { chartBaseline } from "../insight/chartBaseline";
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

/**
 * The control chart's baseline: the quarters the overview's chart takes its centre from (a coordinator's
 * setting, or the first four quarters with attempts), cut at the report's last quarter so a report never
 * rests on what came after it. A quarter the report family hides stays out, so the centre cannot be used to
 * work it out; without a baseline quarter before the period ends, there is no centre and no limits.
 */
function reportBaseline(
  db: Db,
  family: FamilyRelease,
  lastQuarter: string,
): { samples: { n: number; count: number }[]; range: { from: string; to: string } | null } {
  const stated = chartBaseline(db);
  if (stated.from === null || stated.to === null || stated.from > lastQuarter) return { samples: [], range: null };
  const to = stated.to < lastQuarter ? stated.to : lastQuarter;
  const baselineQuarters = quartersBetween(stated.from, to);
  const tallies = passTallyByQuarter(db, baselineQuarters);
  const samples = baselineQuarters.flatMap((quarter) => {
    const tally = tallies.get(quarter)!;
    if (tally.attempts === 0 || family.hidden("attempts", [quarter], tally.attempts) !== null) return [];
    return [{ n: tally.attempts, count: tally.passed }];
  });
  return { samples, range: samples.length === 0 ? null : { from: stated.from, to } };
}

/** The family's decision for one measure over the report's quarters. */
function decisionOf(family: FamilyRelease, measure: FamilyMeasure, quarters: readonly string[]) {
  return (value: number, breakdown?: FamilyBreakdown, category?: string | null) => family.hidden(measure, quarters, value, breakdown, category);
}

/** Groups of one breakdown (patient types, displays, retention groups): each count and its rate hidden as the family decided. */
function groupResults(
  groups: { key: string; label: string; tally: PassTally }[],
  min: number,
  hidden: (value: number, category: string) => HiddenReason | null,
): GroupResult[] {
  return groups.map((group) => {
    const decided = hidden(group.tally.attempts, group.key);
    return {
      key: group.key,
      label: group.label,
      attempts: countFigure(group.tally.attempts, min, decided),
      passRate: rateFigure(group.tally.passed, group.tally.attempts, min, decided),
    };
  });
}

/** Retention as a network figure: learner–class pairs by group, one breakdown of the family's "retention" measure. */
function retentionResults(db: Db, quarters: string[], min: number, family: FamilyRelease): NonNullable<ReportData["retention"]> {
  const answer = retention(db, quarters[0], quarters[quarters.length - 1]);
  const groups = [
    { key: "first_time", label: retentionGroupNames.first_time, tally: { attempts: answer.first_time.learners, passed: answer.first_time.passed } },
    ...answer.returning.map((bin) => ({ key: bin.months, label: retentionGroupNames[bin.months], tally: { attempts: bin.learners, passed: bin.passed } })),
  ];
  const hidden = decisionOf(family, "retention", quarters);
  const [firstTime, ...returning] = groupResults(groups, min, (value, key) => hidden(value, "group", key)).map((g) => ({
    key: g.key,
    label: g.label,
    learners: g.attempts,
    firstAttemptPassRate: g.passRate,
  }));
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
  const family = familyRelease(db, min);
  const attemptsHidden = decisionOf(family, "attempts", quarters);
  const classesHidden = decisionOf(family, "classes", quarters);
  const learnersHidden = decisionOf(family, "learners", quarters);

  // Reach
  const classes = countFigure(numbers.classes, min, classesHidden(numbers.classes));
  const learners = countFigure(numbers.learners, min, learnersHidden(numbers.learners));
  const attemptsShown = countFigure(numbers.attempts.attempts, min, attemptsHidden(numbers.attempts.attempts));
  const byCourse = courseTypes.map((course) => ({
    key: course,
    label: courseTypeNames[course],
    classes: countFigure(numbers.byCourse[course].classes, min, classesHidden(numbers.byCourse[course].classes, "course", course)),
    learners: countFigure(numbers.byCourse[course].learners, min, learnersHidden(numbers.byCourse[course].learners, "course", course)),
  }));

  // Pass rate, comparisons and trend: every rate hidden exactly when its count of attempts is
  const passRate = rateFigure(numbers.attempts.passed, numbers.attempts.attempts, min, attemptsShown.hidden);
  const comparisonList = comparisonPeriods(period);
  const trendQuarters = trailingQuarters(period, TREND_QUARTERS);
  const neededQuarters = [...new Set([...trendQuarters, ...comparisonList.flatMap((c) => quartersOf(c.period))])];
  const tallies = passTallyByQuarter(db, neededQuarters);

  const comparisons: ReportComparison[] = comparisonList.map(({ label, period: earlier }) => {
    const earlierQuarters = quartersOf(earlier);
    const tally = addTallies(earlierQuarters.map((q) => tallies.get(q)!));
    const earlierRate = rateFigure(tally.passed, tally.attempts, min, family.hidden("attempts", earlierQuarters, tally.attempts));
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
  const baseline = reportBaseline(db, family, quarters[quarters.length - 1]);
  const chart = pChart(
    trendTallies.map((t) => ({ n: t.attempts, count: t.passed })),
    { baseline: baseline.samples },
  );
  const trendPoints: TrendPoint[] = trendQuarters.map((quarter, i) => {
    const rate = rateFigure(trendTallies[i].passed, trendTallies[i].attempts, min, family.hidden("attempts", [quarter], trendTallies[i].attempts));
    const point = chart.points[i];
    // a hidden quarter's limits would give away its size, so they go with it
    const shown = rate.hidden === null && point.p !== null;
    return { quarter, passRate: rate, lcl: shown ? point.lcl : null, ucl: shown ? point.ucl : null, outside: shown && point.outside };
  });

  // Errors (Pareto). A share of all errors gives that total away, so shares show only with the total.
  const paretoRows = pareto(Object.fromEntries(attemptErrorNames.map((name, bit) => [name, numbers.errorCounts[bit]])));
  const errorsHidden = decisionOf(family, "errors", quarters);
  const errorTotal = numbers.errorCounts.reduce((sum, n) => sum + n, 0);
  const errorTotalShown = errorsHidden(errorTotal) === null;
  let prefixShown = errorTotalShown;
  const errorRows: ErrorRow[] = paretoRows.map((row) => {
    const hidden = errorsHidden(row.count, "error", row.name);
    prefixShown = prefixShown && hidden === null;
    return {
      name: row.name,
      label: errorLabels[row.name as keyof typeof errorLabels] ?? row.name,
      count: countFigure(row.count, min, hidden),
      share: errorTotalShown && hidden === null ? row.share : null,
      cumulativeShare: prefixShown ? row.cumulativeShare : null,
    };
  });

  // Live vs hidden display
  const feedbackGroups = groupResults(
    feedbackModes.map((mode) => ({ key: mode, label: feedbackNames[mode], tally: numbers.byFeedback[mode] })),
    min,
    (value, mode) => attemptsHidden(value, "feedback", mode),
  );
  const [live, hiddenDisplay] = feedbackGroups;

  // Instructors' judgement vs measurement
  const kappa = cohensKappa(numbers.agreement);
  const pairs = countFigure(kappa.n, min, family.hidden("judged", quarters, kappa.n));
  const kappaShown = pairs.hidden === null && kappa.kappa !== null;
  const completions = Math.min(numbers.completions, numbers.learners);

  // Equipment. Manikins, services and faults describe no person; compressions are a sum over the attempts
  // and hide with their count.
  const manikinsUsed = plainCount(numbers.manikinsUsed);
  const compressions = countFigure(numbers.compressions, min, attemptsShown.hidden && hiddenReasonOf(numbers.compressions, min));

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
      sites: plainCount(numbers.sites),
      instructors: countFigure(numbers.instructors, min),
      attempts: attemptsShown,
      byCourse,
    },
    passRate,
    comparisons,
    trend: { points: trendPoints, centre: chart.centre, baseline: baseline.range },
    byPatientType: groupResults(
      patientTypes.map((p) => ({ key: p, label: patientTypeNames[p], tally: numbers.byPatientType[p] })),
      min,
      (value, profile) => attemptsHidden(value, "profile", profile),
    ),
    errors: {
      rows: errorRows,
      attemptsWithErrors: countFigure(numbers.attemptsWithErrors, min, family.hidden("attemptsWithErrors", quarters, numbers.attemptsWithErrors)),
      actions: readQuarterNotes(db, period.id),
    },
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
      completionRate: rateFigure(completions, numbers.learners, min, learners.hidden),
      everPassedRate: rateFigure(measuredLearners.everPassed, measuredLearners.learners, min),
      objectivePassRate: passRate,
    },
    equipment: {
      manikinsUsed,
      compressions,
      compressionsPerManikin: compressions.hidden === null && numbers.manikinsUsed > 0 ? numbers.compressions / numbers.manikinsUsed : null,
      lungsPer100Learners: perHundredFigure(numbers.lungsReplaced, numbers.learners, min, learners.hidden),
      mouthpiecesPer100Learners: perHundredFigure(numbers.mouthpiecesCleaned, numbers.learners, min, learners.hidden),
      batteriesPer100Learners: perHundredFigure(numbers.batteriesReplaced, numbers.learners, min, learners.hidden),
      services: plainCount(numbers.services),
      faults: plainCount(numbers.faults),
    },
    methods: methodsText(policy, version, numbers.policyVersions),
    narrative: [],
    retention: retentionResults(db, quarters, min, family),
    ...(options.includeActions ? { improvementActions: reportActions(db, period) } : {}),
  };
  data.narrative = writeNarrative(data);
  return data;
}

function comparisonText(label: string, current: RateFigure, earlier: RateFigure, verdict: ReportComparison["verdict"], points: number | null): string {
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
      `To protect learners and instructors, a count of people or their activity below ${policy.suppressionMinCount} reads ` +
      `"fewer than ${policy.suppressionMinCount}", and a period or group with none reads "no data". Where a figure shown here or in ` +
      `another quarter's or year's report would give a hidden count away by subtraction, that figure is hidden too and reads ` +
      `"not shown". A rate or figure per 100 learners reads "hidden" when the group it is made of is hidden. Counts of sites, ` +
      `manikins, services and faults describe no person and are always shown.`,
  };
}
