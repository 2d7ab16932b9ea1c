// Network overview: the quarter's measured pass rate against what instructors recorded, the quarterly
// p-chart, the error Pareto and live against hidden display. Landing page for coordinators and quality leads.
import { keepPreviousData, useQuery } from "@tanstack/react-query";
import { useCallback } from "react";
import { useSearchParams } from "react-router";
import type { OverviewAnswer } from "../../../../shared/schemas/insight";
import { PageHeader } from "../../../components/PageHeader";
import { SafetyNote } from "../../../components/SafetyNote";
import { PassRateControlChart } from "../charts/PassRateControlChart";
import { ChartBaselineCaption } from "../charts/ChartBaselineCaption";
import { ChartSplitChoice } from "../charts/ChartSplitChoice";
import { TechniqueErrorParetoChart } from "../charts/TechniqueErrorParetoChart";
import { FeedbackComparisonChart } from "../charts/FeedbackComparisonChart";
import { InsightFilters } from "../InsightFilters";
import { NoDataForFilters } from "../NoDataForFilters";
import { Notice } from "../../../components/Notice";
import { OverviewStats } from "./OverviewStats";
import { RecordedVsMeasured } from "./RecordedVsMeasured";
import { QueryStatus } from "../QueryStatus";
import { NothingToChart } from "../charts/NothingToChart";
import { suppressedText } from "../format";
import { quarterLabel } from "../../../../shared/period";
import { overviewFilters, overviewQuery } from "../pageRequests";
import { useActionMarks } from "../../actions/useActionMarks";
import type { ActionMark } from "../../../../shared/schemas/actions";
import { linkParams, type InsightFilterState } from "../useInsightFilters";
import { useCan } from "../../auth/useCan";

export default function OverviewPage() {
  return (
    <div>
      <PageHeader
        title="Network overview"
        description="How many learners' compressions met the targets on the manikin, set beside what instructors recorded in class."
      />
      <InsightFilters optional={overviewFilters} label="Filter the overview">
        {(state) => <OverviewBody state={state} />}
      </InsightFilters>
    </div>
  );
}

function OverviewBody({ state }: { state: InsightFilterState }) {
  const [params] = useSearchParams();
  const query = useQuery({ ...overviewQuery(state.api, params), placeholderData: keepPreviousData });
  const actions = useActionMarks(state.api, query.data?.series.points.map((p) => p.quarter) ?? []);
  // those who may drill down open an error's trend and breakdown from its bar or row
  const drillDown = useCan("drillDown");
  const valuesKey = JSON.stringify(state.values);
  const examineHref = useCallback(
    (row: { error: string }) => `/errors?${linkParams(JSON.parse(valuesKey) as InsightFilterState["values"], { error: row.error })}`,
    [valuesKey],
  );
  const quarterHref = useCallback(
    (quarter: string) => `/attempts?${linkParams(JSON.parse(valuesKey) as InsightFilterState["values"], { quarter })}`,
    [valuesKey],
  );
  return (
    <QueryStatus query={query} loadingLabel={`Loading ${quarterLabel(state.quarter)}…`} errorTitle="The overview could not be loaded">
      {(answer) =>
        answer.attempts === 0 ? (
          <NoDataForFilters state={state} />
        ) : (
          <OverviewContent
            answer={answer}
            actions={actions}
            examineHref={drillDown ? examineHref : undefined}
            quarterHref={drillDown ? quarterHref : undefined}
          />
        )
      }
    </QueryStatus>
  );
}

export function OverviewContent({
  answer,
  actions,
  examineHref,
  quarterHref,
}: {
  answer: OverviewAnswer;
  actions?: readonly ActionMark[];
  examineHref?: (row: { error: string }) => string;
  /** For those who may drill down: a quarter's point opens its attempts. */
  quarterHref?: (quarter: string) => string;
}) {
  const min = answer.suppressionMinCount;
  return (
    <div className="flex flex-col gap-8">
      {answer.suppressed && (
        <Notice tone="info">
          Fewer than {min} attempts match these filters. To protect learners, the figures for this selection are hidden; widen the filters to see them.
        </Notice>
      )}
      <section aria-labelledby="headline-heading" className="flex flex-col gap-3">
        <h2 id="headline-heading" className="text-title">
          {quarterLabel(answer.period.from)} at a glance
        </h2>
        <OverviewStats answer={answer} />
        <p className="text-small text-muted">
          A pass means the attempt met every target of the network's pass rule. The 95 % interval is the range the true rate very likely lies in, given how many
          were counted: the fewer counted, the wider it is.
        </p>
        <SafetyNote compact />
      </section>

      <RecordedVsMeasured answer={answer} />

      <section aria-labelledby="trend-heading" className="flex flex-col gap-3">
        <h2 id="trend-heading" className="text-title">
          Quarter by quarter
        </h2>
        <p className="max-w-3xl text-small text-muted">
          The control limits show how far a quarter's pass rate can move by chance alone, given its number of attempts. A quarter outside them is a real change
          worth looking into, for better or worse.
        </p>
        <PassRateControlChart series={answer.series} minCount={min} actions={actions} quarterHref={quarterHref} />
        <ChartBaselineCaption series={answer.series} />
        <ChartSplitChoice actions={actions ?? []} />
      </section>

      <section aria-labelledby="errors-heading" className="flex flex-col gap-3">
        <h2 id="errors-heading" className="text-title">
          Errors and feedback
        </h2>
        <div className="grid grid-cols-1 gap-4 xl:grid-cols-2">
          {answer.errors.suppressed ? (
            <div className="self-start">
              <NothingToChart title="Which errors matter most" text={`The errors are hidden: ${suppressedText(min)}.`} />
            </div>
          ) : (
            <TechniqueErrorParetoChart rows={answer.errors.rows} attempts={answer.errors.attempts} examineHref={examineHref} />
          )}
          <div className="flex flex-col gap-2">
            <FeedbackComparisonChart groups={answer.feedback} minCount={min} />
            <p className="text-small text-muted">
              Live display shows learners their depth and rate as they compress; hidden display tests them without that help. A large gap means learners lean on
              the display.
            </p>
          </div>
        </div>
      </section>
    </div>
  );
}
