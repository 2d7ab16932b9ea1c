// The compressions of one attempt, each against its target: depth (band shaded, points outside marked by
// shape), rate from each interval (100–120 band by default), recoil (release depth against the tolerance), and
// pauses as shaded spans with their length. Each chart has its table; the time axes line up.
import * as Plot from "@observablehq/plot";
import { useCallback, useId, useMemo } from "react";
import type { Band } from "../../../shared/scoring/policy";
import { formatLength, fromMm, type LengthUnit } from "../../../shared/units";
import { Chart, type ChartSize } from "../../components/Chart";
import { DataTable, type Column } from "../../components/DataTable";
import { TargetMark, type TargetStatus } from "../../components/TargetBadge";
import { status as statusColours } from "../../styles/palette";
import { X_TITLE_BELOW, X_TITLE_MARGIN_BOTTOM, Y_TITLE_MARGIN_TOP } from "../insight/charts/axisSpace";
import type { CompressionPoint, CompressionSeries, DepthClass, PauseSpan, RateClass } from "./compressionSeries";

export const depthClassLabels: Record<DepthClass, string> = { on_target: "On target", too_shallow: "Too shallow", too_deep: "Too deep" };
export const rateClassLabels: Record<RateClass, string> = { on_target: "On target", too_slow: "Too slow", too_fast: "Too fast" };

const depthStatus: Record<DepthClass, TargetStatus> = { too_shallow: "too_low", on_target: "on_target", too_deep: "too_high" };
const rateStatus: Record<RateClass, TargetStatus> = { too_slow: "too_low", on_target: "on_target", too_fast: "too_high" };

const statusDomain: TargetStatus[] = ["too_low", "on_target", "too_high"];
const colour = {
  type: "categorical" as const,
  domain: statusDomain,
  range: [statusColours.tooLow.mark, statusColours.onTarget.mark, statusColours.tooHigh.mark],
};
const symbol = { domain: statusDomain, range: ["triangle", "circle", "triangle"] };
const rotateFor = (s: TargetStatus) => (s === "too_low" ? 180 : 0);

const bandFill = statusColours.onTarget.tint;
const bandEdge = statusColours.onTarget.mark;
const pauseFill = "#E4E1EC";
const ink = "#1C1B2E";

export interface CompressionChartsProps {
  series: CompressionSeries;
  band: Band;
  unit: LengthUnit;
  pauseThresholdS: number;
  longPauseLimitS: number;
  /** Where the pause settings come from, when not from the policy version that scored the attempt. */
  pauseNote?: string;
}

function seconds(value: number): string {
  return `${value.toFixed(1)} s`;
}

/** Shared pieces of every time chart: x axis in seconds over the whole attempt, pause spans with their length. */
function timeFrame(points: readonly CompressionPoint[], pauses: readonly PauseSpan[], width: number) {
  const end = Math.max(1, ...points.map((p) => p.t));
  return {
    x: { domain: [0, Math.ceil(end / 5) * 5], label: "Time since the attempt started (s)", ...X_TITLE_BELOW, ticks: width < 500 ? 5 : 10 },
    marginTop: Y_TITLE_MARGIN_TOP,
    marginBottom: X_TITLE_MARGIN_BOTTOM,
    pauseMarks: [
      Plot.rect(pauses as PauseSpan[], { x1: "start", x2: "end", fill: pauseFill }),
      // neighbouring pauses take turns at two heights so their labels never overlap; phones get the length only
      ...[0, 1].map((row) =>
        Plot.text(pauses as PauseSpan[], {
          filter: (p: PauseSpan) => pauses.indexOf(p) % 2 === row,
          x: (p: PauseSpan) => (p.start + p.end) / 2,
          frameAnchor: "top",
          dy: 4 + row * (width < 500 ? 14 : 28),
          text: (p: PauseSpan) => (width < 500 ? seconds(p.lengthS) : `${p.long ? "Long pause" : "Pause"}\n${seconds(p.lengthS)}`),
          fill: ink,
          fontWeight: 600,
          lineAnchor: "top",
        }),
      ),
    ],
  };
}

function Legend({ items }: { items: { key: string; mark: React.ReactNode; label: string }[] }) {
  return (
    <ul className="flex flex-wrap gap-x-4 gap-y-1 text-caption text-ink" aria-label="Legend">
      {items.map((item) => (
        <li key={item.key} className="inline-flex items-center gap-1.5">
          {item.mark}
          {item.label}
        </li>
      ))}
    </ul>
  );
}

