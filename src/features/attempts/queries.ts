import { keepPreviousData, queryOptions } from "@tanstack/react-query";
import { attemptDetailAnswerSchema, attemptListAnswerSchema } from "../../../shared/schemas/insight";
import { getParsed } from "../../api/getParsed";
import { withQuery } from "../../api/withQuery";
import type { ApiFilters } from "../insight/queries";

/** What the attempt list and its CSV are asked for: the network filters and the search (see shared/filters). */
export interface AttemptSearchQuery extends ApiFilters {
  error?: string;
  stream?: string;
  class?: string;
  learner?: string;
  learnerMatch?: string;
  sort?: string;
  dir?: string;
}

export const attemptQueries = {
  all: () => ["attempts"] as const,
  list: (query: AttemptSearchQuery & { page?: number; pageSize?: number }) =>
    queryOptions({
      queryKey: [...attemptQueries.all(), "list", query] as const,
      queryFn: ({ signal }) => getParsed(attemptListAnswerSchema, withQuery("/api/attempts", query), signal),
      placeholderData: keepPreviousData,
    }),
  detail: (id: string) =>
    queryOptions({
      queryKey: [...attemptQueries.all(), "detail", id] as const,
      queryFn: ({ signal }) => getParsed(attemptDetailAnswerSchema, `/api/attempts/${encodeURIComponent(id)}`, signal),
    }),
};

/** The address of the CSV of every attempt the search selects (the server writes it; the browser downloads it). */
export function attemptsCsvPath(query: AttemptSearchQuery): string {
  return withQuery("/api/attempts.csv", query);
}
