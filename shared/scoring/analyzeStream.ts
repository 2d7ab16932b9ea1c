// Turns one attempt's compression stream into quality metrics. The typed-array core (analyzeSorted) is what
// the importer runs over millions of compressions: one pass, no allocation per compression. analyzeStream is
// the convenient front door for row objects: it validates, sorts and then calls the core.
import type { Band, NetworkPolicy } from "./policy";
import { DuplicateTimestampError, InvalidStreamValueError, UnsortedTimestampError, type StreamField } from "./streamErrors";

/** One compression: time since attempt start, peak depth, residual depth at the top of the following recoil. */
export interface CompressionRow {
  t_ms: number;
  depth_mm: number;
  release_mm: number;
}

export const attemptMetricKeys = [
  "compressions",
  "duration_s",
  "rate_cpm",
  "depth_mm",
  "depth_ok_pct",
  "too_shallow_pct",
  "too_deep_pct",
  "rate_ok_pct",
  "too_slow_pct",
  "too_fast_pct",
  "recoil_ok_pct",
  "hands_on_pct",
  "pauses",
  "longest_pause_s",
  "pauses_over_10s",
] as const;

/**
 * Quality of one attempt. Depth and recoil shares are of all compressions; rate shares are of rated
 * compressions (those that follow an interval no longer than the pause threshold). Every value is a finite
 * number; see analyzeSorted for the values used when there is too little data.
 */
export interface AttemptMetrics {
  compressions: number;
  /** (last t_ms − first t_ms) / 1000. */
  duration_s: number;
  /** 60000 × rated intervals / their summed length in ms. */
  rate_cpm: number;
  /** Mean peak depth. */
  depth_mm: number;
  depth_ok_pct: number;
  too_shallow_pct: number;
  too_deep_pct: number;
  rate_ok_pct: number;
  too_slow_pct: number;
  too_fast_pct: number;
  recoil_ok_pct: number;
  /** 100 × (1 − summed pauses / duration): the compression fraction. */
  hands_on_pct: number;
  pauses: number;
  longest_pause_s: number;
  /** Pauses longer than the policy's longPauseLimitS (10 s by default). */
  pauses_over_10s: number;
}

// attemptMetricKeys must list exactly the fields of AttemptMetrics.
type Same<A, B> = [A] extends [B] ? ([B] extends [A] ? true : false) : false;
const keysMatch: Same<(typeof attemptMetricKeys)[number], keyof AttemptMetrics> = true;
void keysMatch;

/** Times in milliseconds since attempt start. */
export type TimeArray = Float64Array | Int32Array | Uint32Array;
/** Depths in millimetres. */
export type LengthArray = Float64Array | Float32Array;

/** The part of the policy the stream analysis needs besides the band. */
export type PauseSettings = Pick<NetworkPolicy, "pauseThresholdS" | "longPauseLimitS">;

export function emptyMetrics(): AttemptMetrics {
  return {
    compressions: 0,
    duration_s: 0,
    rate_cpm: 0,
    depth_mm: 0,
    depth_ok_pct: 0,
    too_shallow_pct: 0,
    too_deep_pct: 0,
    rate_ok_pct: 0,
    too_slow_pct: 0,
    too_fast_pct: 0,
    recoil_ok_pct: 0,
    hands_on_pct: 0,
    pauses: 0,
    longest_pause_s: 0,
    pauses_over_10s: 0,
  };
}

/**
 * Analyse compressions from..to-1 (to exclusive) of arrays already sorted by time. Writes into `out` when
 * given (so a caller looping over many attempts allocates nothing) and returns it.
 *
 * Classes: depth < depthMinMm too shallow, > depthMaxMm too deep; recoil full when release ≤ recoilMaxMm.
 * An interval d > pauseThresholdS·1000 ms is a pause and the compression after it gets no rate; otherwise
 * its rate is 60000/d per minute, too slow below rateMin, too fast above rateMax (limits are on target).
 *
 * Too little data never gives NaN:
 * - no compressions: every value is 0;
 * - one compression: duration 0, depth and recoil shares from that compression, no rate;
 * - no rated interval (one compression, or only pauses): rate_cpm 0 and all three rate shares 0;
 * - zero duration (fewer than two compressions): hands_on_pct 0 — no time was measured, so none counts as
 *   hands-on.
 *
 * Throws DuplicateTimestampError / UnsortedTimestampError when times do not strictly increase, and
 * InvalidStreamValueError for a non-finite value. Negative depths are not checked here (importers validate
 * rows; analyzeStream does too).
 */
