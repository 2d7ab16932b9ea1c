// One manikin (coordinator, quality lead; an instructor their own site's): whether it is due for service,
// whether its depth readings differ from its peers' in the same classes (with the class-by-class evidence),
// its use per quarter and its equipment log. Reached from the fleet, the attention list and the drift table.
import { useQuery } from "@tanstack/react-query";
import type { ReactNode } from "react";
import { Link, useParams } from "react-router";
import type { ManikinRecord } from "../../../shared/schemas/equipment";
import { driftFlagNames, equipmentEventNames, patientTypeNames } from "../../../shared/vocabulary";
import { quarterLabel, rangeLabel } from "../../../shared/period";
import { ApiError } from "../../api/http";
import { DataTable, type Column } from "../../components/DataTable";
import { FilterBar } from "../../components/FilterBar";
import { BackLink } from "../../components/BackLink";
import { PageHeader } from "../../components/PageHeader";
import { SafetyNote } from "../../components/SafetyNote";
import { EmptyState, ErrorState, LoadingState } from "../../components/States";
import { formatCount, formatDay } from "../../lib/formatting";
import { AttentionList } from "./AttentionList";
import { DriftEvidence, formatMm, formatThresholdMm, intervalMm } from "./DriftSection";
import { equipmentQueries } from "./queries";
import { linkParams, useInsightFilters, type InsightFilterState } from "../insight/useInsightFilters";

export default function ManikinPage() {
  const { assetId = "" } = useParams();
  const { optionsQuery, state } = useInsightFilters([], { ranges: true });
  return (
    <div>
      <BackLink to="/equipment" label="Equipment" />
      <PageHeader
        title={`Manikin ${assetId}`}
        description="Its service state and what is due, its depth readings against the other manikins of its patient type in the same classes, its use and its equipment log."
      />
      {optionsQuery.isPending ? (
        <LoadingState label="Loading the filters…" />
      ) : optionsQuery.isError ? (
        <ErrorState error={optionsQuery.error} onRetry={() => optionsQuery.refetch()} />
      ) : (
        <>
          {state && <FilterBar filters={state.definitions} label="Choose the period" />}
          <ManikinBody assetId={assetId} state={state} />
        </>
      )}
    </div>
  );
}

function ManikinBody({ assetId, state }: { assetId: string; state: InsightFilterState | null }) {
  const query = useQuery(equipmentQueries.manikin(assetId, state?.api ?? {}));
  if (query.isPending) return <LoadingState label={`Loading ${assetId}…`} />;
  if (query.isError) {
    if (query.error instanceof ApiError && query.error.status === 404) {
      return (
        <EmptyState title={`No manikin ${assetId} here`}>
          The link may be old or mistyped, or the manikin belongs to another site.{" "}
          <Link to="/equipment" className="font-semibold text-dusk-700 underline underline-offset-2">
            Go to the fleet
          </Link>
          .
        </EmptyState>
      );
    }
    return <ErrorState error={query.error} title="This manikin could not be loaded" onRetry={() => query.refetch()} />;
  }
  const attemptsHref = (id: string) => `/attempts?${state ? linkParams(state.values, { manikin: id }) : `manikin=${encodeURIComponent(id)}`}`;
  return <ManikinView record={query.data} attemptsHref={attemptsHref} />;
}

export function ManikinView({ record, attemptsHref }: { record: ManikinRecord; attemptsHref: (assetId: string) => string }) {
  const m = record.manikin;
  const retired = m.retiredOn !== null && m.retiredOn <= record.asOf;
  return (
    <div className="flex flex-col gap-8">
      <dl className="grid gap-x-8 gap-y-3 rounded-card border border-line bg-surface p-4 sm:grid-cols-2 lg:grid-cols-3">
        <Fact label="Patient type">{m.patientType ? patientTypeNames[m.patientType] : "Not recorded"}</Fact>
        <Fact label="Site">{m.site?.code ?? "Not recorded"}</Fact>
        <Fact label="In service since">{m.inServiceSince ? formatDay(m.inServiceSince) : "Not recorded"}</Fact>
        <Fact label="Status">{retired ? `Retired on ${formatDay(m.retiredOn)}` : "In service"}</Fact>
        <Fact label="Last service">{m.lastServiceDate ? formatDay(m.lastServiceDate) : "None recorded"}</Fact>
        <Fact label="Compressions since service">
          {formatCount(m.compressionsSinceService)} of {formatCount(record.thresholds.serviceEveryCompressions.value)}
        </Fact>
        <Fact label="Open faults">{formatCount(m.openFaults)}</Fact>
        <Fact label="Depth readings">{record.drift ? driftFlagNames[record.drift.flag] : "No shared class with a peer"}</Fact>
      </dl>

      <section aria-labelledby="manikin-attention" className="flex flex-col gap-3">
        <h2 id="manikin-attention" className="text-title">
          Due for attention
        </h2>
        <p className="text-small text-muted">
          Service every {formatCount(record.thresholds.serviceEveryCompressions.value)} compressions or every{" "}
          {formatCount(record.thresholds.serviceEveryDays.value)} days (network policy), counted to {formatDay(record.asOf)}.
        </p>
        {record.attention.length === 0 ? (
          <p>Nothing is due for {m.assetId}: no service is due and no fault is open.</p>
        ) : (
          <AttentionList items={record.attention} linkClasses={false} />
        )}
      </section>

      <section aria-labelledby="manikin-drift" className="flex flex-col gap-3">
        <h2 id="manikin-drift" className="text-title">
          Depth readings against peers, {rangeLabel(record.period)}
        </h2>
        <DriftSummary record={record} />
        {record.drift && record.drift.differences.length > 0 && <DriftEvidence manikin={record.drift} links={{ attempts: attemptsHref }} />}
        <SafetyNote />
      </section>

      <section aria-labelledby="manikin-use" className="flex flex-col gap-3">
        <h2 id="manikin-use" className="text-title">
          Use by quarter
        </h2>
        <DataTable
          caption={`Use of ${m.assetId} by quarter`}
          columns={usageColumns}
          rows={m.usage}
          rowKey={(u) => u.quarter}
          exportFileName={`manikin-use-${m.assetId}`}
          emptyMessage="No quarter in this window."
        />
        <Link to={attemptsHref(m.assetId)} className="text-small font-semibold text-dusk-700 underline underline-offset-2 hover:text-dusk-900">
          Attempts on {m.assetId}
        </Link>
      </section>

      <section aria-labelledby="manikin-log" className="flex flex-col gap-3">
        <h2 id="manikin-log" className="text-title">
          Equipment log
        </h2>
        <p className="text-small text-muted">
          {record.logTotal === 0
            ? "No equipment log line names this manikin yet."
            : record.logTotal > record.log.length
              ? `The latest ${formatCount(record.log.length)} of ${formatCount(record.logTotal)} lines, newest first.`
              : `${formatCount(record.logTotal)} line${record.logTotal === 1 ? "" : "s"}, newest first.`}
        </p>
        {record.log.length > 0 && (
          <DataTable
            caption={`Equipment log of ${m.assetId}`}
            columns={logColumns}
            rows={record.log.map((line, index) => ({ ...line, index }))}
            rowKey={(line) => line.index}
            exportFileName={`equipment-log-${m.assetId}`}
          />
        )}
      </section>
    </div>
  );
}

