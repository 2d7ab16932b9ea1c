// Outcomes per learner rather than per attempt, from the pseudonymous learner codes: how many learners were
// measured, how many passed on their first attempt (their earliest attempt among the chosen ones, by start
// time, ties by attempt id) and how many passed at least once. Recorded completion in the class logs counts
// learners, so "passed at least once" is the like-for-like figure to set beside it. One definition, used by
// the overview, the funder report and the statistics command; read from learner_tallies (each learner's
// attempts, passes and earliest attempt per group) or, for the whole network, learner_quarters (the same per
// learner and quarter) — both kept by triggers, never read from the attempts themselves.
import { sql } from "drizzle-orm";
import type { Db } from "../db/client";
import { learnerQuarters, learnerTallies } from "../db/schema";
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
  if (networkWide && scope.from === scope.to) {
    // one network quarter: each learner is one row
    return outcomesOf(
      db.get<OutcomeRow>(sql`
        SELECT count(*) AS learners, sum(${learnerQuarters.firstPassed}) AS first_passed, sum(${learnerQuarters.passed} > 0) AS ever_passed
        FROM ${learnerQuarters} WHERE ${learnerQuarters.quarter} = ${scope.from}`),
    );
  }
  // several rows per learner (several quarters or groups): the earliest decides the first attempt
  const [table, where] = networkWide
    ? [learnerQuarters, sql`${learnerQuarters.quarter} BETWEEN ${scope.from} AND ${scope.to}`]
    : [learnerTallies, scopeConditions(learnerTallies, scope)];
  return outcomesOf(
    db.get<OutcomeRow>(sql`
      WITH ranked AS (
        SELECT ${table.firstPassed} AS first_passed,
          row_number() OVER (PARTITION BY ${table.learner} ORDER BY ${table.firstStarted}, ${table.firstId}) AS k,
          max(${table.passed} > 0) OVER (PARTITION BY ${table.learner}) AS ever_passed
        FROM ${table} WHERE ${where}
      )
      SELECT count(*) AS learners, sum(first_passed) AS first_passed, sum(ever_passed) AS ever_passed FROM ranked WHERE k = 1`),
  );
}
