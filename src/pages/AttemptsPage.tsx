// Attempts (quality lead, coordinator): every attempt that matches the filters in the URL, a page at a time,
// newest first. Reached from the error trends with the error and group already chosen.
import { useQuery } from "@tanstack/react-query";
import { useEffect, useRef } from "react";
import { useSearchParams } from "react-router";
import { attemptErrorNames } from "../../shared/scoring/scoreAttempt";
import { Button } from "../components/Button";
import { FilterBar, useFilterValues, type FilterDefinition } from "../components/FilterBar";
import { PageHeader } from "../components/PageHeader";
import { EmptyState, ErrorState, LoadingState } from "../components/States";
import { AttemptsTable } from "../features/attempts/AttemptsTable";
import { attemptQueries } from "../features/attempts/queries";
import { useInsightFilters, type InsightFilterState, type OptionalFilter } from "../features/insight/useInsightFilters";
import { useLengthUnit } from "../lib/useLengthUnit";

const PAGE_SIZE = 50;
const filterKeys: readonly OptionalFilter[] = ["site", "patientType", "feedback", "instructor", "manikin"];

export default function AttemptsPage() {
  const { optionsQuery: options, state } = useInsightFilters(filterKeys, { ranges: true });
  return (
    <div>
      <PageHeader title="Attempts" description="Each attempt with the figures that decide its result, and its errors in words. Open one to see its compressions where the manikin sent a stream." />
      {options.isPending ? (
        <LoadingState label="Loading the filters…" />
      ) : options.isError ? (
        <ErrorState error={options.error} onRetry={() => options.refetch()} />
      ) : !state ? (
        <EmptyState title="No attempts yet">Attempts appear here once they have been imported.</EmptyState>
      ) : (
        <AttemptList state={state} />
      )}
    </div>
  );
}

function AttemptList({ state }: { state: InsightFilterState }) {
  const { options } = state;
  const errorFilter: FilterDefinition = {
    key: "error",
    label: "Error",
    options: options.errors.filter((e) => (attemptErrorNames as readonly string[]).includes(e.name)).map((e) => ({ value: e.name, label: e.label })),
    allLabel: "Any result",
  };
  const filters = [...state.definitions, errorFilter];
  const values = useFilterValues(filters);
  const [params, setParams] = useSearchParams();
  const page = Math.max(1, Number.parseInt(params.get("page") ?? "1", 10) || 1);
  const { unit } = useLengthUnit();
  // a new choice of filters starts again at the first page
  const filterKey = JSON.stringify(values);
  const lastFilterKey = useRef(filterKey);
  useEffect(() => {
    if (lastFilterKey.current === filterKey) return;
    lastFilterKey.current = filterKey;
    setParams(
      (previous) => {
        const updated = new URLSearchParams(previous);
        updated.delete("page");
        return updated;
      },
      { replace: true },
    );
  }, [filterKey, setParams]);
  const list = useQuery(attemptQueries.list({ ...state.api, error: values.error ?? undefined, page, pageSize: PAGE_SIZE }));

  function goTo(next: number) {
    setParams((previous) => {
      const updated = new URLSearchParams(previous);
      if (next <= 1) updated.delete("page");
      else updated.set("page", String(next));
      return updated;
    });
    window.scrollTo?.({ top: 0 });
  }

  const total = list.data?.total ?? 0;
  const pages = Math.max(1, Math.ceil(total / PAGE_SIZE));
  const first = (page - 1) * PAGE_SIZE + 1;
  const last = Math.min(total, page * PAGE_SIZE);

  const pager = (
    <nav aria-label="Pages of attempts" className="flex flex-wrap items-center gap-2">
      <Button variant="secondary" size="sm" disabled={page <= 1} onClick={() => goTo(page - 1)}>
        Newer
      </Button>
      <span className="text-small text-muted tabular-nums">
        Page {page} of {pages}
      </span>
      <Button variant="secondary" size="sm" disabled={page >= pages} onClick={() => goTo(page + 1)}>
        Older
      </Button>
    </nav>
  );

  return (
    <>
      <FilterBar filters={filters} label="Filter the attempts" />
      {list.isPending ? (
        <LoadingState label="Loading attempts…" />
      ) : list.isError ? (
        <ErrorState error={list.error} onRetry={() => list.refetch()} />
      ) : total === 0 ? (
        <EmptyState title="No attempts match these filters">Choose another period or clear a filter.</EmptyState>
      ) : page > pages ? (
        <EmptyState title={`There is no page ${page}`} action={<Button variant="secondary" onClick={() => goTo(1)}>Go to the first page</Button>}>
          These filters give {total} attempts on {pages} page{pages === 1 ? "" : "s"}.
        </EmptyState>
      ) : (
        <div className={list.isPlaceholderData ? "flex flex-col gap-3 opacity-60" : "flex flex-col gap-3"} aria-busy={list.isPlaceholderData || undefined}>
          <div className="flex flex-wrap items-center justify-between gap-3">
            <p className="font-medium" aria-live="polite">
              Attempts {first}–{last} of {total.toLocaleString("en-GB")}, newest first
            </p>
            {pages > 1 && pager}
          </div>
          <AttemptsTable rows={list.data.attempts} unit={unit} caption="Attempts on this page" />
          <p className="text-caption text-muted">Sorting and the filter box act on this page; the CSV holds the rows shown. Depth is in {unit} as set on your account page.</p>
          {pages > 1 && <div className="flex justify-end">{pager}</div>}
        </div>
      )}
    </>
  );
}
