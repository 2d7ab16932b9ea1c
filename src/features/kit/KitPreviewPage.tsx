// Development-only gallery of the UI kit (route /kit, present in `vite` dev builds only). It shows each
// component with invented data, so pages can be built from it and the look checked in one place.
import * as Plot from "@observablehq/plot";
import { courseTypes } from "../../../shared/domain";
import { ActiveBadge } from "../../components/ActiveBadge";
import { Button } from "../../components/Button";
import { Chart, type ChartSize } from "../../components/Chart";
import { DataTable, type Column } from "../../components/DataTable";
import { Input, Select } from "../../components/Field";
import { FilterBar, feedbackFilter, useFilterValues, type FilterDefinition } from "../../components/FilterBar";
import { Notice } from "../../components/Notice";
import { PageHeader } from "../../components/PageHeader";
import { SafetyNote } from "../../components/SafetyNote";
import { StatCard } from "../../components/StatCard";
import { EmptyState, ErrorState, LoadingState } from "../../components/States";
import { TargetBadge, TargetLegend, targetStatusLabels, type TargetStatus } from "../../components/TargetBadge";
import { ApiError } from "../../api/http";
import { targetStatusColorScale, targetStatusRotate, targetStatusSymbolScale } from "../../lib/chartScales";
import { useLengthUnit } from "../../lib/useLengthUnit";
import { quarterLabel } from "../../../shared/period";

const filters: FilterDefinition[] = [
  { key: "quarter", options: ["2025-Q1", "2025-Q2", "2025-Q3"].map((q) => ({ value: q, label: quarterLabel(q) })), allLabel: null },
  {
    key: "site",
    options: [
      { value: "NORTH-1", label: "Northfield Community Hall" },
      { value: "RIVER-2", label: "Riverside Sports Centre" },
    ],
  },
  { key: "patientType", options: courseTypes.map((t) => ({ value: t, label: t })) },
  feedbackFilter,
];

interface QuarterShare {
  quarter: string;
  share: number;
}
const shares: QuarterShare[] = [
  { quarter: "2024 Q4", share: 0.55 },
  { quarter: "2025 Q1", share: 0.58 },
  { quarter: "2025 Q2", share: 0.64 },
  { quarter: "2025 Q3", share: 0.71 },
];
const shareColumns: Column<QuarterShare>[] = [
  { key: "quarter", header: "Quarter", value: (r) => r.quarter },
  { key: "share", header: "Compressions in target", value: (r) => Math.round(r.share * 100), render: (r) => `${Math.round(r.share * 100)} %`, align: "right" },
];
const sharePlot = (data: readonly QuarterShare[]) => ({
  y: { domain: [0, 1], tickFormat: "%", label: "Compressions in target" },
  x: { label: null },
  marks: [Plot.barY(data as QuarterShare[], { x: "quarter", y: "share", fill: "#3F3A8C" }), Plot.ruleY([0])],
});

interface Attempt {
  code: string;
  depthMm: number;
  rate: number;
  status: TargetStatus;
}
const attempts: Attempt[] = [
  { code: "L-0413", depthMm: 44, rate: 104, status: "too_low" },
  { code: "L-0419", depthMm: 53, rate: 112, status: "on_target" },
  { code: "L-0422", depthMm: 57, rate: 118, status: "on_target" },
  { code: "L-0431", depthMm: 64, rate: 109, status: "too_high" },
  { code: "L-0436", depthMm: 48, rate: 121, status: "too_low" },
  { code: "L-0440", depthMm: 55, rate: 101, status: "on_target" },
];
const attemptPlot = (data: readonly Attempt[], { width }: ChartSize) => ({
  height: Math.min(320, Math.max(220, width * 0.45)),
  x: { label: "Compression rate (per min)", domain: [90, 130] },
  y: { label: "Mean depth (mm)", domain: [35, 70] },
  color: targetStatusColorScale,
  symbol: targetStatusSymbolScale,
  marks: [
    Plot.rectY([{ x1: 100, x2: 120, y1: 50, y2: 60 }], { x1: "x1", x2: "x2", y1: "y1", y2: "y2", fill: "#E3F4EC" }),
    Plot.dot(data as Attempt[], {
      x: "rate",
      y: "depthMm",
      fill: "status",
      symbol: "status",
      rotate: (d: Attempt) => targetStatusRotate(d.status),
      r: 6,
      tip: true,
      title: (d: Attempt) => `${d.code}: ${targetStatusLabels[d.status]}`,
    }),
  ],
});

