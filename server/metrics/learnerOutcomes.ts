// Outcomes per learner rather than per attempt, from the pseudonymous learner codes: how many learners were
// measured, how many passed on their first attempt (their earliest attempt among the chosen ones, by start
// time, ties by attempt id) and how many passed at least once. Recorded completion in the class logs counts
// learners, so "passed at least once" is the like-for-like figure to set beside it. One definition, used by
// the overview, the funder report and the statistics command; read from learner_tallies (each learner's
// attempts, passes and earliest attempt per group, kept by triggers), never from the attempts themselves.
import { sql } from "drizzle-orm";
import type { Db } from "../db/client";
import { learnerTallies } from "../db/schema";
import { scopeConditions, type SummaryScope } from "./summaries";

export interface LearnerOutcomes {
  learners: number;
  firstPassed: number;
  everPassed: number;
}

export function learnerOutcomes(db: Db, scope: SummaryScope): LearnerOutcomes {
  const row = db.get<{ learners: number; first_passed: number | null; ever_passed: number | null }>(sql`
    WITH ranked AS (
      SELECT ${learnerTallies.firstPassed} AS first_passed,
        row_number() OVER (PARTITION BY ${learnerTallies.learner} ORDER BY ${learnerTallies.firstStarted}, ${learnerTallies.firstId}) AS k,
        max(${learnerTallies.passed} > 0) OVER (PARTITION BY ${learnerTallies.learner}) AS ever_passed
      FROM ${learnerTallies} WHERE ${scopeConditions(learnerTallies, scope)}
    )
    SELECT count(*) AS learners, sum(first_passed) AS first_passed, sum(ever_passed) AS ever_passed FROM ranked WHERE k = 1`);
  return { learners: row.learners, firstPassed: row.first_passed ?? 0, everPassed: row.ever_passed ?? 0 };
}
