import { keepPreviousData, queryOptions } from "@tanstack/react-query";
import { techniqueErrorsAnswerSchema } from "../../../shared/schemas/insight";
import { getParsed } from "../../api/getParsed";
import { withQuery } from "../../api/withQuery";
import type { ApiFilters } from "../insight/queries";

export const techniqueErrorQueries = {
  all: () => ["errors"] as const,
  analysis: (query: ApiFilters & { error?: string }) =>
    queryOptions({
      queryKey: [...techniqueErrorQueries.all(), query] as const,
      queryFn: ({ signal }) => getParsed(techniqueErrorsAnswerSchema, withQuery("/api/insight/errors", query), signal),
      placeholderData: keepPreviousData,
    }),
};
