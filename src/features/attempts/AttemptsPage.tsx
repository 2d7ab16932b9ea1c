// Attempts: every attempt that matches the filters in the URL, searched, sorted and paged by the server over
// the whole result, with the columns the user chose. Quality leads and coordinators see the network's
// attempts, instructors their own (the server keeps them to those). Reached from the error trends and from
// My standing with the error already chosen; each attempt's page leads back here with the same filters.
import { formatCount } from "../../lib/formatting";
import { useQuery } from "@tanstack/react-query";
import { useEffect, useId, useMemo, useRef } from "react";
import { useLocation, useSearchParams } from "react-router";
import type { AttemptSortKey, SortDirection } from "../../../shared/filters";
import { attemptErrorNames } from "../../../shared/scoring/scoreAttempt";
import { attemptFieldNames } from "../../../shared/vocabulary";
import { Button } from "../../components/Button";
import { PhoneSortSelect, type Column } from "../../components/DataTable";
import { FilterBar, useFilterValues, type FilterDefinition } from "../../components/FilterBar";
import { PageHeader } from "../../components/PageHeader";
import { EmptyState, ErrorState, LoadingState } from "../../components/States";
import { attemptColumns, type AttemptColumn } from "./attemptColumns";
import { attemptColumnKeys, attemptSearchQuery, columnsParam, nextSort, PAGE_SIZE, readAttemptListState, withChanges } from "./attemptListState";
import { AttemptSearchFields, type SearchValues } from "./AttemptSearchFields";
import { AttemptsTable } from "./AttemptsTable";
import { ColumnChooser } from "./ColumnChooser";
import { attemptQueries, attemptsCsvPath, type AttemptSearchQuery } from "./queries";
import { useCan } from "../auth/useCan";
import { useInsightFilters, type InsightFilterState, type OptionalFilter } from "../insight/useInsightFilters";
import { useLengthUnit } from "../../lib/useLengthUnit";
import { DownloadIcon } from "../../components/DownloadIcon";

const filterKeys: readonly OptionalFilter[] = ["site", "patientType", "feedback", "instructor", "manikin"];

const streamFilter: FilterDefinition = {
  key: "stream",
  label: attemptFieldNames.stream,
  options: [
    { value: "yes", label: "With a compression stream" },
    { value: "no", label: "Device summary only" },
  ],
  allLabel: "With or without",
};

