// The compressions of a stream at a glance: a ribbon per criterion over time (how much of the compressing
// time each spent in its band, misses drawn in the lower or upper half of their lane by the way they missed)
// and the distributions of depth and rate against their bands. Each compression on its own is one click away.
import * as Plot from "@observablehq/plot";
import { useCallback, useId, useMemo, useState } from "react";
import type { Band } from "../../../shared/scoring/policy";
import { formatLength, fromMm, type LengthUnit } from "../../../shared/units";
import { Chart, type ChartSize } from "../../components/Chart";
import type { Column } from "../../components/DataTable";
import { status as statusColours } from "../../styles/palette";
import { ChartLegend } from "../insight/ChartLegend";
import { X_TITLE_BELOW, X_TITLE_MARGIN_BOTTOM, Y_TITLE_MARGIN_TOP } from "../insight/charts/axisSpace";
import { CompressionCharts } from "./CompressionCharts";
import type { CompressionSeries } from "./compressionSeries";
import { distribution, ribbon, type BandClass, type DistributionBin, type Lane, type LaneShare, type RibbonSegment } from "./compressionDistribution";

const fills: Record<BandClass, string> = { low: statusColours.tooLow.mark, on: statusColours.onTarget.mark, high: statusColours.tooHigh.mark };
const pauseFill = "#E4E1EC";
const ink = "#1C1B2E";

const laneNames: Record<Lane, string> = { depth: "Depth", rate: "Rate", recoil: "Recoil" };
/** Lanes from the top: depth, rate, recoil. */
const laneRow: Record<Lane, number> = { depth: 2, rate: 1, recoil: 0 };
const laneHeight = 0.8;

const classWords: Record<Lane, Record<BandClass, string>> = {
  depth: { low: "too shallow", on: "in the band", high: "too deep" },
  rate: { low: "too slow", on: "in the band", high: "too fast" },
  recoil: { low: "", on: "fully released", high: "still pressed" },
};

/** A share of time or of compressions; one decimal, as these shares sit near the pass rule's whole-number marks. */
function share(part: number, whole: number): string {
  return whole === 0 ? "–" : `${((100 * part) / whole).toFixed(1)} %`;
}

/** A segment's height in its lane: full when in the band, the lower half when low, the upper half when high. */
function laneSpan(lane: Lane, cls: BandClass): [number, number] {
  const base = laneRow[lane];
  if (cls === "low") return [base, base + laneHeight / 2];
  if (cls === "high") return [base + laneHeight / 2, base + laneHeight];
  return [base, base + laneHeight];
}

/** A legend swatch in ChartLegend's 24 × 12 box: the whole lane, or its lower or upper half. */
function laneSwatch(cls: BandClass, half?: "lower" | "upper") {
  return (
    <>
      <rect x="0.5" y="0.5" width="23" height="11" fill="white" stroke="#D9D5CA" />
      <rect x="1" y={half === "lower" ? 6 : 1} width="22" height={half ? 5 : 10} fill={fills[cls]} />
    </>
  );
}

const bandSwatch = (
  <>
    <rect x="2" y="0" width="20" height="12" fill={statusColours.onTarget.tint} />
    <path d="M2 0v12M22 0v12" stroke={statusColours.onTarget.text} strokeWidth="1.5" strokeDasharray="3 2" />
  </>
);

export interface CompressionOverviewProps {
  series: CompressionSeries;
  band: Band;
  unit: LengthUnit;
  pauseThresholdS: number;
  longPauseLimitS: number;
  pauseNote?: string;
}

