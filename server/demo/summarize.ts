// The summary a manikin would export for an attempt, computed from its compression stream with the same
// analysis the import runs on streams, then rounded the way the attempts file writes it: whole percentages
// whose groups of three add up to exactly 100, tenths for seconds, rate and depth.
import { analyzeSorted } from "../../shared/scoring/analyzeStream";
import { DEFAULT_POLICY, type PatientType } from "../../shared/scoring/policy";
import type { CompressionStream } from "./simulateStream";

export interface AttemptSummary {
  duration_s: number;
  compressions: number;
  rate_cpm: number;
  depth_mm: number;
  depth_ok_pct: number;
  too_shallow_pct: number;
  too_deep_pct: number;
  rate_ok_pct: number;
  too_slow_pct: number;
  too_fast_pct: number;
  recoil_ok_pct: number;
  hands_on_pct: number;
  longest_pause_s: number;
}

export function summarizeStream(stream: CompressionStream, profile: PatientType): AttemptSummary {
  const m = analyzeSorted(stream.t, stream.depth, stream.release, 0, stream.t.length, DEFAULT_POLICY.bands[profile], DEFAULT_POLICY);
  const [depthOk, shallow, deep] = wholePercentages([m.depth_ok_pct, m.too_shallow_pct, m.too_deep_pct]);
  const [rateOk, slow, fast] = wholePercentages([m.rate_ok_pct, m.too_slow_pct, m.too_fast_pct]);
  return {
    duration_s: tenths(m.duration_s),
    compressions: m.compressions,
    rate_cpm: tenths(m.rate_cpm),
    depth_mm: tenths(m.depth_mm),
    depth_ok_pct: depthOk,
    too_shallow_pct: shallow,
    too_deep_pct: deep,
    rate_ok_pct: rateOk,
    too_slow_pct: slow,
    too_fast_pct: fast,
    recoil_ok_pct: Math.round(m.recoil_ok_pct),
    hands_on_pct: Math.round(m.hands_on_pct),
    longest_pause_s: tenths(m.longest_pause_s),
  };
}

/**
 * Rounds shares that add up to 100 to whole numbers that still add up to 100: round down, then give the
 * missing points to the largest remainders (ties to the earlier share, so the result is deterministic).
 */
export function wholePercentages(shares: readonly number[]): number[] {
  const floors = shares.map((s) => Math.floor(s + 1e-9));
  let missing = Math.round(shares.reduce((a, b) => a + b, 0)) - floors.reduce((a, b) => a + b, 0);
  const order = shares.map((s, i) => ({ i, remainder: s - floors[i] })).sort((a, b) => b.remainder - a.remainder || a.i - b.i);
  for (const { i } of order) {
    if (missing <= 0) break;
    floors[i]++;
    missing--;
  }
  return floors;
}

function tenths(value: number): number {
  return Math.round(value * 10) / 10;
}