function Fact({ label, children }: { label: string; children: ReactNode }) {
  return (
    <div>
      <dt className="text-small text-muted">{label}</dt>
      <dd className="font-semibold text-ink">{children}</dd>
    </div>
  );
}

function DriftSummary({ record }: { record: ManikinRecord }) {
  const d = record.drift;
  const rule = `A manikin is flagged when it shared at least ${record.rule.minClasses} classes with peers of its patient type, its mean depth differs from theirs by at least ${formatThresholdMm(record.rule.minOffsetMm)} and the 95 % interval excludes zero (network settings).`;
  if (!d) {
    return (
      <p>
        {record.manikin.assetId} shared no class with another manikin of its patient type in this period, so its readings cannot be compared. Choose a longer
        period. {rule}
      </p>
    );
  }
  const direction = (d.offset_mm ?? 0) > 0 ? "deeper" : "shallower";
  return (
    <div className="flex flex-col gap-2">
      <p>
        {d.flag === "check" ? (
          <strong className="text-too-high-text">
            Check the depth sensor: over {d.classes} shared classes, {record.manikin.assetId} reads {formatMm(d.offset_mm)} ({direction}) against its peers, 95
            % interval {intervalMm(d.ci95)}.
          </strong>
        ) : d.flag === "ok" ? (
          <>
            Over {d.classes} shared classes, {record.manikin.assetId} reads {formatMm(d.offset_mm)} against its peers (95 % interval {intervalMm(d.ci95)}): in
            line with them.
          </>
        ) : (
          <>
            Only {d.classes} shared class{d.classes === 1 ? "" : "es"} in this period: too few to judge. Choose a longer period.
          </>
        )}
      </p>
      <p className="text-small text-muted">
        {rule}
        {d.flag === "check"
          ? " Learners on this manikin may have been judged too deep or too shallow because of the device; check it before drawing conclusions about them or their instructor."
          : ""}
      </p>
    </div>
  );
}

type UsageRow = ManikinRecord["manikin"]["usage"][number];

const hidden = (
  <span className="text-small text-muted italic" title="Hidden to protect colleagues: too few attempts or instructors other than you">
    Hidden
  </span>
);

const usageColumns: Column<UsageRow>[] = [
  { key: "quarter", header: "Quarter", value: (u) => u.quarter, render: (u) => quarterLabel(u.quarter), primary: true },
  { key: "attempts", header: "Attempts", value: (u) => u.attempts, render: (u) => (u.attempts === null ? hidden : formatCount(u.attempts)), align: "right" },
  {
    key: "compressions",
    header: "Compressions",
    value: (u) => u.compressions,
    render: (u) => (u.compressions === null ? hidden : formatCount(u.compressions)),
    align: "right",
  },
];

type LogRow = ManikinRecord["log"][number] & { index: number };

const logColumns: Column<LogRow>[] = [
  { key: "date", header: "Date", value: (l) => l.date, render: (l) => formatDay(l.date), primary: true },
  { key: "event", header: "What", value: (l) => equipmentEventNames[l.event] },
  { key: "quantity", header: "Quantity", value: (l) => l.quantity, align: "right" },
  { key: "resolved", header: "Fault resolved", value: (l) => (l.event === "fault" ? (l.resolved ? "Yes" : "No") : "") },
  { key: "note", header: "Note", value: (l) => l.note, wrap: true },
];
