// What the insight pages ask for, from their filters and their address: one definition for the page and for
// the route's loader, which starts the same requests at navigation (./prefetch.ts), so both build the same key.
import type { AdjustMode } from "../../../shared/filters";
import { filteredPagePrefetch } from "./prefetch";
import { insightQueries, type ApiFilters } from "./queries";
import type { FilterChoices, OptionalFilter } from "./useInsightFilters";

/** The comparison asked for in the URL (?adjust=none); case mix when absent or unknown. */
export function adjustModeFrom(value: string | null): AdjustMode {
  return value === "none" ? "none" : "case-mix";
}

export const overviewFilters: readonly OptionalFilter[] = ["site", "patientType", "feedback"];

/** The overview with the p-chart's limits (?limits=laney) and split (?split=YYYY-MM-DD) the address asks for. */
export function overviewQuery(filters: ApiFilters, search: URLSearchParams) {
  const limits = search.get("limits") === "laney" ? "laney" : undefined;
  const split = search.get("split") ?? "";
  return insightQueries.overview({ ...filters, limits, split: /^\d{4}-\d{2}-\d{2}$/.test(split) ? split : undefined });
}

export const standingFilters: readonly OptionalFilter[] = ["patientType", "feedback"];
/** An instructor may compare over the last four or all quarters too: a quarter's attempts are few. */
export const standingChoices: FilterChoices = { ranges: true };

export function standingQuery(filters: ApiFilters, search: URLSearchParams) {
  return insightQueries.standing({ ...filters, adjust: adjustModeFrom(search.get("adjust")) });
}

export const instructorsFilters: readonly OptionalFilter[] = ["site", "patientType", "feedback"];

export function instructorsQuery(filters: ApiFilters, search: URLSearchParams) {
  return insightQueries.instructors({ ...filters, adjust: adjustModeFrom(search.get("adjust")) });
}

export const instructorFilters: readonly OptionalFilter[] = ["patientType", "feedback"];

export const prefetchOverview = filteredPagePrefetch(overviewFilters, {}, (filters, { search }) => overviewQuery(filters, search));
export const prefetchStanding = filteredPagePrefetch(standingFilters, standingChoices, (filters, { search }) => standingQuery(filters, search));
export const prefetchInstructors = filteredPagePrefetch(instructorsFilters, {}, (filters, { search }) => instructorsQuery(filters, search));
export const prefetchInstructor = filteredPagePrefetch(instructorFilters, {}, (filters, { params }) => insightQueries.instructor(params.id ?? "", filters));
