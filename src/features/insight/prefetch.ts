// Starts a filtered page's requests when the router navigates to it, before the page's code has loaded: the
// filter options and, when the address says enough to know the filters, the page's answer, side by side.
// Without this the page asks for the options first and for its answer only once they have arrived.
import type { FetchQueryOptions, QueryClient, QueryKey } from "@tanstack/react-query";
import type { Params } from "react-router";
import type { OptionsAnswer } from "../../../shared/schemas/insight";
import { filterParamName } from "../../components/FilterBar";
import { insightQueries, type ApiFilters } from "./queries";
import { ALL_QUARTERS, LAST_FOUR, apiFilters, filterState, type FilterChoices, type OptionalFilter } from "./useInsightFilters";

/** The address being opened, as a loader sees it. */
export interface PageAddress {
  search: URLSearchParams;
  params: Params;
}

/** Starts the requests of one page; never throws (a failure shows on the page, which asks again). */
export type PagePrefetch = (queryClient: QueryClient, address: PageAddress) => void;

/** What a filtered page asks for, given its filters: the page and its loader build the answer's query with it. */
export type AnswerFor<T, K extends QueryKey> = (filters: ApiFilters, address: PageAddress) => FetchQueryOptions<T, Error, T, K>;

/**
 * The filters the page will ask with. Exact once the options are cached; before that, read from the address
 * when it names one quarter (a range needs the list of quarters, and without a quarter the page picks the
 * latest with data). A value the options turn out not to offer only costs one unused request.
 */
export function expectedFilters(
  options: OptionsAnswer | undefined,
  search: URLSearchParams,
  optional: readonly OptionalFilter[],
  choices: FilterChoices = {},
): ApiFilters | null {
  if (options) return filterState(options, search, optional, choices)?.api ?? null;
  const quarter = search.get(filterParamName("quarter"));
  if (!quarter || quarter === LAST_FOUR || quarter === ALL_QUARTERS) return null;
  const values = Object.fromEntries(["quarter", ...optional].map((key) => [key, search.get(filterParamName(key))]));
  return apiFilters(values, []);
}

/** The prefetch of a page that shows the insight filters: the options, and the page's answer when it can be known. */
export function filteredPagePrefetch<T, K extends QueryKey>(
  optional: readonly OptionalFilter[],
  choices: FilterChoices,
  answerFor?: AnswerFor<T, K>,
): PagePrefetch {
  return (queryClient, address) => {
    const options = insightQueries.options();
    void queryClient.ensureQueryData(options).catch(() => undefined);
    if (!answerFor) return;
    const filters = expectedFilters(queryClient.getQueryData(options.queryKey), address.search, optional, choices);
    if (filters) void queryClient.prefetchQuery(answerFor(filters, address));
  };
}

/** The prefetch of a page that waits for the filter options before its own requests. */
export const optionsPrefetch: PagePrefetch = filteredPagePrefetch([], {});