export default function AttemptsPage() {
  const { optionsQuery: options, state } = useInsightFilters(filterKeys, { ranges: true });
  const everyone = useCan("readAttempts", "any");
  return (
    <div>
      <PageHeader
        title="Attempts"
        description={`${everyone ? "Each attempt" : "Each attempt in your classes"} with the figures that decide its result, and its errors in words. Open one to see its compressions where the manikin sent a stream.`}
      />
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

function orderWords(column: Pick<AttemptColumn, "header" | "numeric" | "sortLabels">, dir: SortDirection): string {
  const words = column.sortLabels ?? (column.numeric ? { asc: "lowest first", desc: "highest first" } : { asc: "A to Z", desc: "Z to A" });
  return `${column.header}, ${words[dir]}`;
}

function AttemptList({ state }: { state: InsightFilterState }) {
  const { options } = state;
  const errorFilter: FilterDefinition = {
    key: "error",
    label: "Error",
    options: options.errors.filter((e) => (attemptErrorNames as readonly string[]).includes(e.name)).map((e) => ({ value: e.name, label: e.label })),
    allLabel: "Any result",
  };
  const filters = [...state.definitions, errorFilter, streamFilter];
  const values = useFilterValues(filters);
  const [params, setParams] = useSearchParams();
  const location = useLocation();
  const list = readAttemptListState(params);
  const { unit, formatLength } = useLengthUnit();
  const sortId = useId();

  // a new choice in the filter bar starts again at the first page (the other controls do so themselves)
  const filterKey = JSON.stringify(values);
  const lastFilterKey = useRef(filterKey);
  useEffect(() => {
    if (lastFilterKey.current === filterKey) return;
    lastFilterKey.current = filterKey;
    setParams((previous) => withChanges(previous, { page: null }), { replace: true });
  }, [filterKey, setParams]);

  const search: AttemptSearchQuery = { ...state.api, error: values.error ?? undefined, stream: values.stream ?? undefined, ...attemptSearchQuery(list) };
  const answer = useQuery(attemptQueries.list({ ...search, page: list.page, pageSize: PAGE_SIZE }));

  const byKey = useMemo(() => attemptColumns(unit, formatLength), [unit, formatLength]);
  const allColumns = attemptColumnKeys.map((key) => byKey[key]);
  const shownColumns = list.columns.map((key) => byKey[key]);
  const idColumn = { header: attemptFieldNames.id };
  const sortColumn = list.sort === "id" ? idColumn : byKey[list.sort];
  // phones have no headers to click: the same orders as a select ("As listed" is newest first)
  const sortChoices: Column<unknown>[] = [{ key: "id", ...idColumn }, ...allColumns].map((column) => ({
    key: column.key,
    header: column.header,
    value: () => null,
    align: "numeric" in column && column.numeric ? "right" : "left",
    sortLabels: "sortLabels" in column ? column.sortLabels : undefined,
  }));

  const update = (changes: Record<string, string | null>) => setParams((previous) => withChanges(previous, changes));
  const sortBy = (key: AttemptSortKey) => update(nextSort(list, key));
  const searchFor = (next: SearchValues) =>
    update({ learner: next.learner, learnerMatch: next.learner && next.learnerPrefix ? "prefix" : null, class: next.classId });
  function goTo(page: number) {
    update({ page: page <= 1 ? null : String(page) });
    window.scrollTo?.({ top: 0 });
  }

  const total = answer.data?.total ?? 0;
  const pages = Math.max(1, Math.ceil(total / PAGE_SIZE));
  const first = (list.page - 1) * PAGE_SIZE + 1;
  const last = Math.min(total, list.page * PAGE_SIZE);

  // two pagers, above and below the list: landmarks need names of their own
  const pager = (where: string) => (
    <nav aria-label={`Pages of attempts, ${where}`} className="flex flex-wrap items-center gap-2">
      <Button variant="secondary" size="sm" disabled={list.page <= 1} onClick={() => goTo(list.page - 1)}>
        Previous page
      </Button>
      <span className="text-small text-muted tabular-nums">
        Page {list.page} of {pages}
      </span>
      <Button variant="secondary" size="sm" disabled={list.page >= pages} onClick={() => goTo(list.page + 1)}>
        Next page
      </Button>
    </nav>
  );

  return (
    <>
      <FilterBar filters={filters} label="Filter the attempts" />
      <div className="mb-4">
        <AttemptSearchFields values={{ learner: list.learner, learnerPrefix: list.learnerPrefix, classId: list.classId }} onSearch={searchFor} />
      </div>
      <div className="mb-3 flex flex-wrap items-end justify-end gap-3">
        <PhoneSortSelect
          id={sortId}
          columns={sortChoices}
          sort={{ key: list.sort, direction: list.dir }}
          onChange={(next) => update(next ? { sort: next.key, dir: next.direction } : { sort: null, dir: null })}
        />
        <ColumnChooser columns={allColumns} shown={list.columns} onChange={(shown) => update({ cols: columnsParam(shown) })} />
        {total > 0 && (
          <a
            href={attemptsCsvPath(search)}
            download
            className="inline-flex min-h-11 items-center gap-2 rounded-control border border-line-strong bg-surface px-4 font-medium text-dusk-800 hover:bg-dusk-50"
          >
            <DownloadIcon />
            Export CSV of all {formatCount(total)} attempts
          </a>
        )}
      </div>
      {answer.isPending ? (
        <LoadingState label="Loading attempts…" />
      ) : answer.isError ? (
        <ErrorState error={answer.error} onRetry={() => answer.refetch()} />
      ) : total === 0 ? (
        <EmptyState title="No attempts match these filters">Choose another period, clear a filter or change the search.</EmptyState>
      ) : list.page > pages ? (
        <EmptyState
          title={`There is no page ${list.page}`}
          action={
            <Button variant="secondary" onClick={() => goTo(1)}>
              Go to the first page
            </Button>
          }
        >
          These filters give {total} attempts on {pages} page{pages === 1 ? "" : "s"}.
        </EmptyState>
      ) : (
        <div className={answer.isPlaceholderData ? "flex flex-col gap-3 opacity-60" : "flex flex-col gap-3"} aria-busy={answer.isPlaceholderData || undefined}>
          <div className="flex flex-wrap items-center justify-between gap-3">
            <p className="font-medium" aria-live="polite">
              Attempts {formatCount(first)}–{formatCount(last)} of {formatCount(total)}, sorted by {orderWords(sortColumn, list.dir).toLowerCase()}
            </p>
            {pages > 1 && pager("above the list")}
          </div>
          <AttemptsTable
            rows={answer.data.attempts}
            columns={shownColumns}
            sort={list.sort}
            dir={list.dir}
            onSort={sortBy}
            from={`${location.pathname}${location.search}`}
            caption="Attempts"
          />
          <p className="text-caption text-muted">
            Sorting, the filters and the CSV cover every matching attempt, not only this page. Depth is in {unit} as set on your account page; the CSV gives it
            in mm.
          </p>
          {pages > 1 && <div className="flex justify-end">{pager("below the list")}</div>}
        </div>
      )}
    </>
  );
}
