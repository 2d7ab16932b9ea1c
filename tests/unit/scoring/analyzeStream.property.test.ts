// Properties of the stream analysis that must hold for any stream, checked with fast-check.
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { analyzeStream, attemptMetricKeys, type CompressionRow } from "../../../shared/scoring/analyzeStream";
import { DEFAULT_POLICY, type Band } from "../../../shared/scoring/policy";

const adult = DEFAULT_POLICY.bands.adult;

/** Intervals that include the class limits (500, 600 ms), the pause threshold (2000) and long pauses. */
const interval = fc.oneof(fc.integer({ min: 1, max: 2500 }), fc.constantFrom(450, 499, 500, 501, 599, 600, 601, 1999, 2000, 2001, 10_000, 10_001, 15_000));
const depthValue = fc.oneof(fc.double({ min: 0, max: 90, noNaN: true }), fc.constantFrom(49.9, 50, 60, 60.1));
const releaseValue = fc.oneof(fc.double({ min: 0, max: 12, noNaN: true }), fc.constantFrom(4.9, 5, 5.1));

const stream = fc
  .tuple(fc.integer({ min: 0, max: 100_000 }), fc.array(fc.tuple(interval, depthValue, releaseValue), { minLength: 0, maxLength: 60 }))
  .map(([start, parts]) => {
    let t = start;
    return parts.map(([gap, depth_mm, release_mm], i): CompressionRow => {
      if (i > 0) t += gap;
      return { t_ms: t, depth_mm, release_mm };
    });
  });

describe("stream analysis properties", () => {
  it("row order does not change the result", () => {
    fc.assert(
      fc.property(
        stream.chain((rows) => fc.tuple(fc.constant(rows), fc.shuffledSubarray(rows, { minLength: rows.length }))),
        ([rows, shuffled]) => {
          expect(analyzeStream(shuffled, adult, DEFAULT_POLICY)).toEqual(analyzeStream(rows, adult, DEFAULT_POLICY));
        },
      ),
    );
  });

  it("scaling every interval by k divides the rate by k", () => {
    const rated = fc.array(fc.integer({ min: 50, max: 1000 }), { minLength: 1, maxLength: 60 });
    fc.assert(
      fc.property(rated, fc.double({ min: 0.5, max: 2, noNaN: true }), (gaps, k) => {
        // Scaled intervals stay within 25–2000 ms: none becomes a pause.
        const build = (factor: number) => {
          let t = 0;
          const rows: CompressionRow[] = [{ t_ms: 0, depth_mm: 55, release_mm: 1 }];
          for (const gap of gaps) {
            t += gap;
            rows.push({ t_ms: t * factor, depth_mm: 55, release_mm: 1 });
          }
          return rows;
        };
        const base = analyzeStream(build(1), adult, DEFAULT_POLICY).rate_cpm;
        const scaled = analyzeStream(build(k), adult, DEFAULT_POLICY).rate_cpm;
        expect(scaled).toBeGreaterThan(0);
        expect(Math.abs(scaled - base / k) / (base / k)).toBeLessThan(1e-12);
      }),
    );
  });

  it("the three shares of each class sum to 100 and every value is finite", () => {
    fc.assert(
      fc.property(stream, (rows) => {
        const m = analyzeStream(rows, adult, DEFAULT_POLICY);
        for (const key of attemptMetricKeys) expect(Number.isFinite(m[key])).toBe(true);
        if (m.compressions > 0) {
          expect(m.depth_ok_pct + m.too_shallow_pct + m.too_deep_pct).toBeCloseTo(100, 9);
        }
        if (m.compressions - 1 - m.pauses > 0) {
          expect(m.rate_ok_pct + m.too_slow_pct + m.too_fast_pct).toBeCloseTo(100, 9);
        }
        expect(m.hands_on_pct).toBeGreaterThanOrEqual(0);
        expect(m.hands_on_pct).toBeLessThanOrEqual(100);
        expect(m.recoil_ok_pct).toBeGreaterThanOrEqual(0);
        expect(m.recoil_ok_pct).toBeLessThanOrEqual(100);
      }),
    );
  });

  it("agrees with a plain reference implementation written straight from the definitions", () => {
    fc.assert(
      fc.property(stream, (rows) => {
        const m = analyzeStream(rows, adult, DEFAULT_POLICY);
        const r = reference(rows, adult, DEFAULT_POLICY.pauseThresholdS, DEFAULT_POLICY.longPauseLimitS);
        for (const key of attemptMetricKeys) expect(m[key]).toBeCloseTo(r[key], 9);
      }),
    );
  });
});

/** Deliberately naive: divides for every rate, branches on every class, no typed arrays. */
function reference(rows: CompressionRow[], band: Band, pauseS: number, longS: number) {
  const sorted = [...rows].sort((a, b) => a.t_ms - b.t_ms);
  const n = sorted.length;
  const pct = (count: number, of: number) => (of > 0 ? (count / of) * 100 : 0);
  let ok = 0,
    shallow = 0,
    deep = 0,
    recoil = 0,
    depthSum = 0;
  let rated = 0,
    ratedMs = 0,
    rateOk = 0,
    slow = 0,
    fast = 0;
  let pauses = 0,
    pausedMs = 0,
    longest = 0,
    long = 0;
  sorted.forEach((row, i) => {
    depthSum += row.depth_mm;
    if (row.depth_mm < band.depthMinMm) shallow++;
    else if (row.depth_mm > band.depthMaxMm) deep++;
    else ok++;
    if (row.release_mm <= band.recoilMaxMm) recoil++;
    if (i === 0) return;
    const d = row.t_ms - sorted[i - 1].t_ms;
    if (d / 1000 > pauseS) {
      pauses++;
      pausedMs += d;
      longest = Math.max(longest, d / 1000);
      if (d / 1000 > longS) long++;
      return;
    }
    rated++;
    ratedMs += d;
    const rate = 60000 / d;
    if (rate < band.rateMin) slow++;
    else if (rate > band.rateMax) fast++;
    else rateOk++;
  });
  const durationMs = n > 1 ? sorted[n - 1].t_ms - sorted[0].t_ms : 0;
  return {
    compressions: n,
    duration_s: durationMs / 1000,
    rate_cpm: rated > 0 ? (rated / ratedMs) * 60000 : 0,
    depth_mm: n > 0 ? depthSum / n : 0,
    depth_ok_pct: pct(ok, n),
    too_shallow_pct: pct(shallow, n),
    too_deep_pct: pct(deep, n),
    rate_ok_pct: pct(rateOk, rated),
    too_slow_pct: pct(slow, rated),
    too_fast_pct: pct(fast, rated),
    recoil_ok_pct: pct(recoil, n),
    hands_on_pct: durationMs > 0 ? (1 - pausedMs / durationMs) * 100 : 0,
    pauses,
    longest_pause_s: longest,
    pauses_over_10s: long,
  };
}
