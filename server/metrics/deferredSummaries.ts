// Bulk imports add their attempts to the summaries set-wise instead of row by row. Inside the import's
// transaction a row in summary_deferral switches the per-row insert trigger off; the trigger that replaces it
// only notes each new attempt's id in summary_pending. Before the import commits, addPendingAttempts() adds the
// noted attempts — as they stand then — to every summary table with one grouped statement per table, and
// empties both tables. A rolled-back import leaves nothing behind, as its rows and notes roll back with it.
// Changes to attempts already summarised keep their per-row triggers (drizzle/0005_attempt_summary_triggers.sql,
// drizzle/0010_packed_instructor_values.sql).
import type Database from "better-sqlite3";
import { attemptErrorNames } from "../../shared/scoring/scoreAttempt";
import { summaryMetrics } from "../db/schema";
import { refreshInstructorValues } from "./instructorValues";

const TALLY_SUMS = [
  ["n", "count(*)"],
  ["passed", "sum(a.passed)"],
  ["judged_pp", "sum(a.instructor_result IS 'pass' AND a.passed = 1)"],
  ["judged_pf", "sum(a.instructor_result IS 'pass' AND a.passed = 0)"],
  ["judged_fp", "sum(a.instructor_result IS 'fail' AND a.passed = 1)"],
  ["judged_ff", "sum(a.instructor_result IS 'fail' AND a.passed = 0)"],
  ["with_errors", "sum(a.error_mask != 0)"],
  ["compressions", "sum(a.compressions)"],
  ...attemptErrorNames.map((name, bit) => [`err_${name}`, `sum((a.error_mask >> ${bit}) & 1)`]),
] as const;

// CROSS JOIN keeps the noted ids as the outer loop, each attempt found by its key: the planner, left to itself,
// may scan every stored attempt for each statement, which at a million attempts made a one-class import take
// seconds.
const PENDING = "summary_pending p CROSS JOIN attempts a ON a.id = p.id";
const addCounts = (columns: readonly string[]) => columns.map((c) => `${c} = ${c} + excluded.${c}`).join(", ");

function tallies(table: "attempt_tallies" | "network_tallies", keys: readonly string[], keyExpressions: readonly string[]): string {
  const sums = TALLY_SUMS.map(([column]) => column);
  return `INSERT INTO ${table} (${[...keys, ...sums].join(", ")})
    SELECT ${[...keyExpressions, ...TALLY_SUMS.map(([, expression]) => expression)].join(", ")}
    FROM ${PENDING} WHERE true GROUP BY ${keyExpressions.join(", ")}
    ON CONFLICT (${keys.join(", ")}) DO UPDATE SET ${addCounts(sums)}`;
}

function values(table: "network_values", keys: readonly string[], keyExpressions: readonly string[]): string[] {
  return summaryMetrics.map(
    (metric) => `INSERT INTO ${table} (metric, ${keys.join(", ")}, value, count)
      SELECT '${metric}', ${keyExpressions.join(", ")}, a.${metric}, count(*)
      FROM ${PENDING} WHERE true GROUP BY ${keyExpressions.join(", ")}, a.${metric}
      ON CONFLICT (metric, ${keys.join(", ")}, value) DO UPDATE SET count = count + excluded.count`,
  );
}

/** Each learner's pending attempts per group, with their earliest (by start time, then id), merged in. */
function learners(table: "learner_tallies" | "learner_quarters", keys: readonly string[], keyExpressions: readonly string[]): string {
  const earlier = "(excluded.first_started, excluded.first_id) < (first_started, first_id)";
  return `INSERT INTO ${table} (${keys.join(", ")}, attempts, passed, first_started, first_id, first_passed)
    SELECT ${keys.join(", ")}, count(*), sum(passed), first_started, first_id, first_passed
    FROM (
      SELECT ${keyExpressions.map((e, i) => `${e} AS ${keys[i]}`).join(", ")}, a.passed,
        first_value(a.started_at) OVER w AS first_started, first_value(a.id) OVER w AS first_id, first_value(a.passed) OVER w AS first_passed
      FROM ${PENDING}
      WINDOW w AS (PARTITION BY ${keyExpressions.join(", ")} ORDER BY a.started_at, a.id)
    ) WHERE true
    GROUP BY ${keys.join(", ")}
    ON CONFLICT (${keys.join(", ")}) DO UPDATE SET attempts = attempts + excluded.attempts, passed = passed + excluded.passed,
      first_passed = CASE WHEN ${earlier} THEN excluded.first_passed ELSE first_passed END,
      first_started = CASE WHEN ${earlier} THEN excluded.first_started ELSE first_started END,
      first_id = CASE WHEN ${earlier} THEN excluded.first_id ELSE first_id END`;
}

const GROUP = ["quarter", "profile", "feedback", "site_id", "instructor_id", "manikin_id"] as const;
const GROUP_EXPRESSIONS = ["a.quarter", "a.profile", "a.feedback", "a.site_id", "a.instructor_id", "coalesce(a.manikin_id, 0)"] as const;

const ADD_PENDING = [
  tallies("attempt_tallies", [...GROUP, "policy_version"], [...GROUP_EXPRESSIONS, "a.policy_version"]),
  tallies("network_tallies", ["quarter", "profile", "feedback", "policy_version"], ["a.quarter", "a.profile", "a.feedback", "a.policy_version"]),
  // the instructor-quarters of the new attempts are rebuilt from their attempts (refreshInstructorValues)
  `INSERT OR IGNORE INTO instructor_values_stale (quarter, instructor_id) SELECT DISTINCT a.quarter, a.instructor_id FROM ${PENDING}`,
  ...values("network_values", ["quarter", "profile", "feedback"], ["a.quarter", "a.profile", "a.feedback"]),
  learners(
    "learner_tallies",
    ["quarter", "learner", "profile", "feedback", "site_id", "instructor_id", "manikin_id"],
    ["a.quarter", "a.learner", "a.profile", "a.feedback", "a.site_id", "a.instructor_id", "coalesce(a.manikin_id, 0)"],
  ),
  // new learner-quarters and first passes fire learner_quarters' own triggers, which keep previous quarters
  learners("learner_quarters", ["quarter", "learner"], ["a.quarter", "a.learner"]),
  "DELETE FROM summary_pending",
  "DELETE FROM summary_deferral",
];

/** Switches the per-row summary triggers off for the rest of the caller's transaction. */
export function deferSummaries(sqlite: Database.Database): void {
  if (!sqlite.inTransaction) throw new Error("deferSummaries needs an open transaction");
  sqlite.prepare("INSERT OR IGNORE INTO summary_deferral (id) VALUES (1)").run();
}

/** Adds the attempts noted since deferSummaries() to every summary and switches the per-row triggers back on. */
export function addPendingAttempts(sqlite: Database.Database): void {
  const nothingNoted = sqlite.prepare("SELECT NOT EXISTS (SELECT 1 FROM summary_pending)").pluck().get() === 1;
  if (nothingNoted) sqlite.prepare("DELETE FROM summary_deferral").run();
  else for (const statement of ADD_PENDING) sqlite.prepare(statement).run();
  // the new attempts' instructor-quarters, and those whose attempts the import changed in place
  refreshInstructorValues(sqlite);
}
