// SQL pieces every insight query shares: the filter conditions, error counts from the error bitmask and
// group medians with window functions. Values are always bound parameters; only constants are inlined.
import { and, between, eq, sql, type SQL, type SQLWrapper } from "drizzle-orm";
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
 * Median of `value` per group (type 7: the mean of the two middle values for an even count), computed in
 * SQLite: number each group's rows in value order and keep only the one or two middle rows. Only those
 * rows reach JavaScript. `group` null gives the single median of all matching rows under the key 0.
 */
export function mediansBy<K extends string | number>(
  db: Db,
  value: SQLWrapper,
  group: SQLWrapper | null,
  where: SQL,
): Map<K, number> {
  const key = group ?? sql`0`;
  const rows = db.all<{ k: K; v: number }>(
    sql`SELECT k, v FROM (
          SELECT ${key} AS k, ${value} AS v,
                 row_number() OVER (PARTITION BY ${key} ORDER BY ${value}) - 1 AS i,
                 count(*) OVER (PARTITION BY ${key}) AS n
          FROM ${attempts} WHERE ${where}
        ) WHERE i = (n - 1) / 2 OR i = n / 2`,
  );
  const sums = new Map<K, { total: number; count: number }>();
  for (const { k, v } of rows) {
    const entry = sums.get(k) ?? { total: 0, count: 0 };
    entry.total += v;
    entry.count += 1;
    sums.set(k, entry);
  }
  return new Map([...sums].map(([k, { total, count }]) => [k, total / count]));
}

export function medianOf(db: Db, value: SQLWrapper, where: SQL): number | null {
  return mediansBy<number>(db, value, null, where).get(0) ?? null;
}
