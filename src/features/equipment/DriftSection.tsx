// Depth readings against peers: each manikin compared with the other manikins of its patient type in the same
// classes, the manikins to check first, and for each of those the paired differences over time.
import * as Plot from "@observablehq/plot";
import { useQuery } from "@tanstack/react-query";
import { Link } from "react-router";
import type { DriftAnswer, ManikinDriftRow } from "../../../shared/schemas/equipment";
import { driftFlagNames, driftOffsetName, patientTypeNames } from "../../../shared/vocabulary";
import { rangeLabel } from "../../../shared/period";
import { Chart, type ChartSize } from "../../components/Chart";
import { DataTable, type Column } from "../../components/DataTable";
import { formatDay } from "../../lib/formatting";
import { formatFixed } from "../insight/format";
import { ink } from "../insight/chartStyle";
import { Y_TITLE_MARGIN_TOP } from "../insight/charts/axisSpace";
import { QueryStatus } from "../insight/QueryStatus";
import type { ApiFilters } from "../insight/queries";
import { equipmentQueries } from "./queries";

export function formatMm(value: number | null): string {
  if (value === null) return "–";
  return `${value > 0 ? "+" : value < 0 ? "−" : ""}${formatFixed(Math.abs(value), 1)} mm`;
}

export function intervalMm(ci: [number, number] | null): string {
  return ci ? `${formatMm(ci[0])} to ${formatMm(ci[1])}` : "–";
}

const columns = (manikinHref: ((assetId: string) => string) | null): Column<ManikinDriftRow>[] => [
  {
    key: "manikin",
    header: "Asset id",
    value: (m) => m.manikin,
    primary: true,
    render: (m) => <ManikinLink assetId={m.manikin} href={manikinHref?.(m.manikin) ?? null} />,
  },
  { key: "profile", header: "Patient type", value: (m) => patientTypeNames[m.profile] },
  { key: "site", header: "Site", value: (m) => m.site },
  { key: "classes", header: "Shared classes", value: (m) => m.classes, align: "right" },
  { key: "offset", header: driftOffsetName, value: (m) => m.offset_mm, render: (m) => formatMm(m.offset_mm), align: "right" },
  { key: "interval", header: "95 % interval", value: (m) => intervalMm(m.ci95), align: "right" },
  {
    key: "flag",
    header: "Judgement",
    value: (m) => driftFlagNames[m.flag],
    render: (m) => (m.flag === "check" ? <strong className="text-too-high-text">{driftFlagNames[m.flag]}</strong> : driftFlagNames[m.flag]),
  },
];

type Difference = ManikinDriftRow["differences"][number];

function differencesPlot(offset: number | null) {
  return (data: readonly Difference[], { width }: ChartSize): Plot.PlotOptions => ({
    height: 240,
    marginTop: Y_TITLE_MARGIN_TOP,
    marginLeft: 56,
    // two-line date ticks ("18" over "Oct")
    marginBottom: 36,
    // insets keep the dots of the first, last, highest and lowest class inside the frame, clear of the axes
    x: { type: "utc", label: null, ticks: width < 560 ? 4 : 8, inset: 8 },
    y: { label: "Difference (mm)", grid: true, inset: 8 },
    marks: [
      Plot.ruleY([0], { stroke: ink.text }),
      ...(offset === null ? [] : [Plot.ruleY([offset], { stroke: ink.main, strokeDasharray: "4 3" })]),
      Plot.dot(data as Difference[], {
        x: (d: Difference) => new Date(`${d.date}T00:00:00Z`),
        y: "difference_mm",
        fill: ink.main,
        r: 3.5,
        title: (d: Difference) => `${formatDay(d.date)}: ${formatMm(d.difference_mm)}`,
      }),
    ],
  });
}

const differenceColumns: Column<Difference>[] = [
  { key: "date", header: "Class date", value: (d) => d.date, render: (d) => formatDay(d.date) },
  { key: "classId", header: "Class", value: (d) => d.classId ?? "" },
  { key: "difference", header: "Difference", value: (d) => d.difference_mm, render: (d) => formatMm(d.difference_mm), align: "right" },
  { key: "attempts", header: "Attempts on it", value: (d) => d.attempts, align: "right" },
  { key: "peers", header: "Attempts on peers", value: (d) => d.peer_attempts, align: "right" },
];

