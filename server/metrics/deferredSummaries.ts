// Bulk imports add their attempts to the summaries set-wise instead of row by row. Inside the import's
// transaction a row in summary_deferral switches the per-row insert trigger off; the trigger that replaces it
// only notes each new attempt's id in summary_pending. Before the import commits, addPendingAttempts() adds the
// noted attempts — as they stand then — to every summary table with one grouped statement per table, and
// empties both tables. A rolled-back import leaves nothing behind, as its rows and notes roll back with it.
// An import that staged its new attempts (imports/rowStore.ts) writes them without notes and adds them from
// the staging table itself (addAttemptsFrom), saving a million-row import the notes and a join per statement.
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
/**
 * The page cache while the summaries take in new attempts (and staged attempts are written): SQLite sizes each
 * sort's memory by the cache, the grouped statements sort every new attempt, and memory SQLite once held stays
 * with the process. With the import's 64 MiB cache there a million-row import peaked at 280–340 MB; with this
 * at about 215 MB, some 2 s slower.
 */
const SUMMARY_CACHE_KIB = 16 * 1024;

/** Runs `work` with the summaries' page cache, then restores the caller's. */
function withSummaryCache(sqlite: Database.Database, work: () => void) {
  const cacheSize = sqlite.pragma("cache_size", { simple: true }) as number;
  sqlite.pragma(`cache_size = ${-SUMMARY_CACHE_KIB}`);
  try {
    work();
  } finally {
    sqlite.pragma(`cache_size = ${cacheSize}`);
  }
}

function runAll(sqlite: Database.Database, statements: readonly string[]) {
  for (const statement of statements) sqlite.prepare(statement).run();
}

/** summary_deferral's rows: deferred with each new attempt noted, or deferred with the writer adding its rows. */
const NOTE_EACH = 1;
const WRITER_ADDS = 2;
const addCounts = (columns: readonly string[]) => columns.map((c) => `${c} = ${c} + excluded.${c}`).join(", ");

function tallies(from: string, table: "attempt_tallies" | "network_tallies", keys: readonly string[], keyExpressions: readonly string[]): string {
  const sums = TALLY_SUMS.map(([column]) => column);
  return `INSERT INTO ${table} (${[...keys, ...sums].join(", ")})
    SELECT ${[...keyExpressions, ...TALLY_SUMS.map(([, expression]) => expression)].join(", ")}
    FROM ${from} WHERE true GROUP BY ${keyExpressions.join(", ")}
    ON CONFLICT (${keys.join(", ")}) DO UPDATE SET ${addCounts(sums)}`;
}

function values(from: string, table: "network_values", keys: readonly string[], keyExpressions: readonly string[]): string[] {
  return summaryMetrics.map(
    (metric) => `INSERT INTO ${table} (metric, ${keys.join(", ")}, value, count)
      SELECT '${metric}', ${keyExpressions.join(", ")}, a.${metric}, count(*)
      FROM ${from} WHERE true GROUP BY ${keyExpressions.join(", ")}, a.${metric}
      ON CONFLICT (metric, ${keys.join(", ")}, value) DO UPDATE SET count = count + excluded.count`,
  );
}

/** Each learner's pending attempts per group, with their earliest (by start time, then id), merged in. */
function learners(from: string, table: "learner_tallies" | "learner_quarters", keys: readonly string[], keyExpressions: readonly string[]): string {
  const earlier = "(excluded.first_started, excluded.first_id) < (first_started, first_id)";
  return `INSERT INTO ${table} (${keys.join(", ")}, attempts, passed, first_started, first_id, first_passed)
    SELECT ${keys.join(", ")}, count(*), sum(passed), first_started, first_id, first_passed
    FROM (
      SELECT ${keyExpressions.map((e, i) => `${e} AS ${keys[i]}`).join(", ")}, a.passed,
        first_value(a.started_at) OVER w AS first_started, first_value(a.id) OVER w AS first_id, first_value(a.passed) OVER w AS first_passed
      FROM ${from}
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

/** One grouped statement per summary table, adding the new attempts read from `from` (aliased a). */
function additions(from: string): string[] {
  return [
    tallies(from, "attempt_tallies", [...GROUP, "policy_version"], [...GROUP_EXPRESSIONS, "a.policy_version"]),
    tallies(from, "network_tallies", ["quarter", "profile", "feedback", "policy_version"], ["a.quarter", "a.profile", "a.feedback", "a.policy_version"]),
    // the instructor-quarters of the new attempts are rebuilt from their attempts (refreshInstructorValues)
    `INSERT OR IGNORE INTO instructor_values_stale (quarter, instructor_id) SELECT DISTINCT a.quarter, a.instructor_id FROM ${from}`,
    ...values(from, "network_values", ["quarter", "profile", "feedback"], ["a.quarter", "a.profile", "a.feedback"]),
    learners(
      from,
      "learner_tallies",
      ["quarter", "learner", "profile", "feedback", "site_id", "instructor_id", "manikin_id"],
      ["a.quarter", "a.learner", "a.profile", "a.feedback", "a.site_id", "a.instructor_id", "coalesce(a.manikin_id, 0)"],
    ),
    // new learner-quarters and first passes fire learner_quarters' own triggers, which keep previous quarters
    learners(from, "learner_quarters", ["quarter", "learner"], ["a.quarter", "a.learner"]),
  ];
}

const ADD_PENDING = [...additions(PENDING), "DELETE FROM summary_pending", "DELETE FROM summary_deferral"];

/** Switches the per-row summary triggers off for the rest of the caller's transaction. */
export function deferSummaries(sqlite: Database.Database): void {
  if (!sqlite.inTransaction) throw new Error("deferSummaries needs an open transaction");
  sqlite.prepare("INSERT OR IGNORE INTO summary_deferral (id) VALUES (?)").run(NOTE_EACH);
}

/**
 * Inserts new attempts with `insert` — without notes — and adds them to the summaries from `table`, which
 * holds exactly those attempts with the attempts' columns (a bulk import's staged rows). Within deferSummaries();
 * the instructor-quarters are rebuilt by addPendingAttempts() before the commit, as for noted attempts.
 */
export function addAttemptsFrom(sqlite: Database.Database, table: string, insert: () => void): void {
  if (!sqlite.inTransaction) throw new Error("addAttemptsFrom needs an open transaction");
  const setDeferral = (from: number, to: number) => {
    sqlite.prepare("INSERT OR IGNORE INTO summary_deferral (id) VALUES (?)").run(to);
    sqlite.prepare("DELETE FROM summary_deferral WHERE id = ?").run(from);
  };
  setDeferral(NOTE_EACH, WRITER_ADDS);
  withSummaryCache(sqlite, () => {
    insert();
    runAll(sqlite, additions(`${table} a`));
  });
  setDeferral(WRITER_ADDS, NOTE_EACH);
}

/** Adds the attempts noted since deferSummaries() to every summary and switches the per-row triggers back on. */
export function addPendingAttempts(sqlite: Database.Database): void {
  withSummaryCache(sqlite, () => {
    const nothingNoted = sqlite.prepare("SELECT NOT EXISTS (SELECT 1 FROM summary_pending)").pluck().get() === 1;
    if (nothingNoted) sqlite.prepare("DELETE FROM summary_deferral").run();
    else runAll(sqlite, ADD_PENDING);
    // the new attempts' instructor-quarters, and those whose attempts the import changed in place
    refreshInstructorValues(sqlite);
  });
}