export function analyzeSorted(
  t: TimeArray,
  depth: LengthArray,
  release: LengthArray,
  from: number,
  to: number,
  band: Band,
  pause: PauseSettings,
  out: AttemptMetrics = emptyMetrics(),
): AttemptMetrics {
  if (!(Number.isInteger(from) && Number.isInteger(to) && from >= 0 && from <= to)) {
    throw new RangeError(`Invalid compression range ${from}..${to}`);
  }
  if (to > t.length || to > depth.length || to > release.length) {
    throw new RangeError(`Compression range ${from}..${to} runs past the end of the arrays`);
  }

  const depthMin = band.depthMinMm;
  const depthMax = band.depthMaxMm;
  const recoilMax = band.recoilMaxMm;
  // Rate limits as interval limits: 60000/d < rateMin ⇔ d > 60000/rateMin. Comparing intervals saves a
  // division per compression; the limits themselves stay on target either way.
  const slowIntervalMs = 60000 / band.rateMin;
  const fastIntervalMs = 60000 / band.rateMax;
  const pauseLimitMs = pause.pauseThresholdS * 1000;
  const longPauseMs = pause.longPauseLimitS * 1000;
  const n = to - from;

  // One pass. Counting with +(condition) instead of if/else keeps the loop free of unpredictable branches:
  // real streams mix classes from one compression to the next, and mispredicted branches would cost more
  // than everything else here. A NaN compares false everywhere and shows up in the sums checked below.
  let shallow = 0;
  let deep = 0;
  let recoilOk = 0;
  let depthSum = 0;
  let releaseSum = 0; // only to detect a non-finite release value
  let ratedMs = 0;
  let slow = 0;
  let fast = 0;
  let notIncreasing = 0;
  let pauses = 0;
  let pausedMs = 0;
  let longestMs = 0;
  let longPauses = 0;
  if (n > 0) {
    // The first compression has depth and recoil but no interval before it.
    depthSum = depth[from];
    shallow = +(depthSum < depthMin);
    deep = +(depthSum > depthMax);
    releaseSum = release[from];
    recoilOk = +(releaseSum <= recoilMax);
  }
  let prev = n > 0 ? t[from] : 0;
  for (let i = from + 1; i < to; i++) {
    const dep = depth[i];
    depthSum += dep;
    shallow += +(dep < depthMin);
    deep += +(dep > depthMax);
    const rel = release[i];
    releaseSum += rel;
    recoilOk += +(rel <= recoilMax);

    const ti = t[i];
    const d = ti - prev;
    prev = ti;
    if (d > pauseLimitMs) {
      // Rare, so a well-predicted branch.
      pauses++;
      pausedMs += d;
      if (d > longestMs) longestMs = d;
      if (d > longPauseMs) longPauses++;
    } else {
      ratedMs += d;
      slow += +(d > slowIntervalMs);
      fast += +(d < fastIntervalMs);
      notIncreasing += +(d <= 0);
    }
  }
  const rated = n > 1 ? n - 1 - pauses : 0;

  const durationMs = n > 1 ? t[to - 1] - t[from] : 0;
  const firstT = n > 0 ? t[from] : 0;
  if (!Number.isFinite(depthSum + releaseSum + ratedMs + pausedMs + durationMs + firstT)) {
    throwFirstNonFinite(t, depth, release, from, to);
  }
  if (notIncreasing > 0) throwOrderError(t, from, to);

  out.compressions = n;
  out.duration_s = durationMs / 1000;
  out.rate_cpm = rated > 0 ? (60000 * rated) / ratedMs : 0;
  out.depth_mm = n > 0 ? depthSum / n : 0;
  // 100·count/n rather than count/n·100: exact whenever the true share is a whole percentage.
  out.depth_ok_pct = n > 0 ? (100 * (n - shallow - deep)) / n : 0;
  out.too_shallow_pct = n > 0 ? (100 * shallow) / n : 0;
  out.too_deep_pct = n > 0 ? (100 * deep) / n : 0;
  out.rate_ok_pct = rated > 0 ? (100 * (rated - slow - fast)) / rated : 0;
  out.too_slow_pct = rated > 0 ? (100 * slow) / rated : 0;
  out.too_fast_pct = rated > 0 ? (100 * fast) / rated : 0;
  out.recoil_ok_pct = n > 0 ? (100 * recoilOk) / n : 0;
  out.hands_on_pct = durationMs > 0 ? clampPct((100 * (durationMs - pausedMs)) / durationMs) : 0;
  out.pauses = pauses;
  out.longest_pause_s = longestMs / 1000;
  out.pauses_over_10s = longPauses;
  return out;
}