export function CompressionOverview({ series, band, unit, pauseThresholdS, longPauseLimitS, pauseNote }: CompressionOverviewProps) {
  const [eachShown, setEachShown] = useState(false);
  const eachId = useId();
  const { points, pauses } = series;
  const len = useCallback((mm: number) => formatLength(mm, unit), [unit]);
  const { segments, shares } = useMemo(() => ribbon(series), [series]);

  const depthBins = useMemo(
    () =>
      distribution(
        points.map((p) => ({ value: p.depthMm, cls: p.depthClass === "too_shallow" ? "low" : p.depthClass === "too_deep" ? "high" : "on" })),
        1,
        0,
        Number.POSITIVE_INFINITY,
      ),
    [points],
  );
  // rates beyond 40–220 per minute (a stray double tap) go into the outermost bins, so the band stays readable
  const rateBins = useMemo(
    () =>
      distribution(
        points
          .filter((p) => p.rate !== null)
          .map((p) => ({ value: p.rate!, cls: p.rateClass === "too_slow" ? "low" : p.rateClass === "too_fast" ? "high" : "on" })),
        5,
        40,
        220,
      ),
    [points],
  );

  const ribbonPlot = useCallback(
    (_rows: readonly LaneShare[], { width }: ChartSize): Plot.PlotOptions => {
      const end = Math.max(1, ...segments.map((s) => s.end));
      const sharesByLane = new Map(shares.map((s) => [s.lane, s]));
      return {
        height: 170,
        marginLeft: width < 500 ? 92 : 160,
        marginBottom: X_TITLE_MARGIN_BOTTOM,
        x: { domain: [0, Math.ceil(end / 5) * 5], label: "Time since the attempt started (s)", ...X_TITLE_BELOW, ticks: width < 500 ? 5 : 10 },
        y: {
          domain: [0, 2 + laneHeight],
          ticks: (["depth", "rate", "recoil"] as const).map((lane) => laneRow[lane] + laneHeight / 2),
          tickFormat: (y: number) => {
            const lane = (["depth", "rate", "recoil"] as const).find((l) => laneRow[l] + laneHeight / 2 === y)!;
            const s = sharesByLane.get(lane)!;
            return width < 500 ? `${laneNames[lane]} ${share(s.on, s.seconds)}` : `${laneNames[lane]}: ${share(s.on, s.seconds)} of the time`;
          },
          tickSize: 0,
          label: null,
        },
        marks: [
          Plot.rect(pauses, { x1: "start", x2: "end", y1: 0, y2: 2 + laneHeight, fill: pauseFill }),
          Plot.rect(segments, {
            x1: "start",
            x2: "end",
            y1: (s: RibbonSegment) => laneSpan(s.lane, s.cls)[0],
            y2: (s: RibbonSegment) => laneSpan(s.lane, s.cls)[1],
            fill: (s: RibbonSegment) => fills[s.cls],
            title: (s: RibbonSegment) => `#${s.index}: ${laneNames[s.lane].toLowerCase()} ${classWords[s.lane][s.cls]}`,
          }),
          Plot.ruleY(
            [0, 1, 2].map((row) => row + laneHeight / 2),
            { stroke: "white", strokeOpacity: 0.6, strokeWidth: 0.5 },
          ),
          Plot.text(pauses, {
            x: (p: (typeof pauses)[number]) => (p.start + p.end) / 2,
            y: 2 + laneHeight,
            dy: -6,
            text: (p: (typeof pauses)[number]) => `${p.lengthS.toFixed(1)} s`,
            fill: ink,
            fontWeight: 600,
            lineAnchor: "bottom",
          }),
        ],
      };
    },
    [segments, shares, pauses],
  );

  const histogram = useCallback(
    (toAxis: (v: number) => number, bandLow: number, bandHigh: number, label: string, height: number) =>
      (bins: readonly DistributionBin[]): Plot.PlotOptions => {
        const stacked = bins.flatMap((b) =>
          (["low", "on", "high"] as const).filter((cls) => b[cls] > 0).map((cls) => ({ x1: toAxis(b.from), x2: toAxis(b.to), cls, count: b[cls] })),
        );
        return {
          height,
          marginTop: Y_TITLE_MARGIN_TOP,
          marginLeft: 48,
          marginBottom: X_TITLE_MARGIN_BOTTOM,
          x: { label, ...X_TITLE_BELOW },
          y: { label: "Compressions", grid: true },
          marks: [
            Plot.rect([0], {
              x1: toAxis(bandLow),
              x2: toAxis(bandHigh),
              y1: 0,
              y2: Math.max(1, ...bins.map((b) => b.low + b.on + b.high)),
              fill: statusColours.onTarget.tint,
            }),
            Plot.rectY(stacked, { x1: "x1", x2: "x2", y: "count", fill: (d: (typeof stacked)[number]) => fills[d.cls], inset: 0.5 }),
            Plot.ruleX([toAxis(bandLow), toAxis(bandHigh)], { stroke: statusColours.onTarget.text, strokeWidth: 1.5, strokeDasharray: "4 3" }),
            Plot.ruleY([0]),
          ],
        };
      },
    [],
  );
  const depthPlot = useMemo(() => histogram((mm) => fromMm(mm, unit), band.depthMinMm, band.depthMaxMm, `Depth (${unit})`, 240), [histogram, unit, band]);
  const ratePlot = useMemo(() => histogram((r) => r, band.rateMin, band.rateMax, "Rate (per minute)", 220), [histogram, band]);

  const laneColumns: Column<LaneShare>[] = [
    { key: "lane", header: "Criterion", value: (s) => laneNames[s.lane] },
    { key: "seconds", header: "Seconds counted", value: (s) => Number(s.seconds.toFixed(1)), align: "right" },
    { key: "on", header: "In the band", value: (s) => share(s.on, s.seconds), align: "right" },
    { key: "low", header: "Below (shallow, slow)", value: (s) => (s.lane === "recoil" ? "–" : share(s.low, s.seconds)), align: "right" },
    { key: "high", header: "Above (deep, fast, still pressed)", value: (s) => share(s.high, s.seconds), align: "right" },
  ];
  const binColumns = (format: (v: number) => string, words: Record<BandClass, string>): Column<DistributionBin>[] => [
    { key: "from", header: "From", value: (b) => format(b.from), align: "right" },
    { key: "to", header: "To (not included)", value: (b) => format(b.to), align: "right" },
    { key: "low", header: words.low, value: (b) => b.low, align: "right" },
    { key: "on", header: words.on, value: (b) => b.on, align: "right" },
    { key: "high", header: words.high, value: (b) => b.high, align: "right" },
  ];

  const depth = shares.find((s) => s.lane === "depth")!;
  const rate = shares.find((s) => s.lane === "rate")!;
  const recoil = shares.find((s) => s.lane === "recoil")!;
  const depthCounts = series.counts;
  const n = points.length;

  return (
    <div className="flex flex-col gap-5">
      <Chart
        title="Time in the band"
        description={`Across the ${n} compressions, depth was in the band ${share(depth.on, depth.seconds)} of the compressing time (${share(depth.low, depth.seconds)} too shallow, ${share(depth.high, depth.seconds)} too deep), rate ${share(rate.on, rate.seconds)} (${share(rate.low, rate.seconds)} too slow, ${share(rate.high, rate.seconds)} too fast) and recoil ${share(recoil.on, recoil.seconds)}. A miss fills the lower half of its lane when too low and the upper half when too high. ${pauses.length === 0 ? "No pauses." : `Pauses (gaps over ${pauseThresholdS} s) are the shaded gaps, with their length.`}`}
        data={shares}
        columns={laneColumns}
        rowKey={(s) => s.lane}
        plot={ribbonPlot}
        exportFileName="compression-time-in-band"
        legend={
          <ChartLegend
            items={[
              { label: "In the band (full lane)", swatch: laneSwatch("on") },
              { label: "Too shallow or too slow (lower half)", swatch: laneSwatch("low", "lower") },
              { label: "Too deep, too fast or still pressed (upper half)", swatch: laneSwatch("high", "upper") },
              ...(pauses.length ? [{ label: "Pause", swatch: <rect x="0" y="0" width="24" height="12" fill={pauseFill} /> }] : []),
            ]}
          />
        }
      />
      <div className="grid gap-5 xl:grid-cols-2">
        <Chart
          title="How deep the compressions were"
          description={`Compressions by depth in 1 mm steps against the band ${len(band.depthMinMm)} to ${len(band.depthMaxMm)} (shaded, dashed edges): ${depthCounts.onTarget} in the band (${share(depthCounts.onTarget, n)}), ${depthCounts.tooShallow} too shallow, ${depthCounts.tooDeep} too deep.`}
          data={depthBins}
          columns={binColumns((mm) => len(mm), { low: "Too shallow", on: "In the band", high: "Too deep" })}
          rowKey={(b) => b.from}
          plot={depthPlot}
          exportFileName="compression-depth-distribution"
          legend={<BarLegend words={{ low: "Too shallow", on: "In the band", high: "Too deep" }} />}
        />
        <Chart
          title="How fast the compressions came"
          description={`Rates from each interval in steps of 5 per minute against ${band.rateMin}–${band.rateMax} per minute (shaded, dashed edges): ${depthCounts.rateOk} of ${depthCounts.rated} in the band (${share(depthCounts.rateOk, depthCounts.rated)}), ${depthCounts.tooSlow} too slow, ${depthCounts.tooFast} too fast. Rates below 40 or above 220 per minute are counted in the outermost bar.`}
          data={rateBins}
          columns={binColumns((r) => String(r), { low: "Too slow", on: "In the band", high: "Too fast" })}
          rowKey={(b) => b.from}
          plot={ratePlot}
          exportFileName="compression-rate-distribution"
          legend={<BarLegend words={{ low: "Too slow", on: "In the band", high: "Too fast" }} />}
        />
      </div>
      <div className="flex flex-col gap-3">
        <button
          type="button"
          aria-expanded={eachShown}
          aria-controls={eachId}
          onClick={() => setEachShown((shown) => !shown)}
          className="inline-flex min-h-10 items-center gap-2 self-start rounded-control border border-dusk-700 bg-white px-4 font-semibold text-dusk-700 hover:bg-dusk-50"
        >
          <span aria-hidden="true">{eachShown ? "▾" : "▸"}</span>
          {eachShown ? "Hide each compression" : "Show each compression"}
        </button>
        <div id={eachId} hidden={!eachShown}>
          {eachShown && (
            <CompressionCharts
              series={series}
              band={band}
              unit={unit}
              pauseThresholdS={pauseThresholdS}
              longPauseLimitS={longPauseLimitS}
              pauseNote={pauseNote}
            />
          )}
        </div>
      </div>
    </div>
  );
}

function BarLegend({ words }: { words: Record<BandClass, string> }) {
  return (
    <ChartLegend
      items={[{ label: "Target band", swatch: bandSwatch }, ...(["low", "on", "high"] as const).map((cls) => ({ label: words[cls], swatch: laneSwatch(cls) }))]}
    />
  );
}
