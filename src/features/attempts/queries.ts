import { keepPreviousData, queryOptions } from "@tanstack/react-query";
import { filtersToQuery } from "../../../shared/filters";
import type { AttemptDetailAnswer, AttemptListAnswer } from "../../../shared/schemas/insight";
import { http } from "../../api/http";

export const attemptQueries = {
  all: () => ["attempts"] as const,
  list: (query: Record<string, string | undefined>) =>
    queryOptions({
      queryKey: [...attemptQueries.all(), "list", query] as const,
      queryFn: ({ signal }) => http.get<AttemptListAnswer>(`/api/attempts?${filtersToQuery(query)}`, signal),
      placeholderData: keepPreviousData,
    }),
  detail: (id: string) =>
    queryOptions({
      queryKey: [...attemptQueries.all(), "detail", id] as const,
      queryFn: ({ signal }) => http.get<AttemptDetailAnswer>(`/api/attempts/${encodeURIComponent(id)}`, signal),
      retry: (count, error) => !(error instanceof Error && "status" in error && (error as { status: number }).status === 404) && count < 2,
    }),
};
