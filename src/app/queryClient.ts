import { QueryCache, QueryClient } from "@tanstack/react-query";
import { ApiError } from "../api/http";
import { authQueries } from "../features/auth/queries";

/**
 * One client per app. A 401 from any query means the session ended (expired, signed out elsewhere): mark
 * the user signed out, and the guards send them to sign in and back again.
 */
export function createQueryClient(): QueryClient {
  const queryClient: QueryClient = new QueryClient({
    queryCache: new QueryCache({
      onError: (error) => {
        if (error instanceof ApiError && error.status === 401) queryClient.setQueryData(authQueries.me().queryKey, null);
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
