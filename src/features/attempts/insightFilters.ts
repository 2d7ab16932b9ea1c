// The network filters of the drill-down pages (error trends, attempts, equipment): their choices come from
// GET /api/insight/options, their values live in the URL, and they turn into the API's query string.
import { useQuery } from "@tanstack/react-query";
import { feedbackFilter, filterParamName, type FilterDefinition, type FilterValues } from "../../components/FilterBar";
import type { OptionsAnswer } from "../../../shared/schemas/insight";
import { insightQueries } from "../insight/queries";
import { patientTypeNames } from "../../../shared/vocabulary";

/** The filter choices, from the one options query every page shares. */
export function useInsightOptions() {
  return useQuery(insightQueries.options());
}

/** Period choices besides single quarters. */
export const LAST_FOUR = "last-4";
export const ALL_QUARTERS = "all";

export type InsightFilterKey = "quarter" | "site" | "patientType" | "feedback" | "instructor" | "manikin";

/** The filter bar's definitions for the keys a page uses; quarters newest first, the latest chosen by default. */
export function insightFilters(options: OptionsAnswer, keys: readonly InsightFilterKey[]): FilterDefinition[] {
  const all: Record<InsightFilterKey, FilterDefinition> = {
    quarter: {
      key: "quarter",
      label: "Period",
      allLabel: null,
      options: [
        ...options.quarters.map((q) => ({ value: q, label: q.replace("-", " ") })),
        ...(options.quarters.length > 1 ? [{ value: LAST_FOUR, label: "Last 4 quarters" }] : []),
        ...(options.quarters.length > 4 ? [{ value: ALL_QUARTERS, label: `All quarters (${options.quarters.length})` }] : []),
      ],
    },
    site: { key: "site", options: options.sites.map((s) => ({ value: s.code, label: `${s.code} · ${s.name}` })) },
    patientType: { key: "patientType", options: options.patientTypes.map((p) => ({ value: p, label: patientTypeNames[p] })) },
    feedback: feedbackFilter,
    instructor: { key: "instructor", options: options.instructors.map((i) => ({ value: i.code, label: `${i.code} · ${i.name}` })) },
    manikin: { key: "manikin", options: options.manikins.map((m) => ({ value: m.assetId, label: m.assetId })) },
  };
  return keys.filter((key) => key !== "instructor" || options.instructors.length > 0).filter((key) => key !== "manikin" || options.manikins.length > 0).map((key) => all[key]);
}

/** The API's query fields for the filter values (the period becomes quarter or from/to). */
export function apiFilterQuery(values: FilterValues, quarters: readonly string[]): Record<string, string | undefined> {
  const query: Record<string, string | undefined> = {};
  const period = values.quarter;
  if (period === LAST_FOUR && quarters.length > 0) {
    query.from = quarters[Math.min(3, quarters.length - 1)];
    query.to = quarters[0];
  } else if (period === ALL_QUARTERS && quarters.length > 0) {
    query.from = quarters[quarters.length - 1];
    query.to = quarters[0];
  } else if (period) {
    query.quarter = period;
  }
  query.site = values.site ?? undefined;
  query.profile = values.patientType ?? undefined;
  query.feedback = values.feedback ?? undefined;
  query.instructor = values.instructor ?? undefined;
  query.manikin = values.manikin ?? undefined;
  return query;
}

/** URL search params (as the filter bar writes them) for a link to another drill-down page. */
export function linkParams(values: FilterValues, extra: Record<string, string | null | undefined> = {}): string {
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(values)) if (value) params.set(filterParamName(key), value);
  for (const [key, value] of Object.entries(extra)) {
    if (value) params.set(filterParamName(key), value);
    else params.delete(filterParamName(key));
  }
  return params.toString();
}

/** Words for the period chosen, e.g. "2026 Q4" or "the last 4 quarters". */
export function periodWords(period: { from: string; to: string }): string {
  const q = (text: string) => text.replace("-", " ");
  return period.from === period.to ? q(period.from) : `${q(period.from)} to ${q(period.to)}`;
}
