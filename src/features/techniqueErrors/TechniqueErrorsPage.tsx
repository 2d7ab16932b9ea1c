// Error trends (quality lead, coordinator): which errors matter most for the chosen filters, and for one
// error its trend by quarter and where it happens, down to the attempts themselves.
import { useQuery } from "@tanstack/react-query";
import { useCallback } from "react";
import { manikinPath } from "../equipment/links";
import { Link, useSearchParams } from "react-router";
import type { FeedbackMode } from "../../../shared/domain";
import type { PatientType } from "../../../shared/scoring/policy";
import type { AttemptError } from "../../../shared/scoring/scoreAttempt";
import { Select } from "../../components/Field";
import { FilterBar, type FilterValues } from "../../components/FilterBar";
import { PageHeader } from "../../components/PageHeader";
import { EmptyState, ErrorState, LoadingState } from "../../components/States";
import { BreakdownPanel, type BreakdownRow } from "./BreakdownPanel";
import { TechniqueErrorTrendChart } from "./TechniqueErrorTrendChart";
import { ActionMarkList } from "../actions/ActionMarkList";
import { ParetoChart } from "./ParetoChart";
import { chosenError, techniqueErrorChoices, techniqueErrorFilters, techniqueErrorsQuery } from "./pageRequests";
import { useActionMarks, type ChartScope } from "../actions/useActionMarks";
import { linkParams, useInsightFilters, type InsightFilterState } from "../insight/useInsightFilters";
import { rangeLabel } from "../../../shared/period";
import { feedbackNames, patientTypeNames } from "../../../shared/vocabulary";

export default function TechniqueErrorsPage() {
  const { optionsQuery: options, state } = useInsightFilters(techniqueErrorFilters, techniqueErrorChoices);
  return (
    <div>
      <PageHeader
        title="Error trends"
        description="Which errors fail attempts most often, how each one changes from quarter to quarter, and where it happens. Every group leads to its attempts."
      />
      {options.isPending ? (
        <LoadingState label="Loading the filters…" />
      ) : options.isError ? (
        <ErrorState error={options.error} onRetry={() => options.refetch()} />
      ) : !state ? (
        <EmptyState title="No attempts yet">Error trends appear once attempts have been imported.</EmptyState>
      ) : (
        <TechniqueErrorTrends state={state} />
      )}
    </div>
  );
}

function TechniqueErrorTrends({ state }: { state: InsightFilterState }) {
  const { options, definitions: filters, values } = state;
  const [params, setParams] = useSearchParams();
  const error = chosenError(params);
  const analysis = useQuery(techniqueErrorsQuery(state.api, params));

  const examineHref = useCallback(
    (row: { error: AttemptError }) => {
      const next = new URLSearchParams(params);
      next.set("error", row.error);
      return `?${next.toString()}`;
    },
    [params],
  );

  function choose(next: string) {
    setParams(
      (previous) => {
        const updated = new URLSearchParams(previous);
        if (next) updated.set("error", next);
        else updated.delete("error");
        return updated;
      },
      { replace: true },
    );
  }

  return (
    <>
      <FilterBar filters={filters} label="Filter the error trends" />
      {analysis.isPending ? (
        <LoadingState label="Counting errors…" />
      ) : analysis.isError ? (
        <ErrorState error={analysis.error} onRetry={() => analysis.refetch()} />
      ) : (
        <div className={analysis.isPlaceholderData ? "opacity-60 transition-opacity" : undefined} aria-busy={analysis.isPlaceholderData || undefined}>
          <p className="mb-3 text-small text-muted">
            {rangeLabel(analysis.data.period)} · {analysis.data.pareto.attempts ?? 0} attempts
          </p>
          {!analysis.data.pareto.attempts ? (
            <EmptyState title="No attempts match these filters">Choose another period or clear a filter.</EmptyState>
          ) : (
            <div className="flex flex-col gap-6">
              <ParetoChart rows={analysis.data.pareto.rows} attempts={analysis.data.pareto.attempts} examineHref={examineHref} selected={error} />
              <section aria-labelledby="examine-heading" className="flex flex-col gap-4">
                <div className="flex flex-wrap items-end justify-between gap-3 border-t border-line pt-5">
                  <h2 id="examine-heading" className="text-title">
                    {analysis.data.selected ? analysis.data.selected.label : "Examine one error"}
                  </h2>
                  <Select
                    label="Error to examine"
                    className="w-full sm:w-80"
                    placeholder="Choose an error…"
                    value={error ?? ""}
                    onChange={(event) => choose(event.target.value)}
                    options={options.errors.map((e) => ({ value: e.name, label: e.label }))}
                  />
                </div>
                {analysis.data.selected ? (
                  <SelectedError selected={analysis.data.selected} values={values} scope={state.api} />
                ) : (
                  <EmptyState title="No error chosen">
                    Choose an error above, or “Trend and breakdown” in the table view of the chart, to see its trend by quarter and where it happens.
                  </EmptyState>
                )}
              </section>
            </div>
          )}
        </div>
      )}
    </>
  );
}

type Selected = NonNullable<import("../../../shared/schemas/insight").TechniqueErrorsAnswer["selected"]>;

