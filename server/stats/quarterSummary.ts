// One quarter of the network in numbers: activity from the class logs, attempt results, typical quality,
// errors, the effect of live feedback and how well instructors' judgement agrees with Quarterbeat's.
// Class-log counts come from SQL over the classes; attempt figures from the attempt summaries
// (metrics/summaries) as on every page and in the funder report; intervals from shared/stats.
import { wilsonInterval } from "../../shared/stats/wilson";
import { cohensKappa } from "../../shared/stats/kappa";
import { kappaInterval, mcnemarExactP, pabak } from "../../shared/stats/agreement";
import { changeVerdict, proportionDifference, type ChangeVerdict } from "../../shared/stats/difference";
import type { FeedbackMode } from "../../shared/domain";
import type { AttemptError } from "../../shared/scoring/scoreAttempt";
import { parseQuarter, previousQuarter } from "../../shared/period";
import type { Db } from "../db/client";
import { learnerOutcomes } from "../metrics/learnerOutcomes";
import { ceilingFigures, medianAtCeiling } from "../metrics/ceiling";
import { addTally, emptyTally, judgedOf, medianOfCounts, networkScope, talliesBy, totalTally, valueCounts, type SummaryScope } from "../metrics/summaries";
import { badRequest } from "../errors";

export interface QuarterSummary {
  quarter: string;
  classes: number;
  learners: number;
  instructors: number;
  sites: number;
  attempts: number;
  passed: number;
  /** passed / attempts, 0–1; null without attempts. */
  pass_rate: number | null;
  /** Wilson 95 % interval of pass_rate. */
  pass_rate_ci95: [number, number] | null;
  /** Sum of instructors' recorded completions / sum of learners in the quarter's class logs. */
  course_pass_rate: number | null;
  /** Learner codes with at least one measured attempt in the quarter. */
  learners_measured: number;
  /** Share of measured learners whose earliest attempt of the quarter (by start time) passed. */
  first_attempt_pass_rate: number | null;
  /** Share of measured learners with at least one passed attempt: the like-for-like match to course_pass_rate. */
  ever_passed_rate: number | null;
  attempts_per_learner: number | null;
  /** Pass rate against the previous quarter; absent when that quarter has no attempts. */
  change?: { from: string; difference: number; ci95: [number, number]; verdict: ChangeVerdict };
  median: { score: number | null; depth_ok_pct: number | null; rate_ok_pct: number | null; recoil_ok_pct: number | null; hands_on_pct: number | null };
  /** For each metric whose median is 100 %: the share of attempts at 100 % and the 10th percentile, which say more. */
  at_ceiling: Partial<Record<(typeof MEDIAN_COLUMNS)[number], { share_at_100: number; p10: number }>>;
  /** Attempts with each error. */
  errors: Record<AttemptError, number>;
  by_feedback: { live: { attempts: number; pass_rate: number | null }; hidden: { attempts: number; pass_rate: number | null } };
  /** Instructor's pass/fail against Quarterbeat's, over attempts where the instructor gave one. */
  agreement: {
    attempts: number;
    kappa: number | null;
    kappa_ci95: [number, number] | null;
    pabak: number | null;
    /** Exact McNemar p: are the two kinds of disagreement balanced? */
    mcnemar_p: number;
    /** Attempts without an instructor's pass or fail. */
    unjudged: number;
    table: { both_pass: number; instructor_pass_measured_fail: number; instructor_fail_measured_pass: number; both_fail: number };
  };
}

export interface SummaryFilter {
  /** Only this instructor's classes and attempts. */
  instructorId?: number;
  siteId?: number;
}

const MEDIAN_COLUMNS = ["score", "depth_ok_pct", "rate_ok_pct", "recoil_ok_pct", "hands_on_pct"] as const;

