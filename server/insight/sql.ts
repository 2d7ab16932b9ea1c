// The filters of a request as conditions: on attempts (for lists of attempts, classes and learners) and as the
// scope of the attempt summaries (for every figure). Values are always bound parameters; only constants are inlined.
import { and, between, eq, sql, type SQL } from "drizzle-orm";
import { attemptErrorNames, type AttemptError } from "../../shared/scoring/scoreAttempt";
import type { SummaryScope } from "../metrics/summaries";
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

/** The filters (over `range`, the filters' own period unless given) as the scope of the attempt summaries. */
export function scopeOf(filters: ResolvedFilters, range: QuarterRange = filters.period): SummaryScope {
  return {
    from: range.from,
    to: range.to,
    siteId: filters.siteId,
    profile: filters.profile,
    feedback: filters.feedback,
    instructorId: filters.instructorId,
    manikinId: filters.manikinId,
  };
}