export default function KitPreviewPage() {
  const values = useFilterValues(filters);
  const { unit, formatLength } = useLengthUnit();
  const attemptColumns: Column<Attempt>[] = [
    { key: "code", header: "Learner code", value: (a) => a.code },
    { key: "depth", header: `Mean depth (${unit})`, value: (a) => a.depthMm, render: (a) => formatLength(a.depthMm), align: "right" },
    { key: "rate", header: "Rate (per min)", value: (a) => a.rate, align: "right" },
    { key: "status", header: "Depth", value: (a) => targetStatusLabels[a.status], render: (a) => <TargetBadge status={a.status} /> },
  ];

  return (
    <div className="flex flex-col gap-10">
      <PageHeader title="UI kit" description="Every shared component with invented data." actions={<Button variant="secondary">Page action</Button>} />

      <section className="flex flex-col gap-3">
        <h2 className="text-title">FilterBar</h2>
        <FilterBar filters={filters} label="Example filters" />
        <pre className="rounded-control bg-surface p-3 text-caption whitespace-pre-wrap break-all">{JSON.stringify(values)}</pre>
      </section>

      <section className="flex flex-col gap-3">
        <h2 className="text-title">StatCard and TargetBadge</h2>
        <div className="grid gap-4 sm:grid-cols-2 xl:grid-cols-4">
          <StatCard
            label="Attempts passed"
            value="71"
            unit="%"
            interval={{ low: "65 %", high: "76 %" }}
            change={{ value: 7, text: "+7 points", comparedWith: "since Q2", better: "up" }}
            footnote="n = 263 attempts"
          />
          <StatCard
            label="Mean depth"
            value={formatLength(52.4)}
            change={{ value: -1.1, text: formatLength(1.1) + " shallower", comparedWith: "since Q2" }}
            status="on_target"
          />
          <StatCard label="Mean rate" value="124" unit="per min" status="too_high" />
          <StatCard label="Classes this quarter" value="38" change={{ value: 0, text: "" }} />
        </div>
        <div className="flex flex-wrap gap-2">
          <TargetBadge status="on_target" />
          <TargetBadge status="too_low" />
          <TargetBadge status="too_high" />
          <ActiveBadge active />
          <ActiveBadge active={false} />
        </div>
      </section>

      <section className="flex flex-col gap-3">
        <h2 className="text-title">Chart</h2>
        <SafetyNote />
        <div className="grid gap-4 xl:grid-cols-2">
          <Chart
            title="Compressions in the target range"
            description="Share of all compressions in the target depth and rate range, per quarter: it rose from 55 % to 71 % over the year."
            data={shares}
            columns={shareColumns}
            rowKey={(r) => r.quarter}
            plot={sharePlot}
            exportFileName="target-share"
          />
          <Chart
            title="Depth and rate per attempt"
            description="Each mark is one attempt; the shaded box is the target range. Two attempts were too shallow, one too deep."
            data={attempts}
            columns={attemptColumns}
            rowKey={(a) => a.code}
            plot={attemptPlot}
            legend={<TargetLegend />}
          />
        </div>
      </section>

      <section className="flex flex-col gap-3">
        <h2 className="text-title">DataTable</h2>
        <DataTable
          caption="Attempts"
          columns={attemptColumns}
          rows={attempts}
          rowKey={(a) => a.code}
          exportFileName="attempts"
          initialSort={{ key: "depth", direction: "asc" }}
        />
      </section>

      <section className="grid gap-4 lg:grid-cols-2">
        <div className="flex flex-col gap-3">
          <h2 className="text-title">Fields and buttons</h2>
          <Input label="Site name" hint="As it should appear in reports." defaultValue="Northfield" />
          <Input label="Site code" error="Use 1–32 letters, digits, '.', '_' or '-'" defaultValue="North field!" />
          <Select label="Role" placeholder="Choose a role…" options={[{ value: "a", label: "Quality lead" }]} />
          <div className="flex flex-wrap gap-2">
            <Button>Primary</Button>
            <Button variant="secondary">Secondary</Button>
            <Button variant="quiet">Quiet</Button>
            <Button variant="danger">Danger</Button>
            <Button busy>Saving…</Button>
          </div>
        </div>
        <div className="flex flex-col gap-3">
          <h2 className="text-title">States and notices</h2>
          <LoadingState label="Loading attempts…" />
          <EmptyState
            title="No attempts this quarter"
            action={
              <Button variant="secondary" size="sm">
                Go to imports
              </Button>
            }
          >
            Import a class log and its manikin files to see attempts here.
          </EmptyState>
          <ErrorState error={new ApiError(500, "internal", "Something went wrong on the server.")} onRetry={() => {}} />
          <Notice tone="success">Saved.</Notice>
          <Notice tone="info">Figures for Q3 are provisional until all imports are in.</Notice>
          <Notice tone="error">The file could not be read.</Notice>
          <SafetyNote compact />
        </div>
      </section>
    </div>
  );
}
