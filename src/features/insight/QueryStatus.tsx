// Loading and error states for an insight answer, and a quiet "updating" line while a filter change loads
// (the previous figures stay on screen, marked as such, rather than the page flashing empty).
import type { UseQueryResult } from "@tanstack/react-query";
import type { ReactNode } from "react";
import { Spinner } from "../../components/Button";
import { ErrorState, LoadingState } from "../../components/States";

export interface QueryStatusProps<T> {
  query: UseQueryResult<T>;
  loadingLabel: string;
  errorTitle: string;
  /** Another rendering for some errors (e.g. a 404 that means "not yours"). */
  renderError?: (error: unknown) => ReactNode | null;
  children: (data: T) => ReactNode;
}

export function QueryStatus<T>({ query, loadingLabel, errorTitle, renderError, children }: QueryStatusProps<T>) {
  if (query.isPending) return <LoadingState label={loadingLabel} />;
  if (query.isError) {
    const custom = renderError?.(query.error);
    return custom ?? <ErrorState error={query.error} title={errorTitle} onRetry={() => query.refetch()} />;
  }
  return (
    <>
      {query.isPlaceholderData && (
        <p role="status" className="mb-3 flex items-center gap-2 text-small text-muted">
          <Spinner className="text-dusk-600" /> Updating the figures for the new filters…
        </p>
      )}
      <div className={query.isPlaceholderData ? "opacity-60 transition-opacity" : undefined}>{children(query.data)}</div>
    </>
  );
}
