import { keepPreviousData, queryOptions } from "@tanstack/react-query";
import { errorsAnswerSchema } from "../../../shared/schemas/insight";
import { getParsed } from "../../api/getParsed";
import { withQuery } from "../../api/withQuery";
import type { ApiFilters } from "../insight/queries";

export const errorQueries = {
  all: () => ["errors"] as const,
  analysis: (query: ApiFilters & { error?: string }) =>
    queryOptions({
      queryKey: [...errorQueries.all(), query] as const,
      queryFn: ({ signal }) => getParsed(errorsAnswerSchema, withQuery("/api/insight/errors", query), signal),
      placeholderData: keepPreviousData,
    }),
};
