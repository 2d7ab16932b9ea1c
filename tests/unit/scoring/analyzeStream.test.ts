// Stream analysis: hand-computed worked examples, degenerate streams, bad input and the typed-array core.
import { describe, expect, it } from "vitest";
import { analyzeSorted, analyzeStream, attemptMetricKeys, emptyMetrics, type AttemptMetrics, type CompressionRow } from "../../../shared/scoring/analyzeStream";
import { DEFAULT_POLICY } from "../../../shared/scoring/policy";
import { DuplicateTimestampError, InvalidStreamValueError, UnsortedTimestampError } from "../../../shared/scoring/streamErrors";
import { atTimes, exampleA } from "./streamFixtures";

const adult = DEFAULT_POLICY.bands.adult; // 50–60 mm, 100–120/min, full recoil ≤ 5 mm
const child = DEFAULT_POLICY.bands.child; // 45–55 mm, 100–120/min, full recoil ≤ 4 mm

describe("worked example A: 7 adult compressions with one 3 s pause", () => {
  const m = analyzeStream(exampleA, adult, DEFAULT_POLICY);

  it("counts compressions and duration", () => {
    expect(m.compressions).toBe(7);
    expect(m.duration_s).toBe(5.6); // (5600 − 0) / 1000
  });

  it("rates the intervals that are not pauses", () => {
    // Intervals: 500, 550, 600, 3000, 500, 450 ms. 3000 > 2000 is a pause; the other five are rated:
    // 500 → 120/min on target; 550 → 109.1 on target; 600 → 100 on target; 500 → 120 on target;
    // 450 → 133.3 too fast. Rated time 500+550+600+500+450 = 2600 ms.
    expect(m.rate_cpm).toBeCloseTo((60000 * 5) / 2600, 12); // 115.3846…
    expect(m.rate_ok_pct).toBe(80); // 4 of 5
    expect(m.too_fast_pct).toBe(20); // 1 of 5
    expect(m.too_slow_pct).toBe(0);
  });

  it("classes depth of every compression", () => {
    // Depths 52, 48, 55, 61, 57, 58, 50: 48 < 50 shallow, 61 > 60 deep, five on target.
    expect(m.depth_mm).toBeCloseTo(381 / 7, 12); // (52+48+55+61+57+58+50) / 7 = 54.43
    expect(m.depth_ok_pct).toBeCloseTo(500 / 7, 12); // 5/7 = 71.43 %
    expect(m.too_shallow_pct).toBeCloseTo(100 / 7, 12); // 14.29 %
    expect(m.too_deep_pct).toBeCloseTo(100 / 7, 12);
  });

  it("classes recoil", () => {
    // Releases 2, 1, 6, 3, 0, 5, 2: only 6 > 5 is incomplete; 6/7 = 85.71 %.
    expect(m.recoil_ok_pct).toBeCloseTo(600 / 7, 12);
  });

  it("measures pauses and hands-on time", () => {
    // One pause of 3.0 s; hands-on = 100 × (5600 − 3000) / 5600 = 46.43 %.
    expect(m.pauses).toBe(1);
    expect(m.longest_pause_s).toBe(3);
    expect(m.pauses_over_10s).toBe(0);
    expect(m.hands_on_pct).toBeCloseTo(260000 / 5600, 12);
  });

  it("gives the same result whatever the row order", () => {
    const shuffled = [exampleA[4], exampleA[0], exampleA[6], exampleA[2], exampleA[1], exampleA[5], exampleA[3]];
    expect(analyzeStream(shuffled, adult, DEFAULT_POLICY)).toEqual(m);
  });
});

