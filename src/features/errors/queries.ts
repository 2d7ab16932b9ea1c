import { keepPreviousData, queryOptions } from "@tanstack/react-query";
import { filtersToQuery } from "../../../shared/filters";
import type { ErrorsAnswer } from "../../../shared/schemas/insight";
import { http } from "../../api/http";

export const errorQueries = {
  all: () => ["errors"] as const,
  analysis: (query: Record<string, string | undefined>) =>
    queryOptions({
      queryKey: [...errorQueries.all(), query] as const,
      queryFn: ({ signal }) => http.get<ErrorsAnswer>(`/api/insight/errors?${filtersToQuery(query)}`, signal),
      placeholderData: keepPreviousData,
    }),
};