/** The paired differences behind one manikin's offset, class by class, with a link to its attempts. */
export function DriftEvidence({ manikin, links }: { manikin: ManikinDriftRow; links: DriftLinks }) {
  const description = `${manikin.manikin}'s mean depth minus its peers' in each of ${manikin.classes} shared classes; dots are classes, the dashed line is the offset ${formatMm(manikin.offset_mm)} (95 % interval ${intervalMm(manikin.ci95)})${manikin.flagged_in_round === null ? "" : `, flagged in comparison round ${manikin.flagged_in_round}`}.`;
  return (
    <div className="flex flex-col gap-2">
      <Chart
        title={`${manikin.manikin}: depth against its peers, class by class`}
        description={description}
        data={manikin.differences}
        columns={differenceColumns}
        rowKey={(d) => `${d.date}|${d.classId ?? ""}|${d.difference_mm}`}
        plot={differencesPlot(manikin.offset_mm)}
        exportFileName={`depth-against-peers-${manikin.manikin}`}
      />
      <p className="flex flex-wrap gap-x-6 gap-y-1">
        {links.manikin && (
          <Link to={links.manikin(manikin.manikin)} className="text-small font-semibold text-dusk-700 underline underline-offset-2 hover:text-dusk-900">
            Open {manikin.manikin}’s record
          </Link>
        )}
        <Link to={links.attempts(manikin.manikin)} className="text-small font-semibold text-dusk-700 underline underline-offset-2 hover:text-dusk-900">
          Attempts on {manikin.manikin}
        </Link>
      </p>
    </div>
  );
}

export interface DriftLinks {
  attempts: (assetId: string) => string;
  /** A manikin's own page; left out on that page itself. */
  manikin?: (assetId: string) => string;
}

function ManikinLink({ assetId, href }: { assetId: string; href: string | null }) {
  if (!href) return <>{assetId}</>;
  return (
    <Link to={href} className="font-semibold text-dusk-700 underline underline-offset-2 hover:text-dusk-900">
      {assetId}
    </Link>
  );
}

/** A threshold in millimetres as set: whole numbers without decimals. */
export function formatThresholdMm(value: number): string {
  return `${formatFixed(value, Number.isInteger(value) ? 0 : 1)} mm`;
}

export function DriftView({ answer, links }: { answer: DriftAnswer; links: DriftLinks }) {
  const flagged = answer.manikins.filter((m) => m.flag === "check");
  return (
    <div className="flex flex-col gap-4">
      <p className="text-small text-muted">
        For each class where a manikin and at least one other manikin of its patient type were used, the difference of their mean depths (mm). A manikin is
        flagged when it shared at least {answer.rule.minClasses} classes, its mean difference is at least {formatThresholdMm(answer.rule.minOffsetMm)} either
        way and the 95 % interval (mean ± 1.96 standard errors, Bland and Altman 1986) excludes zero. A drifting manikin pulls its peers the other way, so
        manikins are flagged one at a time and the rest compared again without it. {rangeLabel(answer.period)}.
      </p>
      {flagged.length === 0 ? (
        <p>No manikin reads clearly deeper or shallower than its peers in this period.</p>
      ) : (
        <p>
          <strong>
            {flagged.length === 1 ? (
              <>
                <ManikinLink assetId={flagged[0].manikin} href={links.manikin?.(flagged[0].manikin) ?? null} /> reads {formatMm(flagged[0].offset_mm)} against
                its peers
              </>
            ) : (
              `${flagged.length} manikins differ from their peers`
            )}
          </strong>
          : check the depth sensor before blaming learners, instructors or the site.
        </p>
      )}
      {flagged.map((m) => (
        <DriftEvidence key={m.manikin} manikin={m} links={links} />
      ))}
      <DataTable
        caption="Manikins against their peers"
        columns={columns(links.manikin ?? null)}
        rows={answer.manikins}
        rowKey={(m) => `${m.manikin}|${m.profile}`}
        exportFileName="manikin-depth-against-peers"
        emptyMessage="No manikin shared a class with another manikin of its patient type."
        initialSort={{ key: "flag", direction: "asc" }}
      />
    </div>
  );
}

export function DriftSection({ api, links }: { api: ApiFilters; links: DriftLinks }) {
  const query = useQuery(equipmentQueries.drift(api));
  return (
    <QueryStatus query={query} loadingLabel="Comparing manikins with their peers…" errorTitle="The manikin comparison could not be loaded">
      {(answer) => <DriftView answer={answer} links={links} />}
    </QueryStatus>
  );
}
