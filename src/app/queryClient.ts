import { MutationCache, QueryCache, QueryClient } from "@tanstack/react-query";
import { ApiError } from "../api/http";
import { authQueries } from "../features/auth/queries";

/** A 401 that means "your session ended", as opposed to a wrong password on the sign-in form. */
export function isSessionEnded(error: unknown): boolean {
  return error instanceof ApiError && error.status === 401 && error.code !== "invalid_credentials";
}

/**
 * One client per app. A 401 from any request means the session ended (expired, signed out elsewhere): mark
 * the user signed out, and the guards send them to sign in and back to the same page afterwards.
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
