import { keepPreviousData, queryOptions } from "@tanstack/react-query";
import { filtersToQuery } from "../../../shared/filters";
import type { ErrorsAnswer } from "../../../shared/schemas/insight";
import { http } from "../../api/http";

export const errorQueries = {
  analysis: (query: Record<string, string | undefined>) =>
    queryOptions({
      queryKey: ["insight", "errors", query] as const,
      queryFn: ({ signal }) => http.get<ErrorsAnswer>(`/api/insight/errors?${filtersToQuery(query)}`, signal),
      placeholderData: keepPreviousData,
    }),
};
