// My standing (instructors): my medians and pass rate beside the network's, where I sit among instructors
// (others anonymous), my point on the funnel, my errors against the network's and my classes.
import { keepPreviousData, useQuery } from "@tanstack/react-query";
import type { StandingAnswer } from "../../../../shared/schemas/insight";
import type { AttemptError } from "../../../../shared/scoring/scoreAttempt";
import { PageHeader } from "../../../components/PageHeader";
import { SafetyNote } from "../../../components/SafetyNote";
import { ClassTable } from "../ClassTable";
import { TechniqueErrorProfileChart } from "../charts/TechniqueErrorProfileChart";
import { FunnelChart, type FunnelUnit } from "../charts/FunnelChart";
import { SpreadChart } from "../charts/SpreadChart";
import { formatCount, funnelPositionText } from "../format";
import { rangeLabel } from "../../../../shared/period";
import { useSearchParams } from "react-router";
import { AdjustChoice, dispersionSentence } from "../AdjustChoice";
import { InsightFilters } from "../InsightFilters";
import { NoDataForFilters } from "../NoDataForFilters";
import { QueryStatus } from "../QueryStatus";
import { RateText } from "../RateText";
import { TechniqueErrorAttemptLinks } from "./TechniqueErrorAttemptLinks";
import { StandingMetrics } from "./StandingMetrics";
import { Suppressed } from "../Suppressed";
import { standingChoices, standingFilters, standingQuery } from "../pageRequests";
import { linkParams, type InsightFilterState } from "../useInsightFilters";

export default function MyStandingPage() {
  return (
    <div>
      <PageHeader
        title="My standing"
        description="How your learners' attempts compare with the whole network. Other instructors appear only as anonymous points and network figures."
      />
      <InsightFilters optional={standingFilters} ranges={standingChoices.ranges} label="Filter my standing">
        {(state) => <StandingBody state={state} />}
      </InsightFilters>
    </div>
  );
}

function StandingBody({ state }: { state: InsightFilterState }) {
  const [params] = useSearchParams();
  const query = useQuery({ ...standingQuery(state.api, params), placeholderData: keepPreviousData });
  // the attempt list keeps an instructor to their own attempts, so the error and the filters are enough
  const attemptsHref = (error: AttemptError) => `/attempts?${linkParams(state.values, { error })}`;
  return (
    <QueryStatus query={query} loadingLabel="Loading your standing…" errorTitle="Your standing could not be loaded">
      {(answer) =>
        answer.attempts === 0 ? (
          <NoDataForFilters state={state} what="attempts in your classes" />
        ) : (
          <StandingContent answer={answer} attemptsHref={attemptsHref} />
        )
      }
    </QueryStatus>
  );
}

export function StandingContent({ answer, attemptsHref }: { answer: StandingAnswer; attemptsHref: (error: AttemptError) => string }) {
  const min = answer.suppressionMinCount;
  const me = answer.funnel.me;
  const adjusted = answer.funnel.adjust === "case-mix";
  const units: FunnelUnit[] =
    me.n && me.successes !== null && me.adjustedRate !== null && me.effectiveAttempts !== null
      ? [
          {
            key: "me",
            label: "You",
            n: me.effectiveAttempts,
            attempts: me.n,
            successes: me.successes,
            rate: me.adjustedRate,
            z: me.z,
            position: me.position,
            isMe: true,
          },
        ]
      : [];
  const networkHidden = answer.errorProfile.networkSuppressed;
  return (
    <div className="flex flex-col gap-8">
      <section aria-labelledby="me-heading" className="flex flex-col gap-3">
        <h2 id="me-heading" className="text-title">
          {answer.me.code} · {answer.me.name}, {rangeLabel(answer.period)}
        </h2>
        <p>
          {formatCount(answer.attempts)} attempts in your classes. Your measured pass rate: <RateText rate={me} minCount={min} stacked={false} />.{" "}
          {me.position && <span className="font-semibold">{funnelPositionText(me.position)} for a group of this size.</span>}
        </p>
        <AdjustChoice />
        <StandingMetrics answer={answer} />
        <SafetyNote compact />
      </section>

      <section aria-labelledby="spread-heading" className="flex flex-col gap-3">
        <h2 id="spread-heading" className="text-title">
          Compared with other instructors
        </h2>
        {networkHidden ? (
          <p className="rounded-card border border-line bg-surface p-4">
            The network's figures are hidden for these filters: <Suppressed minCount={min} />. Widen the filters to compare.
          </p>
        ) : (
          <div className="grid grid-cols-1 gap-4 xl:grid-cols-2">
            <SpreadChart points={answer.spread.points} minAttempts={answer.spread.minAttempts} instructorsLeftOut={answer.spread.instructorsLeftOut} />
            <div className="flex flex-col gap-2">
              <FunnelChart
                title="Your pass rate on the network funnel"
                units={units}
                curve={answer.funnel.curve}
                networkRate={answer.funnel.networkRate}
                scale={answer.funnel.scale}
                adjusted={adjusted}
                subject="your attempts"
                unitHeader="Who"
                exportFileName="my-funnel-position"
              />
              <p className="text-small text-muted">
                The funnel narrows as attempts add up: with few attempts a rate far from the network's can be chance. A point outside the 95 % limits is worth a
                look; outside the 99.8 % limits it is very unlikely to be chance. {dispersionSentence(answer.funnel)}
              </p>
            </div>
          </div>
        )}
      </section>

      <section aria-labelledby="errors-heading" className="flex flex-col gap-3">
        <h2 id="errors-heading" className="text-title">
          Your errors
        </h2>
        <TechniqueErrorProfileChart rows={answer.errorProfile.rows} networkSuppressed={networkHidden} minCount={min} attemptsHref={attemptsHref} />
        <TechniqueErrorAttemptLinks rows={answer.errorProfile.rows} attemptsHref={attemptsHref} />
      </section>

      <section aria-labelledby="classes-heading" className="flex flex-col gap-3">
        <h2 id="classes-heading" className="text-title">
          Your classes in {rangeLabel(answer.period)}
        </h2>
        <p className="text-small text-muted">
          Open a class to see each learner's attempts. Recorded completions are what you entered in the class log; each class's figures cover all of its
          attempts, whatever the filters.
        </p>
        <ClassTable
          classes={answer.classes}
          caption="Your classes"
          exportFileName={`my-classes-${answer.period.from === answer.period.to ? answer.period.from : `${answer.period.from}-to-${answer.period.to}`}`}
        />
      </section>
    </div>
  );
}
