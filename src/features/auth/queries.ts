// Query options for the signed-in session. Everything that needs "who am I" reads authQueries.me().
import { queryOptions } from "@tanstack/react-query";
import { sessionAnswerSchema, type SessionAnswer } from "../../../shared/schemas/auth";
import { getParsed } from "../../api/getParsed";
import { ApiError, setCsrfToken } from "../../api/http";

export const authQueries = {
  all: () => ["auth"] as const,
  /** The session answer, or null when signed out (a 401 is an answer here, not a failure). */
  me: () =>
    queryOptions({
      queryKey: [...authQueries.all(), "me"] as const,
      queryFn: async ({ signal }): Promise<SessionAnswer | null> => {
        try {
          const answer = await getParsed(sessionAnswerSchema, "/api/me", signal);
          setCsrfToken(answer.csrfToken);
          return answer;
        } catch (error) {
          if (error instanceof ApiError && error.status === 401) return null;
          throw error;
        }
      },
      staleTime: 5 * 60_000,
      retry: false,
    }),
};
