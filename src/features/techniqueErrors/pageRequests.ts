// What the technique-errors page asks for, from its filters and its address: one definition for the page and
// for the route's loader that starts the same requests at navigation (src/features/insight/prefetch.ts).
import { attemptErrorNames, type AttemptError } from "../../../shared/scoring/scoreAttempt";
import { filteredPagePrefetch } from "../insight/prefetch";
import type { ApiFilters } from "../insight/queries";
import type { FilterChoices, OptionalFilter } from "../insight/useInsightFilters";
import { techniqueErrorQueries } from "./queries";

export const techniqueErrorFilters: readonly OptionalFilter[] = ["site", "patientType", "feedback", "instructor", "manikin"];
export const techniqueErrorChoices: FilterChoices = { ranges: true };

/** The technique error the address chose (?error=too_shallow), if it names one. */
export function chosenError(search: URLSearchParams): AttemptError | null {
  const value = search.get("error");
  return value !== null && (attemptErrorNames as readonly string[]).includes(value) ? (value as AttemptError) : null;
}

export function techniqueErrorsQuery(filters: ApiFilters, search: URLSearchParams) {
  return techniqueErrorQueries.analysis({ ...filters, error: chosenError(search) ?? undefined });
}

export const prefetchTechniqueErrors = filteredPagePrefetch(techniqueErrorFilters, techniqueErrorChoices, (filters, { search }) =>
  techniqueErrorsQuery(filters, search),
);
