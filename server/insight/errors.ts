// Drill-down on errors: the Pareto for the filters and, for one chosen error, its quarterly trend and where
// it happens (patient type, feedback mode, site, instructor, manikin).
import { sql, type SQL } from "drizzle-orm";
import type { SQLiteColumn } from "drizzle-orm/sqlite-core";
import type { ErrorsAnswer } from "../../shared/schemas/insight";
import { type AttemptError } from "../../shared/scoring/scoreAttempt";
import type { Db } from "../db/client";
import { attempts, instructors, manikins, sites } from "../db/schema";
import type { ResolvedFilters } from "./filters";
import { errorPareto } from "./pareto";
import { trendQuarters } from "../../shared/period";
import { rateOf } from "./rates";
import { attemptConditions, errorCountColumns, errorCountsOf, hasError } from "./sql";
import { errorLabels } from "../../shared/vocabulary";

type Breakdown = NonNullable<ErrorsAnswer["selected"]>["byProfile"];

function breakdown(db: Db, column: SQLiteColumn, where: SQL, error: AttemptError, nameOf: (key: string | number | null) => string): Breakdown {
  return db
    .select({ key: column, attempts: sql<number>`count(*)`, count: sql<number>`sum(${hasError(error)})` })
    .from(attempts)
    .where(where)
    .groupBy(column)
    .all()
    .map((row) => ({
      key: nameOf(row.key as string | number | null),
      id: typeof row.key === "number" ? row.key : null,
      count: row.count,
      attempts: row.attempts,
      share: row.count / row.attempts,
    }))
    .sort((a, b) => b.count - a.count || b.share - a.share || (a.key < b.key ? -1 : 1));
}

function codes(db: Db, table: typeof sites | typeof instructors): Map<number, string> {
  return new Map(db.select({ id: table.id, code: table.code }).from(table).all().map((row) => [row.id, row.code]));
}

export function errorAnalysis(db: Db, filters: ResolvedFilters, error: AttemptError | undefined): ErrorsAnswer {
  const where = attemptConditions(filters);
  const totals = db
    .select({ n: sql<number>`count(*)`, ...errorCountColumns() })
    .from(attempts)
    .where(where)
    .get()!;
  const answer: ErrorsAnswer = { period: filters.period, pareto: errorPareto(errorCountsOf(totals), totals.n, false), selected: null };
  if (!error) return answer;

  const trend = trendQuarters(filters.period);
  const byQuarter = new Map(
    db
      .select({ quarter: attempts.quarter, n: sql<number>`count(*)`, count: sql<number>`sum(${hasError(error)})` })
      .from(attempts)
      .where(attemptConditions(filters, trend))
      .groupBy(attempts.quarter)
      .all()
      .map((row) => [row.quarter, row]),
  );
  const siteCodes = codes(db, sites);
  const instructorCodes = codes(db, instructors);
  const assetIds = new Map(db.select({ id: manikins.id, assetId: manikins.assetId }).from(manikins).all().map((row) => [row.id, row.assetId]));
  const named = (names: Map<number, string>) => (key: string | number | null) => (key === null ? "(none)" : (names.get(key as number) ?? `#${key}`));

  answer.selected = {
    error,
    label: errorLabels[error],
    trend: trend.quarters.map((quarter) => {
      const row = byQuarter.get(quarter) ?? { n: 0, count: 0 };
      const rate = rateOf(row.count, row.n);
      return { quarter, count: row.count, attempts: row.n, share: rate.rate, low: rate.low, high: rate.high };
    }),
    byProfile: breakdown(db, attempts.profile, where, error, String),
    byFeedback: breakdown(db, attempts.feedback, where, error, String),
    bySite: breakdown(db, attempts.siteId, where, error, named(siteCodes)),
    byInstructor: breakdown(db, attempts.instructorId, where, error, named(instructorCodes)),
    byManikin: breakdown(db, attempts.manikinId, where, error, named(assetIds)),
  };
  return answer;
}

