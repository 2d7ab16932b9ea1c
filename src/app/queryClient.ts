import { MutationCache, QueryCache, QueryClient } from "@tanstack/react-query";
import { apiErrorCodes } from "../../shared/errorCodes";
import { ApiError } from "../api/http";
import { authQueries } from "../features/auth/queries";
import { familiesChangedBy, invalidateFamilies } from "./figureQueries";

/** A 401 that means "your session ended", as opposed to a wrong password on the sign-in form. */
export function isSessionEnded(error: unknown): boolean {
  return error instanceof ApiError && error.status === 401 && error.code !== apiErrorCodes.invalidCredentials;
}

/**
 * One client per app. A 401 from any request means the session ended (expired, signed out elsewhere): mark
 * the user signed out, and the guards send them to sign in and back to the same page afterwards.
 * A mutation that changes figures says so in its `meta`; those queries are refetched when it
 * succeeds, so no page shows an answer from before the write.
 */
export function createQueryClient(): QueryClient {
  const queryClient: QueryClient = new QueryClient({
    queryCache: new QueryCache({
      onError: (error) => {
        if (isSessionEnded(error)) queryClient.setQueryData(authQueries.me().queryKey, null);
      },
    }),
    mutationCache: new MutationCache({
      onError: (error) => {
        if (isSessionEnded(error)) queryClient.setQueryData(authQueries.me().queryKey, null);
      },
      onSuccess: (_data, _variables, _context, mutation) => {
        const families = familiesChangedBy(mutation.options.meta);
        if (families.length > 0) return invalidateFamilies(queryClient, families);
      },
    }),
    defaultOptions: {
      queries: {
        staleTime: 30_000,
        retry: (failureCount, error) => !(error instanceof ApiError && error.status < 500) && failureCount < 2,
        refetchOnWindowFocus: false,
      },
    },
  });
  return queryClient;
}
