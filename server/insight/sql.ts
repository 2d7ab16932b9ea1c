// SQL pieces every insight query shares: the filter conditions, error counts from the error bitmask and
// group medians with window functions. Values are always bound parameters; only constants are inlined.
import { and, asc, between, eq, sql, type SQL, type SQLWrapper } from "drizzle-orm";
import { attemptErrorNames, type AttemptError } from "../../shared/scoring/scoreAttempt";
import type { Db } from "../db/client";
import { attempts, classes } from "../db/schema";
import type { ResolvedFilters } from "./filters";

export interface QuarterRange {
  from: string;
  to: string;
}

/** Conditions on attempts for the filters, over `range` (the filters' own period unless given). */
export function attemptConditions(filters: ResolvedFilters, range: QuarterRange = filters.period): SQL {
  const parts: SQL[] = [between(attempts.quarter, range.from, range.to)];
  if (filters.siteId !== null) parts.push(eq(attempts.siteId, filters.siteId));
  if (filters.profile !== null) parts.push(eq(attempts.profile, filters.profile));
  if (filters.feedback !== null) parts.push(eq(attempts.feedback, filters.feedback));
  if (filters.instructorId !== null) parts.push(eq(attempts.instructorId, filters.instructorId));
  if (filters.manikinId !== null) parts.push(eq(attempts.manikinId, filters.manikinId));
  return and(...parts)!;
}

/**
 * Conditions on class logs for the filters. Patient type, feedback mode and manikin belong to attempts, so
 * when one of them is set a class counts only if it has a matching attempt.
 */
export function classConditions(filters: ResolvedFilters, range: QuarterRange = filters.period): SQL {
  const parts: SQL[] = [between(classes.quarter, range.from, range.to)];
  if (filters.siteId !== null) parts.push(eq(classes.siteId, filters.siteId));
  if (filters.instructorId !== null) parts.push(eq(classes.instructorId, filters.instructorId));
  if (filters.profile !== null || filters.feedback !== null || filters.manikinId !== null) {
    parts.push(sql`${classes.id} IN (SELECT ${attempts.classId} FROM ${attempts} WHERE ${attemptConditions(filters, range)})`);
  }
  return and(...parts)!;
}

/** `(error_mask & bit) != 0` for one error. */
export function hasError(error: AttemptError): SQL {
  return sql`(${attempts.errorMask} & ${sql.raw(String(1 << attemptErrorNames.indexOf(error)))}) != 0`;
}

/** One `sum(has error)` column per error, named after the error. */
export function errorCountColumns(): Record<AttemptError, SQL<number>> {
  return Object.fromEntries(attemptErrorNames.map((name) => [name, sql<number>`coalesce(sum(${hasError(name)}), 0)`])) as Record<
    AttemptError,
    SQL<number>
  >;
}

export function errorCountsOf(row: Record<AttemptError, number>): Record<AttemptError, number> {
  return Object.fromEntries(attemptErrorNames.map((name) => [name, Number(row[name] ?? 0)])) as Record<AttemptError, number>;
}

/**
 * The values of one column over the matching rows, sorted. Only that column leaves SQLite (a plain list of
 * numbers, the cheapest thing better-sqlite3 can hand over), and a Float64Array sorts it natively.
 */
export function sortedValues(db: Db, value: SQLWrapper, where: SQL): Float64Array {
  const query = db.select({ v: sql<number>`${value}` }).from(attempts).where(where).toSQL();
  return Float64Array.from(db.$client.prepare(query.sql).pluck(true).all(...query.params) as number[]).sort();
}

/** Written as shared/stats interpolates (lower + ½ · (upper − lower)), so both give the same last bit. */
function midpoint(lower: number, upper: number): number {
  return lower + 0.5 * (upper - lower);
}

/** Type-7 median of sorted values (Hyndman & Fan 1996; the definition of shared/stats `median`); null when empty. */
export function medianOfSorted(sorted: Float64Array): number | null {
  const n = sorted.length;
  if (n === 0) return null;
  return midpoint(sorted[Math.floor((n - 1) / 2)], sorted[Math.ceil((n - 1) / 2)]);
}

/** Sorted values of two sorted lists together. */
export function sortedUnion(a: Float64Array, b: Float64Array): Float64Array {
  const all = new Float64Array(a.length + b.length);
  all.set(a);
  all.set(b, a.length);
  return all.sort();
}

export function medianOf(db: Db, value: SQLWrapper, where: SQL): number | null {
  return medianOfSorted(sortedValues(db, value, where));
}

export interface GroupSummary {
  n: number;
  passed: number;
  median: number;
}

/**
 * Attempts, passes and the median of `value` for each of many groups (instructors, quarters), type 7 as
 * above. SQLite numbers each group's rows in value order and hands back only the one or two middle rows of
 * each group, with the group's count and passes from the same window: one sort for all three figures.
 */
export function groupSummaries<K extends string | number>(db: Db, value: SQLWrapper, group: SQLWrapper, where: SQL): Map<K, GroupSummary> {
  const rows = db.all<{ k: K; v: number; n: number; passed: number }>(
    sql`SELECT k, v, n, passed FROM (
          SELECT ${group} AS k, ${value} AS v,
                 row_number() OVER w - 1 AS i,
                 count(*) OVER w AS n,
                 sum(${attempts.passed}) OVER w AS passed
          FROM ${attempts} WHERE ${where}
          WINDOW w AS (PARTITION BY ${group} ORDER BY ${value} ROWS BETWEEN UNBOUNDED PRECEDING AND UNBOUNDED FOLLOWING)
        ) WHERE i = (n - 1) / 2 OR i = n / 2`,
  );
  const middles = new Map<K, { n: number; passed: number; lower: number; upper: number }>();
  for (const { k, v, n, passed } of rows) {
    const entry = middles.get(k);
    middles.set(k, entry ? { ...entry, lower: Math.min(entry.lower, v), upper: Math.max(entry.upper, v) } : { n, passed, lower: v, upper: v });
  }
  return new Map([...middles].map(([k, { n, passed, lower, upper }]) => [k, { n, passed, median: midpoint(lower, upper) }]));
}

/**
 * Attempts, passes and median score of every instructor, type 7 as above, without sorting anything: the
 * counts come from one pass over the instructor/score index, then each instructor's one or two middle scores
 * are read by walking that index in score order to the middle (LIMIT/OFFSET), so only those scores leave SQLite.
 */
export function scoreSummariesByInstructor(db: Db, where: SQL): Map<number, GroupSummary> {
  const counts = db
    .select({ instructorId: attempts.instructorId, n: sql<number>`count(*)`, passed: sql<number>`sum(${attempts.passed})` })
    .from(attempts)
    .where(where)
    .groupBy(attempts.instructorId)
    .all();
  const middle = db
    .select({ v: attempts.score })
    .from(attempts)
    .where(and(eq(attempts.instructorId, sql.placeholder("instructorId")), where))
    .orderBy(asc(attempts.score))
    .limit(sql.placeholder("limit"))
    .offset(sql.placeholder("offset"))
    .prepare();
  return new Map(
    counts.map(({ instructorId, n, passed }) => {
      const lower = Math.floor((n - 1) / 2);
      const values = middle.all({ instructorId, limit: Math.ceil((n - 1) / 2) - lower + 1, offset: lower }).map((row) => row.v);
      return [instructorId, { n, passed, median: midpoint(values[0], values[values.length - 1]) }];
    }),
  );
}