export function quarterSummary(db: Db, quarter: string, filter: SummaryFilter = {}): QuarterSummary {
  try {
    parseQuarter(quarter);
  } catch (err) {
    throw badRequest((err as Error).message);
  }
  const sqlite = db.$client;
  let where = "quarter = ?";
  const params: (string | number)[] = [quarter];
  if (filter.instructorId !== undefined) {
    where += " AND instructor_id = ?";
    params.push(filter.instructorId);
  }
  if (filter.siteId !== undefined) {
    where += " AND site_id = ?";
    params.push(filter.siteId);
  }

  const logs = sqlite
    .prepare(
      `SELECT count(*) AS classes, coalesce(sum(learners), 0) AS learners, coalesce(sum(passed), 0) AS passed,
         count(DISTINCT instructor_id) AS instructors, count(DISTINCT site_id) AS sites FROM classes WHERE ${where}`,
    )
    .get(...params) as { classes: number; learners: number; passed: number; instructors: number; sites: number };

  // attempt figures from the attempt summaries, as the pages and the funder report read them
  const scope: SummaryScope = { ...networkScope(quarter, quarter), siteId: filter.siteId ?? null, instructorId: filter.instructorId ?? null };
  const byFeedback = talliesBy<FeedbackMode>(db, scope, "feedback");
  const total = [...byFeedback.values()].reduce(addTally, emptyTally());
  const live = byFeedback.get("live") ?? emptyTally();
  const hidden = byFeedback.get("hidden") ?? emptyTally();
  const rate = (passed: number, of: number) => (of > 0 ? passed / of : null);
  const attempts = total.n;
  const passed = total.passed;

  const medians = {} as QuarterSummary["median"];
  const atCeiling: QuarterSummary["at_ceiling"] = {};
  for (const column of MEDIAN_COLUMNS) {
    const counts = valueCounts(db, column, scope);
    medians[column] = medianOfCounts(counts);
    if (medianAtCeiling(counts)) {
      const figures = ceilingFigures(counts);
      atCeiling[column] = { share_at_100: figures.shareAtCeiling!, p10: figures.p10! };
    }
  }

  const errors = { ...total.errors };

  // Rater A = the instructor, rater B = Quarterbeat; rows/columns are (pass, fail).
  const table = [
    [total.pp, total.pf],
    [total.fp, total.ff],
  ] as const;
  const agreement = cohensKappa(table);

  const learners = learnerOutcomes(db, scope);

  const before = previousQuarter(quarter);
  const previousTally = totalTally(db, { ...scope, from: before, to: before });
  const previous = { attempts: previousTally.n, passed: previousTally.passed };
  const difference = previous.attempts > 0 ? proportionDifference(passed, attempts, previous.passed, previous.attempts) : null;

  return {
    quarter,
    classes: logs.classes,
    learners: logs.learners,
    instructors: logs.instructors,
    sites: logs.sites,
    attempts,
    passed,
    pass_rate: rate(passed, attempts),
    pass_rate_ci95: wilsonInterval(passed, attempts),
    course_pass_rate: rate(logs.passed, logs.learners),
    learners_measured: learners.learners,
    first_attempt_pass_rate: rate(learners.firstPassed, learners.learners),
    ever_passed_rate: rate(learners.everPassed, learners.learners),
    attempts_per_learner: rate(attempts, learners.learners),
    ...(difference
      ? {
          change: {
            from: before,
            difference: difference.difference,
            ci95: [difference.low, difference.high] as [number, number],
            verdict: changeVerdict(difference),
          },
        }
      : {}),
    median: medians,
    at_ceiling: atCeiling,
    errors,
    by_feedback: {
      live: { attempts: live.n, pass_rate: rate(live.passed, live.n) },
      hidden: { attempts: hidden.n, pass_rate: rate(hidden.passed, hidden.n) },
    },
    agreement: {
      attempts: agreement.n,
      kappa: agreement.kappa,
      kappa_ci95: kappaInterval(table),
      pabak: pabak(table),
      mcnemar_p: mcnemarExactP(table),
      unjudged: attempts - judgedOf(total),
      table: { both_pass: table[0][0], instructor_pass_measured_fail: table[0][1], instructor_fail_measured_pass: table[1][0], both_fail: table[1][1] },
    },
  };
}