describe("worked example B: 6 child compressions with one 11 s pause", () => {
  // Child band 45–55 mm, recoil ≤ 4 mm.
  const rows: CompressionRow[] = [
    { t_ms: 1000, depth_mm: 44, release_mm: 1 }, // too shallow (44 < 45)
    { t_ms: 1700, depth_mm: 46, release_mm: 4 }, // 700 ms → 85.7/min too slow; recoil 4 ≤ 4 full
    { t_ms: 2300, depth_mm: 50, release_mm: 5 }, // 600 ms → 100/min on target; recoil 5 > 4 incomplete
    { t_ms: 13_300, depth_mm: 55, release_mm: 0 }, // 11 000 ms gap → pause over 10 s
    { t_ms: 13_800, depth_mm: 56, release_mm: 0 }, // 500 ms → 120/min on target; too deep (56 > 55)
    { t_ms: 14_200, depth_mm: 48, release_mm: 2 }, // 400 ms → 150/min too fast
  ];
  const m = analyzeStream(rows, child, DEFAULT_POLICY);

  it("matches the hand computation", () => {
    expect(m.compressions).toBe(6);
    expect(m.duration_s).toBe(13.2); // (14200 − 1000) / 1000
    // Rated intervals 700, 600, 500, 400 = 2200 ms → 60000 × 4 / 2200 = 109.09/min.
    expect(m.rate_cpm).toBeCloseTo(240000 / 2200, 12);
    expect(m.too_slow_pct).toBe(25);
    expect(m.rate_ok_pct).toBe(50);
    expect(m.too_fast_pct).toBe(25);
    // Depths 44, 46, 50, 55, 56, 48: mean 299/6 = 49.83; 1 shallow, 1 deep, 4 on target.
    expect(m.depth_mm).toBeCloseTo(299 / 6, 12);
    expect(m.depth_ok_pct).toBeCloseTo(400 / 6, 12);
    expect(m.too_shallow_pct).toBeCloseTo(100 / 6, 12);
    expect(m.too_deep_pct).toBeCloseTo(100 / 6, 12);
    // Releases 1, 4, 5, 0, 0, 2: one incomplete → 5/6.
    expect(m.recoil_ok_pct).toBeCloseTo(500 / 6, 12);
    // Hands-on 100 × (13200 − 11000) / 13200 = 16.67 %.
    expect(m.hands_on_pct).toBeCloseTo(220000 / 13200, 12);
    expect(m.pauses).toBe(1);
    expect(m.longest_pause_s).toBe(11);
    expect(m.pauses_over_10s).toBe(1);
  });
});

describe("degenerate streams never give NaN", () => {
  const allFinite = (m: AttemptMetrics) => attemptMetricKeys.every((k) => typeof m[k] === "number" && Number.isFinite(m[k]));

  it("no compressions: every value is 0", () => {
    const m = analyzeStream([], adult, DEFAULT_POLICY);
    expect(m).toEqual(emptyMetrics());
    expect(allFinite(m)).toBe(true);
  });

  it("one compression: depth and recoil from it, no rate, no time", () => {
    const m = analyzeStream([{ t_ms: 250, depth_mm: 55, release_mm: 9 }], adult, DEFAULT_POLICY);
    expect(allFinite(m)).toBe(true);
    expect(m.compressions).toBe(1);
    expect(m.duration_s).toBe(0);
    expect(m.depth_mm).toBe(55);
    expect(m.depth_ok_pct).toBe(100);
    expect(m.recoil_ok_pct).toBe(0);
    expect(m.rate_cpm).toBe(0);
    expect([m.rate_ok_pct, m.too_slow_pct, m.too_fast_pct]).toEqual([0, 0, 0]);
    expect(m.hands_on_pct).toBe(0);
  });

  it("only pauses: no rated interval, zero hands-on time", () => {
    const m = analyzeStream(atTimes([0, 3000, 6000]), adult, DEFAULT_POLICY);
    expect(allFinite(m)).toBe(true);
    expect(m.rate_cpm).toBe(0);
    expect([m.rate_ok_pct, m.too_slow_pct, m.too_fast_pct]).toEqual([0, 0, 0]);
    expect(m.pauses).toBe(2);
    expect(m.hands_on_pct).toBe(0);
  });

  it("an interval exactly at the pause threshold is rated, not a pause", () => {
    const m = analyzeStream(atTimes([0, 2000]), adult, DEFAULT_POLICY);
    expect(m.pauses).toBe(0);
    expect(m.rate_cpm).toBe(30);
    expect(m.too_slow_pct).toBe(100);
    expect(m.hands_on_pct).toBe(100);
  });
});

