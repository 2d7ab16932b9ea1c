import { queryOptions } from "@tanstack/react-query";
import { actionDetailAnswerSchema, actionListAnswerSchema, actionMarksAnswerSchema } from "../../../shared/schemas/actions";
import { actionMonthlyAnswerSchema } from "../../../shared/schemas/runChart";
import { getParsed } from "../../api/getParsed";
import { withQuery } from "../../api/withQuery";
import type { ApiFilters } from "../insight/queries";

export const actionQueries = {
  all: () => ["actions"] as const,
  list: () =>
    queryOptions({
      queryKey: [...actionQueries.all(), "list"] as const,
      queryFn: ({ signal }) => getParsed(actionListAnswerSchema, "/api/actions", signal),
    }),
  detail: (id: number) =>
    queryOptions({
      queryKey: [...actionQueries.all(), "detail", id] as const,
      queryFn: ({ signal }) => getParsed(actionDetailAnswerSchema, `/api/actions/${id}`, signal),
    }),
  /** The action's aim by month, split at its start (null when the viewer may not see the scope's months). */
  monthly: (id: number) =>
    queryOptions({
      queryKey: [...actionQueries.all(), "monthly", id] as const,
      queryFn: async ({ signal }) => (await getParsed(actionMonthlyAnswerSchema, `/api/actions/${id}/monthly`, signal)).chart,
    }),
  /** Actions a trend chart with these filters marks. */
  marks: (filters: ApiFilters) =>
    queryOptions({
      queryKey: [...actionQueries.all(), "marks", filters] as const,
      queryFn: async ({ signal }) => (await getParsed(actionMarksAnswerSchema, withQuery("/api/actions/marks", filters), signal)).marks,
    }),
};
