// Drill-down on CPR technique errors (too shallow, too fast…): the Pareto for the filters and, for one chosen
// error, its quarterly trend and where it happens (patient type, feedback mode, site, instructor, manikin).
import type { TechniqueErrorsAnswer } from "../../shared/schemas/insight";
import { type AttemptError } from "../../shared/scoring/scoreAttempt";
import type { Db } from "../db/client";
import { instructors, manikins, sites } from "../db/schema";
import { talliesBy, totalTally, type Dimension, type SummaryScope } from "../metrics/summaries";
import type { ResolvedFilters } from "./filters";
import { techniqueErrorPareto } from "./pareto";
import { trendQuarters } from "../../shared/period";
import { rateOf } from "./rates";
import { scopeOf } from "./sql";
import { errorLabels } from "../../shared/vocabulary";

type Breakdown = NonNullable<TechniqueErrorsAnswer["selected"]>["byProfile"];

/** Attempts with `error` among the attempts of each value of `dimension`, most frequent first. */
function breakdown(db: Db, scope: SummaryScope, dimension: Dimension, error: AttemptError, nameOf: (key: string | number | null) => string): Breakdown {
  return [...talliesBy<string | number>(db, scope, dimension)]
    .map(([stored, tally]) => {
      // a manikin key of 0 stands for attempts that name no manikin
      const key = dimension === "manikinId" && stored === 0 ? null : stored;
      return {
        key: nameOf(key),
        id: typeof key === "number" ? key : null,
        count: tally.errors[error],
        attempts: tally.n,
        share: tally.errors[error] / tally.n,
      };
    })
    .sort((a, b) => b.count - a.count || b.share - a.share || (a.key < b.key ? -1 : 1));
}

function codes(db: Db, table: typeof sites | typeof instructors): Map<number, string> {
  return new Map(
    db
      .select({ id: table.id, code: table.code })
      .from(table)
      .all()
      .map((row) => [row.id, row.code]),
  );
}

export function techniqueErrorAnalysis(db: Db, filters: ResolvedFilters, error: AttemptError | undefined): TechniqueErrorsAnswer {
  const scope = scopeOf(filters);
  const totals = totalTally(db, scope);
  const answer: TechniqueErrorsAnswer = { period: filters.period, pareto: techniqueErrorPareto(totals.errors, totals.n, false), selected: null };
  if (!error) return answer;

  const trend = trendQuarters(filters.period);
  const byQuarter = talliesBy<string>(db, scopeOf(filters, trend), "quarter");
  const siteCodes = codes(db, sites);
  const instructorCodes = codes(db, instructors);
  const assetIds = new Map(
    db
      .select({ id: manikins.id, assetId: manikins.assetId })
      .from(manikins)
      .all()
      .map((row) => [row.id, row.assetId]),
  );
  const named = (names: Map<number, string>) => (key: string | number | null) => (key === null ? "(none)" : (names.get(key as number) ?? `#${key}`));

  answer.selected = {
    error,
    label: errorLabels[error],
    trend: trend.quarters.map((quarter) => {
      const tally = byQuarter.get(quarter);
      const count = tally?.errors[error] ?? 0;
      const rate = rateOf(count, tally?.n ?? 0);
      return { quarter, count, attempts: tally?.n ?? 0, share: rate.rate, low: rate.low, high: rate.high };
    }),
    byProfile: breakdown(db, scope, "profile", error, String),
    byFeedback: breakdown(db, scope, "feedback", error, String),
    bySite: breakdown(db, scope, "siteId", error, named(siteCodes)),
    byInstructor: breakdown(db, scope, "instructorId", error, named(instructorCodes)),
    byManikin: breakdown(db, scope, "manikinId", error, named(assetIds)),
  };
  return answer;
}
