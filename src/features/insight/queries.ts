// Query options for the network-insight API. Every answer is checked against its shared zod schema
// (src/api/getParsed.ts).
import { queryOptions } from "@tanstack/react-query";
import {
  attemptListAnswerSchema,
  classDetailAnswerSchema,
  instructorDetailAnswerSchema,
  instructorsAnswerSchema,
  optionsAnswerSchema,
  overviewAnswerSchema,
  standingAnswerSchema,
} from "../../../shared/schemas/insight";
import { getParsed } from "../../api/getParsed";
import { withQuery } from "../../api/withQuery";

/** The filters as the API names them (the URL uses the filter bar's names; see useInsightFilters). */
export interface ApiFilters {
  /** One quarter, or a from/to range. */
  quarter?: string;
  from?: string;
  to?: string;
  site?: string;
  profile?: string;
  feedback?: string;
  instructor?: string;
  manikin?: string;
  /** How instructors are compared (instructors and standing only): `case-mix` or `none`. */
  adjust?: string;
  /** The overview p-chart's limits: `laney` for Laney's p′ (plain binomial when absent). */
  limits?: string;
  /** The overview p-chart split at this date, "YYYY-MM-DD" (one phase when absent). */
  split?: string;
}

export const insightQueries = {
  all: () => ["insight"] as const,
  options: () =>
    queryOptions({
      queryKey: [...insightQueries.all(), "options"] as const,
      queryFn: ({ signal }) => getParsed(optionsAnswerSchema, "/api/insight/options", signal),
      staleTime: 5 * 60_000,
    }),
  overview: (filters: ApiFilters) =>
    queryOptions({
      queryKey: [...insightQueries.all(), "overview", filters] as const,
      queryFn: ({ signal }) => getParsed(overviewAnswerSchema, withQuery("/api/insight/overview", filters), signal),
    }),
  standing: (filters: ApiFilters) =>
    queryOptions({
      queryKey: [...insightQueries.all(), "standing", filters] as const,
      queryFn: ({ signal }) => getParsed(standingAnswerSchema, withQuery("/api/insight/standing", filters), signal),
    }),
  instructors: (filters: ApiFilters) =>
    queryOptions({
      queryKey: [...insightQueries.all(), "instructors", filters] as const,
      queryFn: ({ signal }) => getParsed(instructorsAnswerSchema, withQuery("/api/insight/instructors", filters), signal),
    }),
  instructor: (id: string, filters: ApiFilters) =>
    queryOptions({
      queryKey: [...insightQueries.all(), "instructor", id, filters] as const,
      queryFn: ({ signal }) => getParsed(instructorDetailAnswerSchema, withQuery(`/api/insight/instructors/${encodeURIComponent(id)}`, filters), signal),
    }),
  classDetail: (id: string) =>
    queryOptions({
      queryKey: [...insightQueries.all(), "class", id] as const,
      queryFn: ({ signal }) => getParsed(classDetailAnswerSchema, `/api/classes/${encodeURIComponent(id)}`, signal),
    }),
  /** The class's attempts with their measurements (depth, rate), which the class answer leaves out. */
  classAttempts: (id: string, quarter: string) =>
    queryOptions({
      queryKey: [...insightQueries.all(), "class", id, "attempts", quarter] as const,
      queryFn: ({ signal }) => getParsed(attemptListAnswerSchema, withQuery("/api/attempts", { class: id, quarter, pageSize: 200 }), signal),
    }),
};
