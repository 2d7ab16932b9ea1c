// Frame of every filtered insight page: waits for the filter options, shows the filter bar, warns when the
// address asked for a quarter without data, and hands the resolved filters to the page.
import type { ReactNode } from "react";
import { FilterBar } from "../../components/FilterBar";
import { Notice } from "../../components/Notice";
import { EmptyState, ErrorState, LoadingState } from "../../components/States";
import { quarterLabel } from "../../../shared/period";
import { useInsightFilters, type InsightFilterState, type OptionalFilter } from "./useInsightFilters";

export interface InsightFiltersProps {
  optional: readonly OptionalFilter[];
  /** Names the filter group for screen readers, e.g. "Filter the overview". */
  label: string;
  /** Offer the ranges "last 4 quarters" and "all quarters" besides single quarters. */
  ranges?: boolean;
  /** Drawn above the filter bar once the options are known (e.g. a heading named from them). */
  before?: (state: InsightFilterState) => ReactNode;
  children: (state: InsightFilterState) => ReactNode;
}

export function InsightFilters({ optional, label, ranges = false, before, children }: InsightFiltersProps) {
  const { optionsQuery, state } = useInsightFilters(optional, { ranges });
  if (optionsQuery.isPending) return <LoadingState label="Loading the filters…" />;
  if (optionsQuery.isError) return <ErrorState error={optionsQuery.error} title="The filters could not be loaded" onRetry={() => optionsQuery.refetch()} />;
  if (!state) {
    return <EmptyState title="No attempts have been imported yet">Figures appear here once class logs and manikin files have been imported.</EmptyState>;
  }
  return (
    <>
      {before?.(state)}
      <FilterBar filters={state.definitions} label={label} />
      {state.unknownQuarter && (
        <Notice tone="info" className="mb-4">
          The link asked for {quarterLabel(state.unknownQuarter)}, which has no attempts. Showing {quarterLabel(state.quarter)}, the latest quarter with data.
        </Notice>
      )}
      {children(state)}
    </>
  );
}
