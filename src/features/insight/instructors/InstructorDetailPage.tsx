// One instructor (coordinator, quality lead): quarterly pass rate with its interval beside the network's,
// median score, and the classes of the chosen quarter.
import { keepPreviousData, useQuery } from "@tanstack/react-query";
import { useParams } from "react-router";
import type { InstructorDetailAnswer, InstructorsAnswer, OverviewAnswer } from "../../../../shared/schemas/insight";
import { ApiError } from "../../../api/http";
import { BackLink } from "../../../components/BackLink";
import { PageHeader } from "../../../components/PageHeader";
import { SafetyNote } from "../../../components/SafetyNote";
import { EmptyState } from "../../../components/States";
import { ClassTable } from "../ClassTable";
import { MedianScoreTrendChart, PassRateTrendChart, type TrendRow } from "../charts/InstructorTrendCharts";
import { useAdjustMode } from "../AdjustChoice";
import { adjustNames } from "../../../../shared/vocabulary";
import { PositionText } from "../charts/FunnelChart";
import { formatCount, formatPercent, formatScore } from "../format";
import { quarterLabel } from "../../../../shared/period";
import { RateText } from "../RateText";
import { InsightFilters } from "../InsightFilters";
import { instructorFilters } from "../pageRequests";
import { InstructorCalibration } from "../../learners/CalibrationViews";
import { learnerQueries } from "../../learners/queries";
import { QueryStatus } from "../QueryStatus";
import { insightQueries } from "../queries";
import type { InsightFilterState } from "../useInsightFilters";

export default function InstructorDetailPage() {
  const { id = "" } = useParams();
  return (
    <div>
      <BackLink to="/instructors" label="All instructors" />
      <InsightFilters optional={instructorFilters} label="Filter this instructor's figures" before={(state) => <InstructorHeader id={id} state={state} />}>
        {(state) => <InstructorBody id={id} state={state} />}
      </InsightFilters>
    </div>
  );
}

/** The instructor's name comes with the filter options, so the heading does not wait for the figures. */
function InstructorHeader({ id, state }: { id: string; state: InsightFilterState }) {
  const known = state.options.instructors.find((i) => String(i.id) === id || i.code === id);
  const site = known?.siteId == null ? null : state.options.sites.find((s) => s.id === known.siteId);
  if (!known) return <PageHeader title="Instructor" />;
  return (
    <PageHeader
      title={`${known.code} · ${known.name}`}
      description={`${site ? `${site.code} · ${site.name}. ` : ""}Pass rate and median score quarter by quarter, and the classes of the chosen quarter.`}
    />
  );
}

function InstructorBody({ id, state }: { id: string; state: InsightFilterState }) {
  const query = useQuery({ ...insightQueries.instructor(id, state.api), placeholderData: keepPreviousData });
  // the network's series with the same filters, for the comparison line
  const network = useQuery({ ...insightQueries.overview(state.api), placeholderData: keepPreviousData });
  // the position on the instructors' funnel, as the instructors page gives it (same filters and comparison)
  const adjust = useAdjustMode();
  const funnel = useQuery({ ...insightQueries.instructors({ ...state.api, adjust }), placeholderData: keepPreviousData });
  return (
    <QueryStatus
      query={query}
      loadingLabel="Loading the instructor…"
      errorTitle="This instructor could not be loaded"
      renderError={(error) =>
        error instanceof ApiError && (error.status === 404 || error.status === 422) ? (
          <>
            <EmptyState title={`No instructor has the id “${id}”`}>The link may be old or mistyped. Go back to the list of instructors.</EmptyState>
          </>
        ) : null
      }
    >
      {(answer) => (
        <>
          <InstructorContent answer={answer} network={network.data ?? null} funnel={funnel.data ?? null} />
          <CalibrationSection instructorId={answer.instructor.id} state={state} />
        </>
      )}
    </QueryStatus>
  );
}

/** The instructor's judgement against the measurement; calibration is by period only, whatever the other filters. */
function CalibrationSection({ instructorId, state }: { instructorId: number; state: InsightFilterState }) {
  const { quarter, from, to } = state.api;
  const query = useQuery(learnerQueries.calibration({ quarter, from, to }));
  return (
    <section aria-labelledby="calibration-heading" className="mt-8 flex flex-col gap-3">
      <h2 id="calibration-heading" className="text-title">
        Judgement against the measurement
      </h2>
      <QueryStatus query={query} loadingLabel="Loading calibration…" errorTitle="Calibration could not be loaded">
        {(answer) => <InstructorCalibration answer={answer} instructorId={instructorId} />}
      </QueryStatus>
    </section>
  );
}

export function trendRows(answer: InstructorDetailAnswer, network: OverviewAnswer | null): TrendRow[] {
  const byQuarter = new Map((network?.series.points ?? []).map((p) => [p.quarter, p.rate]));
  return answer.trend.map((t) => ({ quarter: t.quarter, passRate: t.passRate, medianScore: t.medianScore, network: byQuarter.get(t.quarter) ?? null }));
}

export function InstructorContent({
  answer,
  network,
  funnel,
}: {
  answer: InstructorDetailAnswer;
  network: OverviewAnswer | null;
  funnel: InstructorsAnswer | null;
}) {
  const { instructor } = answer;
  const rows = trendRows(answer, network);
  const quarter = quarterLabel(answer.period.from);
  const current = answer.trend.find((t) => t.quarter === answer.period.to);
  // where the period sits on the instructors' funnel (same filters and comparison), from the instructors page's answer
  const networkRate = funnel?.funnel.networkRate ?? null;
  const position = funnel?.instructors.find((row) => row.id === instructor.id)?.position ?? null;
  return (
    <div className="flex flex-col gap-6">
      {current && (
        <p className="text-lead">
          <strong>{quarter}:</strong>{" "}
          {current.passRate.rate === null ? (
            "no attempts."
          ) : (
            <>
              measured pass rate <RateText rate={current.passRate} stacked={false} /> over {formatCount(current.passRate.n)} attempts; median score{" "}
              {formatScore(current.medianScore)}.
              {position && (
                <>
                  {" "}
                  <PositionText position={position} />{" "}
                  <span className="text-muted">
                    (network {formatPercent(networkRate)}; {adjustNames[funnel!.funnel.adjust].toLowerCase()}).
                  </span>
                </>
              )}
            </>
          )}
        </p>
      )}
      <div className="grid grid-cols-1 gap-4 xl:grid-cols-2">
        <PassRateTrendChart rows={rows} who={instructor.code} />
        <MedianScoreTrendChart rows={rows} who={instructor.code} />
      </div>
      <SafetyNote compact />
      <section aria-labelledby="classes-heading" className="flex flex-col gap-3">
        <h2 id="classes-heading" className="text-title">
          Classes in {quarter}
        </h2>
        <p className="text-small text-muted">Each class's figures cover all of its attempts, whatever the filters.</p>
        <ClassTable classes={answer.classes} caption="Classes" exportFileName={`classes-${instructor.code}-${answer.period.from}`} />
      </section>
    </div>
  );
}
