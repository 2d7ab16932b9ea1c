// Outcomes per learner rather than per attempt, from the pseudonymous learner codes: how many learners were
// measured, how many passed on their first attempt (their earliest attempt among the chosen ones, by start
// time, ties by attempt id) and how many passed at least once. Recorded completion in the class logs counts
// learners, so "passed at least once" is the like-for-like figure to set beside it. One definition, used by
// the overview and the statistics command.
import { sql, type SQL } from "drizzle-orm";
import type { Db } from "../db/client";
import { attempts } from "../db/schema";

export interface LearnerOutcomes {
  learners: number;
  firstPassed: number;
  everPassed: number;
}

export function learnerOutcomes(db: Db, where: SQL | undefined): LearnerOutcomes {
  const row = db.get<{ learners: number; first_passed: number | null; ever_passed: number | null }>(sql`
    WITH ranked AS (
      SELECT ${attempts.learner} AS learner, ${attempts.passed} AS passed,
        row_number() OVER (PARTITION BY ${attempts.learner} ORDER BY ${attempts.startedAt}, ${attempts.id}) AS k
      FROM ${attempts} ${where ? sql`WHERE ${where}` : sql``}
    ), per_learner AS (
      SELECT learner, max(CASE WHEN k = 1 THEN passed END) AS first_passed, max(passed) AS ever_passed FROM ranked GROUP BY learner
    )
    SELECT count(*) AS learners, sum(first_passed) AS first_passed, sum(ever_passed) AS ever_passed FROM per_learner`);
  return { learners: row.learners, firstPassed: row.first_passed ?? 0, everPassed: row.ever_passed ?? 0 };
}
