// Query options for the network-insight API. Every answer is checked against its shared zod schema, so a
// page never draws numbers the server did not promise.
import { queryOptions } from "@tanstack/react-query";
import type { z } from "zod";
import { filtersToQuery } from "../../../shared/filters";
import {
  attemptListAnswerSchema,
  classDetailAnswerSchema,
  instructorDetailAnswerSchema,
  instructorsAnswerSchema,
  optionsAnswerSchema,
  overviewAnswerSchema,
  standingAnswerSchema,
} from "../../../shared/schemas/insight";
import { ApiError, http } from "../../api/http";

/** The filters as the API names them (the URL uses the filter bar's names; see useInsightFilters). */
export interface ApiFilters {
  quarter?: string;
  site?: string;
  profile?: string;
  feedback?: string;
  instructor?: string;
  manikin?: string;
}

/** Parses an answer; a shape the schema refuses becomes a readable error rather than wrong numbers. */
async function getParsed<S extends z.ZodType>(schema: S, path: string, signal: AbortSignal): Promise<z.infer<S>> {
  const parsed = schema.safeParse(await http.get<unknown>(path, signal));
  if (parsed.success) return parsed.data;
  // Status 200 keeps the query client from retrying: asking again brings the same answer.
  throw new ApiError(200, "unexpected_answer", "The server's answer was not in the expected form, so its figures are not shown. Reload the page; if it stays, tell your coordinator.", parsed.error.issues);
}

function withQuery(path: string, filters: ApiFilters): string {
  const query = filtersToQuery({ ...filters });
  return query ? `${path}?${query}` : path;
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
      queryFn: ({ signal }) =>
        getParsed(instructorDetailAnswerSchema, withQuery(`/api/insight/instructors/${encodeURIComponent(id)}`, filters), signal),
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
      queryFn: ({ signal }) =>
        getParsed(attemptListAnswerSchema, `/api/attempts?${filtersToQuery({ class: id, quarter, pageSize: 200 })}`, signal),
    }),
};
