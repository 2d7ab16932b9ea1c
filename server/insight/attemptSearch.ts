// The search over attempts that the list and its CSV share: the condition for every filter and one order per
// sortable column, taken from a fixed table (never from the request's text), always ending with the attempt id
// so that rows with equal values keep one order and pages neither overlap nor skip a row.
import { and, asc, desc, eq, sql, type SQL, type SQLWrapper } from "drizzle-orm";
import type { AttemptExportQuery, AttemptSortKey, SortDirection } from "../../shared/filters";
import type { AttemptError } from "../../shared/scoring/scoreAttempt";
import { attempts, compressionStreams, instructors, manikins, sites } from "../db/schema";
import type { ResolvedFilters } from "./filters";
import { attemptConditions, hasError } from "./sql";

export interface AttemptSearch {
  error: AttemptError | null;
  classId: string | null;
  stream: "yes" | "no" | null;
  learner: string | null;
  learnerMatch: "exact" | "prefix";
  sort: AttemptSortKey;
  dir: SortDirection;
  /** Row scope: only this instructor's attempts (an instructor's own), or every instructor's when null. */
  onlyInstructorId: number | null;
}

/** Newest first unless the request names another order; a named column without a direction sorts ascending. */
export function attemptSearchOf(query: AttemptExportQuery, onlyInstructorId: number | null): AttemptSearch {
  return {
    error: query.error ?? null,
    classId: query.class ?? null,
    stream: query.stream ?? null,
    learner: query.learner ?? null,
    learnerMatch: query.learnerMatch,
    sort: query.sort ?? "startedAt",
    dir: query.dir ?? (query.sort ? "asc" : "desc"),
    onlyInstructorId,
  };
}

/** Part of cache keys: everything that changes which rows come back or their order. */
export function attemptSearchKey(search: AttemptSearch): string {
  return JSON.stringify(search);
}

export const hasStreamSql = sql<number>`EXISTS (SELECT 1 FROM ${compressionStreams} WHERE ${compressionStreams.attemptId} = ${attempts.id})`;

/** The attempt's first error in the order of attemptErrorNames (the lowest bit of its mask); 0 when none. */
const firstErrorBit = sql<number>`(${attempts.errorMask} & -${attempts.errorMask})`;

/** What each sortable column sorts by; `nullable` values sort after every value in both directions. */
const sortValues: Record<AttemptSortKey, { value: SQLWrapper; nullable?: boolean }> = {
  startedAt: { value: attempts.startedAt },
  id: { value: attempts.id },
  learner: { value: attempts.learner },
  class: { value: attempts.classId },
  site: { value: sites.code, nullable: true },
  instructor: { value: instructors.code, nullable: true },
  manikin: { value: manikins.assetId, nullable: true },
  profile: { value: attempts.profile },
  feedback: { value: attempts.feedback },
  passed: { value: attempts.passed },
  instructorResult: { value: attempts.instructorResult, nullable: true },
  score: { value: attempts.score },
  errors: { value: firstErrorBit },
  stream: { value: hasStreamSql },
  depth: { value: attempts.depthMm },
  depthOk: { value: attempts.depthOkPct },
  rate: { value: attempts.rateCpm },
  rateOk: { value: attempts.rateOkPct },
  recoilOk: { value: attempts.recoilOkPct },
  handsOn: { value: attempts.handsOnPct },
  longestPause: { value: attempts.longestPauseS },
};

/** The ORDER BY terms; the query must join sites, instructors and manikins for those columns. */
export function attemptOrder(search: Pick<AttemptSearch, "sort" | "dir">): SQL[] {
  const { value, nullable } = sortValues[search.sort];
  const direction = search.dir === "asc" ? asc(value) : desc(value);
  return [...(nullable ? [sql`${value} IS NULL`] : []), direction, asc(attempts.id)];
}

/** Conditions on attempts (no join needed) for the network filters and the search's own. */
export function attemptSearchConditions(filters: ResolvedFilters, search: AttemptSearch): SQL {
  const parts: SQL[] = [attemptConditions(filters)];
  if (search.error) parts.push(hasError(search.error));
  if (search.classId) parts.push(eq(attempts.classId, search.classId));
  if (search.stream) parts.push(search.stream === "yes" ? sql`${hasStreamSql}` : sql`NOT ${hasStreamSql}`);
  if (search.learner) {
    // the term is ASCII (its schema allows nothing else), and SQLite's lower() folds ASCII letters
    parts.push(
      search.learnerMatch === "prefix"
        ? sql`lower(substr(${attempts.learner}, 1, ${search.learner.length})) = lower(${search.learner})`
        : sql`lower(${attempts.learner}) = lower(${search.learner})`,
    );
  }
  if (search.onlyInstructorId !== null) parts.push(eq(attempts.instructorId, search.onlyInstructorId));
  return and(...parts)!;
}
