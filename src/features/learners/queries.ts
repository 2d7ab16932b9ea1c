// Query options for skill retention and instructors' calibration, checked against the shared schemas.
import { keepPreviousData, queryOptions } from "@tanstack/react-query";
import { calibrationAnswerSchema, retentionAnswerSchema } from "../../../shared/schemas/learners";
import { getParsed } from "../../api/getParsed";
import { withQuery } from "../../api/withQuery";
import type { ApiFilters } from "../insight/queries";

export const learnerQueries = {
  all: () => ["learners"] as const,
  retention: (filters: ApiFilters) =>
    queryOptions({
      queryKey: [...learnerQueries.all(), "retention", filters] as const,
      queryFn: ({ signal }) => getParsed(retentionAnswerSchema, withQuery("/api/learners/retention", filters), signal),
      placeholderData: keepPreviousData,
    }),
  calibration: (filters: ApiFilters) =>
    queryOptions({
      queryKey: [...learnerQueries.all(), "calibration", filters] as const,
      queryFn: ({ signal }) => getParsed(calibrationAnswerSchema, withQuery("/api/learners/calibration", filters), signal),
      placeholderData: keepPreviousData,
    }),
};