function clampPct(value: number): number {
  return value < 0 ? 0 : value > 100 ? 100 : value;
}

/** Finds the first pair of times that does not strictly increase (the hot loop only counts them). */
function throwOrderError(t: TimeArray, from: number, to: number): never {
  for (let i = from + 1; i < to; i++) {
    const previous = t[i - 1];
    const current = t[i];
    if (current === previous) throw new DuplicateTimestampError(current, i - 1, i);
    if (current < previous) throw new UnsortedTimestampError(current, previous, i);
  }
  throw new Error("Compression times do not increase, but no offending pair was found"); // unreachable
}

function throwFirstNonFinite(t: TimeArray, depth: LengthArray, release: LengthArray, from: number, to: number): never {
  const columns: [StreamField, TimeArray | LengthArray][] = [
    ["t_ms", t],
    ["depth_mm", depth],
    ["release_mm", release],
  ];
  for (let i = from; i < to; i++) {
    for (const [field, values] of columns) {
      if (!Number.isFinite(values[i])) {
        throw new InvalidStreamValueError(field, values[i], i, "must be a finite number");
      }
    }
  }
  // Finite inputs whose sums overflow (values near 1e308) are still unusable.
  throw new InvalidStreamValueError("t_ms", t[from], from, "is too large to analyse");
}

/**
 * Analyse rows in any order. Checks every value (finite numbers; depth and release not negative), sorts by
 * time and rejects two rows with the same t_ms. Error indexes refer to positions in `rows`.
 */
export function analyzeStream(rows: readonly CompressionRow[], band: Band, pause: PauseSettings): AttemptMetrics {
  const n = rows.length;
  const t = new Float64Array(n);
  const depth = new Float64Array(n);
  const release = new Float64Array(n);
  let sorted = true;
  for (let i = 0; i < n; i++) {
    const row = rows[i];
    t[i] = checkedValue(row, "t_ms", i, false);
    depth[i] = checkedValue(row, "depth_mm", i, true);
    release[i] = checkedValue(row, "release_mm", i, true);
    if (i > 0 && t[i] <= t[i - 1]) sorted = false;
  }
  if (sorted) return analyzeSorted(t, depth, release, 0, n, band, pause);

  const order = Array.from({ length: n }, (_, i) => i).sort((a, b) => t[a] - t[b] || a - b);
  const st = new Float64Array(n);
  const sd = new Float64Array(n);
  const sr = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    const i = order[k];
    if (k > 0 && t[i] === st[k - 1]) throw new DuplicateTimestampError(t[i], order[k - 1], i);
    st[k] = t[i];
    sd[k] = depth[i];
    sr[k] = release[i];
  }
  return analyzeSorted(st, sd, sr, 0, n, band, pause);
}

function checkedValue(row: CompressionRow, field: StreamField, index: number, nonNegative: boolean): number {
  const value: unknown = row?.[field];
  if (typeof value !== "number" || !Number.isFinite(value)) {
    throw new InvalidStreamValueError(field, value, index, "must be a finite number");
  }
  if (nonNegative && value < 0) throw new InvalidStreamValueError(field, value, index, "must not be negative");
  return value;
}
