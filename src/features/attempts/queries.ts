import { keepPreviousData, queryOptions } from "@tanstack/react-query";
import { attemptDetailAnswerSchema, attemptListAnswerSchema } from "../../../shared/schemas/insight";
import { getParsed } from "../../api/getParsed";
import { withQuery } from "../../api/withQuery";
import type { ApiFilters } from "../insight/queries";

export const attemptQueries = {
  all: () => ["attempts"] as const,
  list: (query: ApiFilters & { error?: string; page?: number; pageSize?: number }) =>
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