function SelectedError({ selected, values, scope }: { selected: Selected; values: FilterValues; scope: ChartScope }) {
  const actions = useActionMarks(
    scope,
    selected.trend.map((row) => row.quarter),
  );
  const attemptsLink = (extra: Record<string, string | null>) => `/attempts?${linkParams(values, { error: selected.error, ...extra })}`;
  const withError = selected.byProfile.reduce((sum, row) => sum + row.count, 0);
  const valuesKey = JSON.stringify(values);
  // stable while the filters stay, so the chart is not redrawn on every render
  const quarterHref = useCallback(
    (quarter: string) => `/attempts?${linkParams(JSON.parse(valuesKey) as FilterValues, { error: selected.error, quarter })}`,
    [valuesKey, selected.error],
  );
  return (
    <div className="flex flex-col gap-6">
      <p className="flex flex-wrap items-center gap-x-4 gap-y-2">
        <span>
          {withError} of {selected.byProfile.reduce((sum, row) => sum + row.attempts, 0)} attempts in the period have this error.
        </span>
        <Link to={attemptsLink({})} className="font-semibold text-dusk-700 underline underline-offset-2 hover:text-dusk-900">
          List these {withError} attempts
        </Link>
        {/* straight to the attempts whose compressions can be looked at one by one */}
        <Link to={attemptsLink({ stream: "yes" })} className="font-semibold text-dusk-700 underline underline-offset-2 hover:text-dusk-900">
          Only those with a compression stream
        </Link>
      </p>
      <TechniqueErrorTrendChart label={selected.label} trend={selected.trend} actions={actions} quarterHref={quarterHref} />
      <ActionMarkList marks={actions} quarters={selected.trend.map((row) => row.quarter)} />
      <p className="text-small text-muted">
        With one quarter chosen, the trend shows the eight quarters up to it; with a longer period, each of its quarters. The other filters apply throughout.
        The groups below cover the chosen period only.
      </p>
      <Breakdowns selected={selected} attemptsLink={attemptsLink} />
    </div>
  );
}

const dimensions = [
  { id: "patient", label: "Patient type" },
  { id: "feedback", label: "Feedback mode" },
  { id: "site", label: "Site" },
  { id: "instructor", label: "Instructor" },
  { id: "manikin", label: "Manikin" },
] as const;
type Dimension = (typeof dimensions)[number]["id"];

const named = (row: BreakdownRow) => row.key;
/** Groups the server could not name ("(none)", "#12") cannot be filtered on. */
const recorded = (key: string) => (key === "(none)" || key.startsWith("#") ? null : key);

function Breakdowns({ selected, attemptsLink }: { selected: Selected; attemptsLink: (extra: Record<string, string | null>) => string }) {
  const [params, setParams] = useSearchParams();
  const by: Dimension = dimensions.find((d) => d.id === params.get("by"))?.id ?? "patient";
  function show(next: Dimension) {
    setParams(
      (previous) => {
        const updated = new URLSearchParams(previous);
        updated.set("by", next);
        return updated;
      },
      { replace: true },
    );
  }
  const panel = {
    patient: (
      <BreakdownPanel
        dimension="patient type"
        rows={selected.byProfile}
        nameOf={(row) => patientTypeNames[row.key as PatientType] ?? row.key}
        attemptsHref={(row) => attemptsLink({ patientType: row.key })}
        errorLabel={selected.label}
      />
    ),
    feedback: (
      <BreakdownPanel
        dimension="feedback mode"
        rows={selected.byFeedback}
        nameOf={(row) => feedbackNames[row.key as FeedbackMode] ?? row.key}
        attemptsHref={(row) => attemptsLink({ feedback: row.key })}
        errorLabel={selected.label}
      />
    ),
    site: (
      <BreakdownPanel
        dimension="site"
        rows={selected.bySite}
        nameOf={named}
        attemptsHref={(row) => (recorded(row.key) ? attemptsLink({ site: row.key }) : null)}
        errorLabel={selected.label}
      />
    ),
    instructor: (
      <BreakdownPanel
        dimension="instructor"
        rows={selected.byInstructor}
        nameOf={named}
        attemptsHref={(row) => (recorded(row.key) ? attemptsLink({ instructor: row.key }) : null)}
        errorLabel={selected.label}
      />
    ),
    manikin: (
      <BreakdownPanel
        dimension="manikin"
        rows={selected.byManikin}
        nameOf={named}
        attemptsHref={(row) => (recorded(row.key) ? attemptsLink({ manikin: row.key }) : null)}
        recordHref={(row) => (recorded(row.key) ? manikinPath(row.key) : null)}
        errorLabel={selected.label}
      />
    ),
  }[by];
  return (
    <section aria-labelledby="breakdown-heading" className="flex flex-col gap-3">
      <h3 id="breakdown-heading" className="text-lead font-semibold">
        Where it happens
      </h3>
      <div role="group" aria-label="Break down by" className="flex flex-wrap gap-2">
        <span className="self-center text-small font-semibold text-muted">Break down by</span>
        {dimensions.map((d) => (
          <button
            key={d.id}
            type="button"
            aria-pressed={by === d.id}
            onClick={() => show(d.id)}
            className={
              by === d.id
                ? "min-h-9 rounded-full border border-dusk-700 bg-dusk-700 px-3 text-small font-semibold text-white"
                : "min-h-9 rounded-full border border-line-strong bg-surface px-3 text-small font-medium text-dusk-800 hover:bg-dusk-50"
            }
          >
            {d.label}
          </button>
        ))}
      </div>
      {panel}
    </section>
  );
}
