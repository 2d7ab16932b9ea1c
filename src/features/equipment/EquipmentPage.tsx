// Equipment (coordinator, quality lead; instructors see their own site): the manikin fleet and its use,
// consumables per 100 learners, and what is due for attention, judged against the network's thresholds.
import { useQuery } from "@tanstack/react-query";
import { Link } from "react-router";
import type { EquipmentAnswer } from "../../../shared/schemas/equipment";
import { FilterBar } from "../../components/FilterBar";
import { PageHeader } from "../../components/PageHeader";
import { EmptyState, ErrorState, LoadingState } from "../../components/States";
import { formatCount, formatDay } from "../../lib/formatting";
import { useCan } from "../auth/useCan";
import { AttentionList } from "./AttentionList";
import { ConsumablesCharts } from "./ConsumablesChart";
import { DriftSection } from "./DriftSection";
import { FleetTable } from "./FleetTable";
import { manikinPath } from "./links";
import { equipmentQueries } from "./queries";
import { UsageChart } from "./UsageChart";
import { linkParams, useInsightFilters, type InsightFilterState, type OptionalFilter } from "../insight/useInsightFilters";
import { rangeLabel } from "../../../shared/period";

// an instructor's view is their own site already: no site filter
const filterKeys: readonly OptionalFilter[] = ["site", "patientType", "manikin"];
const ownSiteFilterKeys: readonly OptionalFilter[] = ["patientType", "manikin"];

export default function EquipmentPage() {
  // "own" reach: an instructor sees their own site's manikins and their own classes
  const ownSite = !useCan("readEquipment", "any");
  const { optionsQuery: options, state } = useInsightFilters(ownSite ? ownSiteFilterKeys : filterKeys, { ranges: true });
  return (
    <div>
      <PageHeader
        title="Equipment"
        description={
          ownSite
            ? "The manikins of your site: how much they are used, when they were last serviced, what is due, the consumables your site used per 100 learners, and whether a manikin's depth readings differ from its peers'."
            : "The manikin fleet: how much each manikin is used, when it was last serviced, what is due, consumables per 100 learners at each site, and whether a manikin's depth readings differ from its peers'."
        }
      />
      {options.isPending ? (
        <LoadingState label="Loading the filters…" />
      ) : options.isError ? (
        <ErrorState error={options.error} onRetry={() => options.refetch()} />
      ) : (
        <Equipment state={state} ownSite={ownSite} />
      )}
    </div>
  );
}

/** The fleet is shown even before any attempt (and so any quarter) exists: then without filters. */
function Equipment({ state, ownSite }: { state: InsightFilterState | null; ownSite: boolean }) {
  const report = useQuery(equipmentQueries.report(state?.api ?? {}));
  return (
    <>
      {state && <FilterBar filters={state.definitions} label="Filter the equipment view" />}
      {report.isPending ? (
        <LoadingState label="Loading the fleet…" />
      ) : report.isError ? (
        <ErrorState error={report.error} onRetry={() => report.refetch()} />
      ) : (
        <EquipmentView
          answer={report.data}
          ownSite={ownSite}
          manikinHref={(assetId) => manikinPath(assetId, state ? linkParams(state.values, { manikin: null }) : "")}
        />
      )}
      {state && (
        <section aria-labelledby="drift-heading" className="mt-8 flex flex-col gap-3">
          <h2 id="drift-heading" className="text-title">
            Depth readings against peers
          </h2>
          <DriftSection
            api={state.api}
            links={{
              attempts: (assetId) => `/attempts?${linkParams(state.values, { manikin: assetId })}`,
              manikin: (assetId) => manikinPath(assetId, linkParams(state.values, { manikin: null })),
            }}
          />
        </section>
      )}
    </>
  );
}

function Thresholds({ answer, ownSite }: { answer: EquipmentAnswer; ownSite: boolean }) {
  const t = answer.thresholds;
  const changed = [t.serviceEveryCompressions, t.serviceEveryDays, t.minMouthpieceCleansPerLearner].some((x) => !x.projectDefault);
  const was = (x: { projectDefault: boolean; defaultValue: number }) => (x.projectDefault ? "" : ` (project default ${formatCount(x.defaultValue)})`);
  return (
    <div className="rounded-card border border-dusk-200 bg-dusk-50 p-4 text-small text-ink">
      <p>
        <strong>Thresholds:</strong> service every {formatCount(t.serviceEveryCompressions.value)} compressions{was(t.serviceEveryCompressions)} or every{" "}
        {t.serviceEveryDays.value} days{was(t.serviceEveryDays)}; at least {t.minMouthpieceCleansPerLearner.value} mouthpiece clean
        {t.minMouthpieceCleansPerLearner.value === 1 ? "" : "s"} per learner{was(t.minMouthpieceCleansPerLearner)}.
      </p>
      <p className="mt-1 text-muted">
        {changed
          ? "The network has changed some of these from the project defaults. "
          : "These are project defaults: network policy, not a guideline or a manufacturer’s figure. "}
        They are set in{" "}
        {ownSite ? (
          "the scoring policy settings by the regional coordinator"
        ) : (
          <Link to="/settings" className="font-semibold text-dusk-700 underline underline-offset-2 hover:text-dusk-900">
            Settings
          </Link>
        )}
        . Days are counted to {formatDay(answer.asOf)}.
      </p>
    </div>
  );
}

function EquipmentView({ answer, ownSite, manikinHref }: { answer: EquipmentAnswer; ownSite: boolean; manikinHref: (assetId: string) => string }) {
  const retired = answer.fleet.filter((m) => m.retiredOn !== null && m.retiredOn <= answer.asOf).length;
  return (
    <div className="flex flex-col gap-8">
      <section aria-labelledby="attention-heading" className="flex flex-col gap-3">
        <h2 id="attention-heading" className="text-title">
          Due for attention
        </h2>
        <Thresholds answer={answer} ownSite={ownSite} />
        <p className="text-small text-muted">
          Services and faults are as of {formatDay(answer.asOf)}; mouthpiece cleans cover the classes of {rangeLabel(answer.period)}.
        </p>
        <AttentionList items={answer.attention} linkClasses manikinHref={manikinHref} />
      </section>

      <section aria-labelledby="fleet-heading" className="flex flex-col gap-3">
        <h2 id="fleet-heading" className="text-title">
          Manikin fleet
        </h2>
        {answer.fleet.length === 0 ? (
          <EmptyState title="No manikins match these filters">Manikins appear here once an equipment log or an attempt names them.</EmptyState>
        ) : (
          <>
            <p className="text-small text-muted">
              {answer.fleet.length} manikins{retired > 0 ? `, ${retired} of them retired` : ""}. Attempts and compressions are for {rangeLabel(answer.period)};
              compressions since service count every attempt since the last service (or since the manikin came into use).
            </p>
            <FleetTable answer={answer} manikinHref={manikinHref} />
            <UsageChart fleet={answer.fleet} />
          </>
        )}
      </section>

      <section aria-labelledby="consumables-heading" className="flex flex-col gap-3">
        <h2 id="consumables-heading" className="text-title">
          Consumables
        </h2>
        <p className="text-small text-muted">
          From the class logs, per 100 learners at each site. The equipment log records the same work per manikin, so it is not added again.
        </p>
        <ConsumablesCharts rows={answer.consumables} period={rangeLabel(answer.period)} />
      </section>
    </div>
  );
}
