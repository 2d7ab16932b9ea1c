// The compressions of a stream summed up two ways: how their depths (or rates) are distributed, in bins whose
// edges fall on the band's limits, and how much of the attempt's compressing time each criterion spent in its
// band (a ribbon per criterion over time).
import type { CompressionPoint, CompressionSeries } from "./compressionSeries";

export type BandClass = "low" | "on" | "high";

export interface DistributionBin {
  /** Lower edge (inclusive) and upper edge (exclusive), in the measure's own unit (mm, per minute). */
  from: number;
  to: number;
  low: number;
  on: number;
  high: number;
}

/**
 * Counts of values per bin of `width`, with edges at multiples of `width` so band limits that are multiples
 * too are bin edges. Values outside [min, max) are counted in the first or last bin (said so where shown).
 */
export function distribution(values: readonly { value: number; cls: BandClass }[], width: number, min: number, max: number): DistributionBin[] {
  if (values.length === 0) return [];
  const lowest = Math.max(min, Math.min(...values.map((v) => v.value)));
  const highest = Math.min(max - width / 2, Math.max(...values.map((v) => v.value)));
  const first = Math.floor(lowest / width);
  const last = Math.max(first, Math.floor(highest / width));
  const bins: DistributionBin[] = [];
  for (let k = first; k <= last; k++) bins.push({ from: k * width, to: (k + 1) * width, low: 0, on: 0, high: 0 });
  for (const { value, cls } of values) {
    const k = Math.min(last, Math.max(first, Math.floor(value / width)));
    bins[k - first][cls]++;
  }
  return bins;
}

export type Lane = "depth" | "rate" | "recoil";

export interface RibbonSegment {
  lane: Lane;
  /** Compression the segment belongs to (1-based). */
  index: number;
  /** Seconds since the attempt started (see `ribbon`). */
  start: number;
  end: number;
  cls: BandClass;
}

export interface LaneShare {
  lane: Lane;
  /** Seconds of compressing the lane covers (for rate: the intervals outside pauses). */
  seconds: number;
  on: number;
  low: number;
  high: number;
}

const depthCls = { too_shallow: "low", on_target: "on", too_deep: "high" } as const;
const rateCls = { too_slow: "low", on_target: "on", too_fast: "high" } as const;

function laneClass(p: CompressionPoint, lane: Lane): BandClass | null {
  if (lane === "depth") return depthCls[p.depthClass];
  if (lane === "recoil") return p.recoilFull ? "on" : "high";
  return p.rateClass === null ? null : rateCls[p.rateClass];
}

/** The median interval between compressions outside pauses, in seconds (0.55 s, about 110/min, if none). */
function typicalInterval(points: readonly CompressionPoint[]): number {
  const intervals = points
    .filter((p) => p.rate !== null)
    .map((p) => p.intervalMs! / 1000)
    .sort((a, b) => a - b);
  return intervals.length === 0 ? 0.55 : intervals[Math.floor(intervals.length / 2)];
}

/**
 * Depth and recoil: each compression holds its lane from its own time until the next compression; before a
 * pause, and for the last compression, it holds a typical interval, so pauses stay empty. Rate: each rated
 * compression holds the interval its rate comes from (from the compression before it to itself).
 */
export function ribbon(series: CompressionSeries): { segments: RibbonSegment[]; shares: LaneShare[] } {
  const { points } = series;
  const typical = typicalInterval(points);
  const segments: RibbonSegment[] = [];
  const shares: LaneShare[] = (["depth", "rate", "recoil"] as const).map((lane) => ({ lane, seconds: 0, on: 0, low: 0, high: 0 }));
  points.forEach((p, i) => {
    const next = points[i + 1];
    const end = next && !next.afterPause ? next.t : p.t + typical;
    for (const share of shares) {
      const cls = laneClass(p, share.lane);
      if (cls === null) continue;
      const span = share.lane === "rate" ? { start: points[i - 1].t, end: p.t } : { start: p.t, end };
      segments.push({ lane: share.lane, index: p.index, ...span, cls });
      share.seconds += span.end - span.start;
      share[cls] += span.end - span.start;
    }
  });
  return { segments, shares };
}