describe("bad input gives a typed error naming the entry", () => {
  it("two rows at the same time", () => {
    const rows = atTimes([0, 500, 1000, 500]);
    const error = catchError(() => analyzeStream(rows, adult, DEFAULT_POLICY));
    expect(error).toBeInstanceOf(DuplicateTimestampError);
    expect(error).toMatchObject({ tMs: 500, otherIndex: 1, index: 3 });
    expect((error as Error).message).toContain("t_ms = 500");
  });

  it("a missing or non-numeric value", () => {
    const rows = [...atTimes([0, 500]), { t_ms: 1000, depth_mm: "deep", release_mm: 1 } as unknown as CompressionRow];
    const error = catchError(() => analyzeStream(rows, adult, DEFAULT_POLICY));
    expect(error).toBeInstanceOf(InvalidStreamValueError);
    expect(error).toMatchObject({ field: "depth_mm", index: 2 });
  });

  it("a negative depth or release", () => {
    const rows = [{ t_ms: 0, depth_mm: 50, release_mm: -1 }];
    expect(catchError(() => analyzeStream(rows, adult, DEFAULT_POLICY))).toMatchObject({
      field: "release_mm",
      index: 0,
    });
  });

  it("the typed core rejects unsorted, duplicate and non-finite times", () => {
    const depth = new Float64Array([55, 55, 55]);
    const release = new Float64Array([1, 1, 1]);
    const unsorted = catchError(() => analyzeSorted(new Float64Array([0, 600, 300]), depth, release, 0, 3, adult, DEFAULT_POLICY));
    expect(unsorted).toBeInstanceOf(UnsortedTimestampError);
    expect(unsorted).toMatchObject({ tMs: 300, previousTMs: 600, index: 2 });

    const duplicate = catchError(() => analyzeSorted(new Int32Array([0, 600, 600]), depth, release, 0, 3, adult, DEFAULT_POLICY));
    expect(duplicate).toBeInstanceOf(DuplicateTimestampError);
    expect(duplicate).toMatchObject({ tMs: 600, index: 2, otherIndex: 1 });

    const nan = catchError(() => analyzeSorted(new Float64Array([0, NaN, 1200]), depth, release, 0, 3, adult, DEFAULT_POLICY));
    expect(nan).toBeInstanceOf(InvalidStreamValueError);
    expect(nan).toMatchObject({ field: "t_ms", index: 1 });
  });

  it("the typed core rejects a non-finite depth or release", () => {
    const t = new Int32Array([0, 500, 1000]);
    const ok = new Float32Array([55, 55, 55]);
    expect(catchError(() => analyzeSorted(t, new Float32Array([55, NaN, 55]), ok, 0, 3, adult, DEFAULT_POLICY))).toMatchObject({ field: "depth_mm", index: 1 });
    expect(catchError(() => analyzeSorted(t, ok, new Float32Array([1, 1, Infinity]), 0, 3, adult, DEFAULT_POLICY))).toMatchObject({
      field: "release_mm",
      index: 2,
    });
  });

  it("the typed core rejects a range outside the arrays", () => {
    const a = new Float64Array(3);
    expect(() => analyzeSorted(a, a, a, 0, 4, adult, DEFAULT_POLICY)).toThrow(RangeError);
    expect(() => analyzeSorted(a, a, a, 2, 1, adult, DEFAULT_POLICY)).toThrow(RangeError);
  });
});

describe("typed-array core", () => {
  it("analyses a slice of shared arrays exactly as the row wrapper analyses that attempt", () => {
    // Two attempts stored back to back, as the importer holds them: example A, then a 120/min metronome.
    const second = atTimes([0, 500, 1000, 1500], 51, 0);
    const all = [...exampleA, ...second];
    const t = Int32Array.from(all, (r) => r.t_ms);
    const depth = Float32Array.from(all, (r) => r.depth_mm);
    const release = Float32Array.from(all, (r) => r.release_mm);

    const out = emptyMetrics();
    const first = { ...analyzeSorted(t, depth, release, 0, 7, adult, DEFAULT_POLICY, out) };
    expect(first).toEqual(analyzeStream(exampleA, adult, DEFAULT_POLICY));
    // The same `out` object is reused and fully overwritten.
    const again = analyzeSorted(t, depth, release, 7, 11, adult, DEFAULT_POLICY, out);
    expect(again).toBe(out);
    expect(again).toEqual(analyzeStream(second, adult, DEFAULT_POLICY));
  });
});

function catchError(fn: () => unknown): unknown {
  try {
    fn();
  } catch (error) {
    return error;
  }
  throw new Error("expected an error");
}
