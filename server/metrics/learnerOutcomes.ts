// Outcomes per learner rather than per attempt, from the pseudonymous learner codes: how many learners were
// measured, how many passed on their first attempt (their earliest attempt among the chosen ones: in their
// earliest quarter of the period, by start time, ties by attempt id) and how many passed at least once. Recorded completion in the class logs counts
// learners, so "passed at least once" is the like-for-like figure to set beside it. One definition, used by
// the overview, the funder report and the statistics command; read from learner_tallies (each learner's
// attempts, passes and earliest attempt per group) or, for the whole network, learner_quarter_counts (learner
// quarters counted by their previous quarters) — kept by triggers, never read from the attempts themselves.
import { sql } from "drizzle-orm";
import type { Db } from "../db/client";
import { learnerQuarterCounts, learnerTallies } from "../db/schema";
import { scopeConditions, type SummaryScope } from "./summaries";

export interface LearnerOutcomes {
  learners: number;
  firstPassed: number;
  everPassed: number;
}

type OutcomeRow = { learners: number; first_passed: number | null; ever_passed: number | null };

function outcomesOf(row: OutcomeRow): LearnerOutcomes {
  return { learners: row.learners, firstPassed: row.first_passed ?? 0, everPassed: row.ever_passed ?? 0 };
}

export function learnerOutcomes(db: Db, scope: SummaryScope): LearnerOutcomes {
  const networkWide = scope.siteId === null && scope.profile === null && scope.feedback === null && scope.instructorId === null && scope.manikinId === null;
  if (networkWide) {
    // each learner counts once, at their earliest quarter in the period (the row whose previous quarter lies
    // before it), and as passed at least once at their earliest quarter with a pass in the period; the rows are
    // counted by quarter and previous quarters ('' for none, before every quarter) in learner_quarter_counts
    return outcomesOf(
      db.get<OutcomeRow>(sql`
        SELECT coalesce(sum(CASE WHEN ${learnerQuarterCounts.prevQuarter} < ${scope.from} THEN ${learnerQuarterCounts.learners} END), 0) AS learners,
          sum(CASE WHEN ${learnerQuarterCounts.prevQuarter} < ${scope.from} THEN ${learnerQuarterCounts.firstPassed} END) AS first_passed,
          sum(CASE WHEN ${learnerQuarterCounts.prevPassQuarter} < ${scope.from} THEN ${learnerQuarterCounts.withPass} END) AS ever_passed
        FROM ${learnerQuarterCounts} WHERE ${learnerQuarterCounts.quarter} BETWEEN ${scope.from} AND ${scope.to}`),
    );
  }
  // narrowed to a site, instructor, manikin, patient type or feedback display: several rows per learner, of
  // which the earliest (quarter, then start time, then id) decides the first attempt
  return outcomesOf(
    db.get<OutcomeRow>(sql`
      WITH ranked AS (
        SELECT ${learnerTallies.firstPassed} AS first_passed,
          row_number() OVER (PARTITION BY ${learnerTallies.learner}
            ORDER BY ${learnerTallies.quarter}, ${learnerTallies.firstStarted}, ${learnerTallies.firstId}) AS k,
          max(${learnerTallies.passed} > 0) OVER (PARTITION BY ${learnerTallies.learner}) AS ever_passed
        FROM ${learnerTallies} WHERE ${scopeConditions(learnerTallies, scope)}
      )
      SELECT count(*) AS learners, sum(first_passed) AS first_passed, sum(ever_passed) AS ever_passed FROM ranked WHERE k = 1`),
  );
}