const statusMarkClass: Record<TargetStatus, string> = { on_target: "text-on-target-mark", too_low: "text-too-low-mark", too_high: "text-too-high-mark" };
const markFor = (s: TargetStatus) => <TargetMark status={s} className={statusMarkClass[s]} />;
const bandMark = <span className="inline-block h-3 w-5 border-y-2 border-on-target-mark bg-on-target-tint" aria-hidden="true" />;
const pauseMark = <span className="inline-block h-3 w-5 bg-[#E4E1EC]" aria-hidden="true" />;

export function CompressionCharts({ series, band, unit, pauseThresholdS, longPauseLimitS, pauseNote }: CompressionChartsProps) {
  const { points, pauses, counts } = series;
  const pausesHeadingId = useId();
  const n = points.length;
  const len = useCallback((mm: number) => formatLength(mm, unit), [unit]);
  const rated = useMemo(() => points.filter((p) => p.rate !== null), [points]);
  const pct = (part: number, whole: number) => (whole === 0 ? "–" : `${((100 * part) / whole).toFixed(0)} %`);

  const depthPlot = useCallback(
    (data: readonly CompressionPoint[], { width }: ChartSize): Plot.PlotOptions => {
      const frame = timeFrame(data, pauses, width);
      const depths = data.map((p) => p.depthMm);
      const low = Math.min(band.depthMinMm - 10, ...depths);
      const high = Math.max(band.depthMaxMm + 10, ...depths);
      return {
        height: 300,
        marginLeft: 48,
        marginTop: frame.marginTop,
        marginBottom: frame.marginBottom,
        x: frame.x,
        y: { domain: [fromMm(Math.max(0, low - 2), unit), fromMm(high + 2, unit)], label: `Depth (${unit})`, grid: true },
        color: colour,
        symbol,
        marks: [
          ...frame.pauseMarks,
          Plot.rect([band], { y1: fromMm(band.depthMinMm, unit), y2: fromMm(band.depthMaxMm, unit), fill: bandFill }),
          Plot.ruleY([band.depthMinMm, band.depthMaxMm], { y: (mm: number) => fromMm(mm, unit), stroke: bandEdge, strokeDasharray: "4 3" }),
          Plot.dot(data as CompressionPoint[], {
            x: "t",
            y: (p: CompressionPoint) => fromMm(p.depthMm, unit),
            fill: (p: CompressionPoint) => depthStatus[p.depthClass],
            symbol: (p: CompressionPoint) => depthStatus[p.depthClass],
            rotate: (p: CompressionPoint) => rotateFor(depthStatus[p.depthClass]),
            r: width < 500 ? 2.6 : 3.4,
            stroke: "white",
            strokeWidth: 0.5,
            title: (p: CompressionPoint) => `#${p.index} at ${seconds(p.t)}: ${len(p.depthMm)}, ${depthClassLabels[p.depthClass].toLowerCase()}`,
          }),
        ],
      };
    },
    [band, pauses, unit, len],
  );

  const ratePlot = useCallback(
    (data: readonly CompressionPoint[], { width }: ChartSize): Plot.PlotOptions => {
      const frame = timeFrame(points, pauses, width);
      const rates = data.map((p) => p.rate ?? band.rateMin);
      // a very short interval gives an extreme rate; keep the band readable and pin such points to the edge
      const low = Math.max(40, Math.min(band.rateMin - 20, ...rates));
      const high = Math.min(220, Math.max(band.rateMax + 20, ...rates));
      return {
        height: 260,
        marginLeft: 48,
        marginTop: frame.marginTop,
        marginBottom: frame.marginBottom,
        x: frame.x,
        y: { domain: [low, high], label: "Rate (per minute)", grid: true, clamp: true },
        color: colour,
        symbol,
        marks: [
          ...frame.pauseMarks,
          Plot.rect([band], { y1: band.rateMin, y2: band.rateMax, fill: bandFill }),
          Plot.ruleY([band.rateMin, band.rateMax], { stroke: bandEdge, strokeDasharray: "4 3" }),
          Plot.dot(data as CompressionPoint[], {
            x: "t",
            y: "rate",
            fill: (p: CompressionPoint) => rateStatus[p.rateClass!],
            symbol: (p: CompressionPoint) => rateStatus[p.rateClass!],
            rotate: (p: CompressionPoint) => rotateFor(rateStatus[p.rateClass!]),
            r: width < 500 ? 2.6 : 3.4,
            stroke: "white",
            strokeWidth: 0.5,
            title: (p: CompressionPoint) => `#${p.index} at ${seconds(p.t)}: ${Math.round(p.rate!)} per minute, ${rateClassLabels[p.rateClass!].toLowerCase()}`,
          }),
        ],
      };
    },
    [band, pauses, points],
  );

  const recoilPlot = useCallback(
    (data: readonly CompressionPoint[], { width }: ChartSize): Plot.PlotOptions => {
      const frame = timeFrame(data, pauses, width);
      const high = Math.max(band.recoilMaxMm * 2.5, ...data.map((p) => p.releaseMm)) + 1;
      return {
        height: 220,
        marginLeft: 48,
        marginTop: frame.marginTop,
        marginBottom: frame.marginBottom,
        x: frame.x,
        y: { domain: [0, fromMm(high, unit)], label: `Still pressed at release (${unit})`, grid: true },
        color: colour,
        symbol,
        marks: [
          ...frame.pauseMarks,
          Plot.rect([band], { y1: 0, y2: fromMm(band.recoilMaxMm, unit), fill: bandFill }),
          Plot.ruleY([band.recoilMaxMm], { y: (mm: number) => fromMm(mm, unit), stroke: bandEdge, strokeDasharray: "4 3" }),
          Plot.dot(data as CompressionPoint[], {
            x: "t",
            y: (p: CompressionPoint) => fromMm(p.releaseMm, unit),
            fill: (p: CompressionPoint) => (p.recoilFull ? "on_target" : "too_high"),
            symbol: (p: CompressionPoint) => (p.recoilFull ? "on_target" : "too_high"),
            r: width < 500 ? 2.6 : 3.4,
            stroke: "white",
            strokeWidth: 0.5,
            title: (p: CompressionPoint) =>
              `#${p.index} at ${seconds(p.t)}: ${len(p.releaseMm)} still pressed, ${p.recoilFull ? "full recoil" : "incomplete recoil"}`,
          }),
        ],
      };
    },
    [band, pauses, unit, len],
  );

  const depthColumns: Column<CompressionPoint>[] = useMemo(
    () => [
      { key: "index", header: "Compression", value: (p) => p.index, align: "right" },
      { key: "t", header: "Time (s)", value: (p) => Number(p.t.toFixed(2)), align: "right" },
      { key: "depth", header: `Depth (${unit})`, value: (p) => Number(fromMm(p.depthMm, unit).toFixed(unit === "in" ? 2 : 1)), align: "right" },
      {
        key: "class",
        header: "Depth class",
        value: (p) => depthClassLabels[p.depthClass],
        render: (p) => <ClassCell status={depthStatus[p.depthClass]} label={depthClassLabels[p.depthClass]} />,
      },
    ],
    [unit],
  );
  const rateColumns: Column<CompressionPoint>[] = [
    { key: "index", header: "Compression", value: (p) => p.index, align: "right" },
    { key: "t", header: "Time (s)", value: (p) => Number(p.t.toFixed(2)), align: "right" },
    { key: "interval", header: "Interval (ms)", value: (p) => p.intervalMs, align: "right" },
    { key: "rate", header: "Rate (per minute)", value: (p) => (p.rate === null ? null : Math.round(p.rate)), align: "right" },
    {
      key: "class",
      header: "Rate class",
      value: (p) => rateClassLabels[p.rateClass!],
      render: (p) => <ClassCell status={rateStatus[p.rateClass!]} label={rateClassLabels[p.rateClass!]} />,
    },
  ];
  const recoilColumns: Column<CompressionPoint>[] = [
    { key: "index", header: "Compression", value: (p) => p.index, align: "right" },
    { key: "t", header: "Time (s)", value: (p) => Number(p.t.toFixed(2)), align: "right" },
    { key: "release", header: `Still pressed (${unit})`, value: (p) => Number(fromMm(p.releaseMm, unit).toFixed(unit === "in" ? 2 : 1)), align: "right" },
    {
      key: "recoil",
      header: "Recoil",
      value: (p) => (p.recoilFull ? "Full" : "Incomplete"),
      render: (p) => <ClassCell status={p.recoilFull ? "on_target" : "too_high"} label={p.recoilFull ? "Full" : "Incomplete"} />,
    },
  ];
  const pauseColumns: Column<PauseSpan>[] = [
    { key: "start", header: "From (s)", value: (p) => Number(p.start.toFixed(2)), align: "right" },
    { key: "end", header: "To (s)", value: (p) => Number(p.end.toFixed(2)), align: "right" },
    { key: "length", header: "Length (s)", value: (p) => Number(p.lengthS.toFixed(1)), align: "right" },
    { key: "before", header: "Before compression", value: (p) => p.before, align: "right" },
    { key: "long", header: `Over ${longPauseLimitS} s`, value: (p) => (p.long ? "Yes" : "No") },
  ];

  const bandWords = `${len(band.depthMinMm)} to ${len(band.depthMaxMm)}`;
  const pauseWords =
    pauses.length === 0
      ? `No pauses (gaps over ${pauseThresholdS} s).`
      : `${pauses.length} pause${pauses.length === 1 ? "" : "s"} (gaps over ${pauseThresholdS} s), shaded: ${pauses.map((p) => `${seconds(p.lengthS)} at ${seconds(p.start)}`).join(", ")}.`;

  return (
    <div className="flex flex-col gap-5">
      <Chart
        title="Depth of each compression"
        description={`${n} compressions against the target band ${bandWords} (shaded). ${counts.onTarget} on target (${pct(counts.onTarget, n)}), ${counts.tooShallow} too shallow (triangles pointing down), ${counts.tooDeep} too deep (triangles pointing up). ${pauseWords}`}
        data={points}
        columns={depthColumns}
        rowKey={(p) => p.index}
        plot={depthPlot}
        exportFileName="compression-depth"
        legend={
          <Legend
            items={[
              { key: "band", mark: bandMark, label: `Target ${bandWords}` },
              { key: "on", mark: markFor("on_target"), label: "On target" },
              { key: "low", mark: markFor("too_low"), label: "Too shallow" },
              { key: "high", mark: markFor("too_high"), label: "Too deep" },
              ...(pauses.length ? [{ key: "pause", mark: pauseMark, label: `Pause (gap over ${pauseThresholdS} s)` }] : []),
            ]}
          />
        }
      />
      <Chart
        title="Rate from each interval"
        description={`The rate each compression implies from the interval since the one before, against ${band.rateMin}–${band.rateMax} per minute (shaded). ${counts.rated} compressions have a rate (not the first, nor one after a pause): ${counts.rateOk} on target (${pct(counts.rateOk, counts.rated)}), ${counts.tooSlow} too slow, ${counts.tooFast} too fast. Rates beyond the axis are drawn at its edge.`}
        data={rated}
        columns={rateColumns}
        rowKey={(p) => p.index}
        plot={ratePlot}
        exportFileName="compression-rate"
        legend={
          <Legend
            items={[
              { key: "band", mark: bandMark, label: `Target ${band.rateMin}–${band.rateMax} per minute` },
              { key: "on", mark: markFor("on_target"), label: "On target" },
              { key: "low", mark: markFor("too_low"), label: "Too slow" },
              { key: "high", mark: markFor("too_high"), label: "Too fast" },
              ...(pauses.length ? [{ key: "pause", mark: pauseMark, label: "Pause (no rate)" }] : []),
            ]}
          />
        }
      />
      <Chart
        title="Recoil after each compression"
        description={`How far the chest was still pressed when the hands came up, against the full-recoil tolerance of ${len(band.recoilMaxMm)} (shaded). ${counts.recoilFull} of ${n} compressions had full recoil (${pct(counts.recoilFull, n)}); ${n - counts.recoilFull} incomplete (triangles).`}
        data={points}
        columns={recoilColumns}
        rowKey={(p) => p.index}
        plot={recoilPlot}
        exportFileName="compression-recoil"
        legend={
          <Legend
            items={[
              { key: "band", mark: bandMark, label: `Full recoil: at most ${len(band.recoilMaxMm)}` },
              { key: "on", mark: markFor("on_target"), label: "Full" },
              { key: "high", mark: markFor("too_high"), label: "Incomplete" },
            ]}
          />
        }
      />
      <section aria-labelledby={pausesHeadingId} className="flex flex-col gap-2 rounded-card border border-line bg-surface p-4 shadow-card">
        <h3 id={pausesHeadingId} className="text-lead font-semibold">
          Pauses
        </h3>
        <p className="text-small text-muted">
          A gap longer than {pauseThresholdS} s between two compressions is a pause; over {longPauseLimitS} s it is a long pause. {pauseNote}
        </p>
        {pauses.length === 0 ? (
          <p>No pauses in this attempt.</p>
        ) : (
          <DataTable
            caption="Pauses"
            captionHidden
            columns={pauseColumns}
            rows={pauses}
            rowKey={(p) => p.before}
            filterable={false}
            exportFileName="compression-pauses"
            phoneLayout="scroll"
          />
        )}
      </section>
    </div>
  );
}

function ClassCell({ status, label }: { status: TargetStatus; label: string }) {
  return (
    <span className="inline-flex items-center gap-1.5">
      {markFor(status)}
      {label}
    </span>
  );
}
