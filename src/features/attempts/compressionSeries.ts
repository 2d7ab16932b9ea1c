// One row per compression of a stream, classed the way the scoring classes it (docs/scoring.md, section 1):
// depth against the band (limits on target), recoil full when the release is within the tolerance, rate from
// the interval since the previous compression unless that gap is a pause.
import type { Band } from "../../../shared/scoring/policy";

export type DepthClass = "on_target" | "too_shallow" | "too_deep";
export type RateClass = "on_target" | "too_slow" | "too_fast";

export interface CompressionPoint {
  /** 1-based position in the attempt. */
  index: number;
  /** Seconds since the attempt started. */
  t: number;
  depthMm: number;
  depthClass: DepthClass;
  releaseMm: number;
  recoilFull: boolean;
  /** Interval since the previous compression (ms); null for the first. */
  intervalMs: number | null;
  /** Per-minute rate from that interval; null for the first compression and after a pause. */
  rate: number | null;
  rateClass: RateClass | null;
  /** The gap before this compression was a pause. */
  afterPause: boolean;
}

export interface PauseSpan {
  /** Seconds since the attempt started. */
  start: number;
  end: number;
  lengthS: number;
  /** Longer than the long-pause limit. */
  long: boolean;
  /** The compression after the pause (1-based). */
  before: number;
}

export interface CompressionSeries {
  points: CompressionPoint[];
  pauses: PauseSpan[];
  counts: { onTarget: number; tooShallow: number; tooDeep: number; rated: number; rateOk: number; tooSlow: number; tooFast: number; recoilFull: number };
}

export interface StreamInput {
  t_ms: readonly number[];
  depth_mm: readonly number[];
  release_mm: readonly number[];
}

export function depthClassOf(depthMm: number, band: Pick<Band, "depthMinMm" | "depthMaxMm">): DepthClass {
  return depthMm < band.depthMinMm ? "too_shallow" : depthMm > band.depthMaxMm ? "too_deep" : "on_target";
}

export function compressionSeries(stream: StreamInput, band: Band, pauseThresholdS: number, longPauseLimitS: number): CompressionSeries {
  const n = Math.min(stream.t_ms.length, stream.depth_mm.length, stream.release_mm.length);
  // the stream arrives sorted by time; sort defensively so a stray row never draws a line backwards
  const order = Array.from({ length: n }, (_, i) => i).sort((a, b) => stream.t_ms[a] - stream.t_ms[b]);
  const pauseMs = pauseThresholdS * 1000;
  const slowMs = 60000 / band.rateMin;
  const fastMs = 60000 / band.rateMax;
  const points: CompressionPoint[] = [];
  const pauses: PauseSpan[] = [];
  const counts = { onTarget: 0, tooShallow: 0, tooDeep: 0, rated: 0, rateOk: 0, tooSlow: 0, tooFast: 0, recoilFull: 0 };
  let previous: number | null = null;
  for (let k = 0; k < n; k++) {
    const i = order[k];
    const tMs = stream.t_ms[i];
    const depthMm = stream.depth_mm[i];
    const releaseMm = stream.release_mm[i];
    const intervalMs = previous === null ? null : tMs - previous;
    const afterPause = intervalMs !== null && intervalMs > pauseMs;
    let rate: number | null = null;
    let rateClass: RateClass | null = null;
    if (intervalMs !== null && !afterPause && intervalMs > 0) {
      rate = 60000 / intervalMs;
      // compare intervals, as the scoring does, so a rate of exactly 100 or 120 is on target
      rateClass = intervalMs > slowMs ? "too_slow" : intervalMs < fastMs ? "too_fast" : "on_target";
      counts.rated++;
      if (rateClass === "on_target") counts.rateOk++;
      else if (rateClass === "too_slow") counts.tooSlow++;
      else counts.tooFast++;
    }
    if (afterPause && previous !== null) {
      pauses.push({ start: previous / 1000, end: tMs / 1000, lengthS: intervalMs! / 1000, long: intervalMs! > longPauseLimitS * 1000, before: k + 1 });
    }
    const depthClass = depthClassOf(depthMm, band);
    if (depthClass === "on_target") counts.onTarget++;
    else if (depthClass === "too_shallow") counts.tooShallow++;
    else counts.tooDeep++;
    const recoilFull = releaseMm <= band.recoilMaxMm;
    if (recoilFull) counts.recoilFull++;
    points.push({ index: k + 1, t: tMs / 1000, depthMm, depthClass, releaseMm, recoilFull, intervalMs, rate, rateClass, afterPause });
    previous = tMs;
  }
  return { points, pauses, counts };
}
