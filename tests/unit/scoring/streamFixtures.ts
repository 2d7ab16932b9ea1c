// Builders for invented compression streams used by the scoring tests.
import type { CompressionRow } from "../../../shared/scoring/analyzeStream";

/** `count` compressions at a fixed interval, all with the same depth and release. */
export function metronome(count: number, intervalMs: number, depthMm = 55, releaseMm = 1): CompressionRow[] {
  return Array.from({ length: count }, (_, i) => ({ t_ms: i * intervalMs, depth_mm: depthMm, release_mm: releaseMm }));
}

/** Compressions at the given times (ms), all with the same depth and release. */
export function atTimes(times: readonly number[], depthMm = 55, releaseMm = 1): CompressionRow[] {
  return times.map((t_ms) => ({ t_ms, depth_mm: depthMm, release_mm: releaseMm }));
}

/** Compressions 500 ms apart with the given depths. */
export function withDepths(depths: readonly number[], releaseMm = 1): CompressionRow[] {
  return depths.map((depth_mm, i) => ({ t_ms: i * 500, depth_mm, release_mm: releaseMm }));
}

/**
 * Worked example A (also in docs/scoring.md): 7 adult compressions with one 3 s pause. The hand
 * computation is written out in analyzeStream.test.ts.
 */
export const exampleA: CompressionRow[] = [
  { t_ms: 0, depth_mm: 52, release_mm: 2 },
  { t_ms: 500, depth_mm: 48, release_mm: 1 }, // too shallow
  { t_ms: 1050, depth_mm: 55, release_mm: 6 }, // incomplete recoil (6 > 5)
  { t_ms: 1650, depth_mm: 61, release_mm: 3 }, // too deep
  { t_ms: 4650, depth_mm: 57, release_mm: 0 }, // after a 3000 ms gap: a pause, no rate
  { t_ms: 5150, depth_mm: 58, release_mm: 5 }, // release exactly 5: full recoil
  { t_ms: 5600, depth_mm: 50, release_mm: 2 }, // depth exactly 50: on target
];
