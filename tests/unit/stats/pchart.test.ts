import { describe, expect, it } from "vitest";
import { pChart } from "../../../shared/stats";

// Montgomery, Introduction to Statistical Quality Control, Table 6.1 (orange-juice cans, n = 50),
// counts from memory — checked below to total 347 with samples 15 and 23 above the UCL.
const canCounts = [12, 15, 8, 10, 4, 7, 16, 9, 14, 10, 5, 6, 17, 12, 22, 8, 10, 5, 13, 11, 20, 18, 24, 15, 9, 12, 7, 13, 9, 6];
const canSamples = canCounts.map((count) => ({ n: 50, count }));

describe("pChart", () => {
  it("reproduces the trial limits of the orange-juice can example", () => {
    expect(canCounts).toHaveLength(30);
    expect(canCounts.reduce((sum, count) => sum + count, 0)).toBe(347);
    const chart = pChart(canSamples);
    // Montgomery, orange-juice can example: centre 0.2313333, LCL 0.05242755, UCL 0.4102391
    expect(chart.centre).toBeCloseTo(0.2313333, 7);
    expect(chart.points[0].lcl).toBeCloseTo(0.05242755, 8);
    expect(chart.points[0].ucl).toBeCloseTo(0.4102391, 7);
    // Montgomery: samples 15 and 23 plot above the UCL, no others outside
    const outside = chart.points.flatMap((point, index) => (point.outside ? [index + 1] : []));
    expect(outside).toEqual([15, 23]);
  });

  it("reproduces the revised limits after samples 15 and 23 are removed", () => {
    const revised = pChart(canSamples.filter((_, index) => index !== 14 && index !== 22));
    // Montgomery, revised limits: centre 0.215, LCL 0.04070284, UCL 0.3892972
    expect(revised.centre).toBeCloseTo(0.215, 10);
    expect(revised.points[0].lcl).toBeCloseTo(0.04070284, 8);
    expect(revised.points[0].ucl).toBeCloseTo(0.3892972, 7);
    // computed: original sample 21 (20/50 = 0.40) lies above the revised UCL (Montgomery discusses it; from memory)
    const outside = revised.points.flatMap((point) => (point.outside ? [point.count] : []));
    expect(outside).toEqual([20]);
  });

  it("gives each sample its own limits when sizes vary, clamping the LCL at 0", () => {
    const chart = pChart([
      { n: 100, count: 20 },
      { n: 4, count: 1 },
      { n: 96, count: 19 },
    ]);
    // hand-computed: centre 40/200 = 0.2; n = 100 → 0.2 ± 3·0.04 = 0.08–0.32; n = 4 → 0.2 − 0.6 < 0 → 0, 0.8
    expect(chart.centre).toBeCloseTo(0.2, 12);
    expect(chart.points[0].lcl).toBeCloseTo(0.08, 12);
    expect(chart.points[0].ucl).toBeCloseTo(0.32, 12);
    expect(chart.points[1].lcl).toBe(0);
    expect(chart.points[1].ucl).toBeCloseTo(0.8, 12);
    expect(chart.points.every((point) => !point.outside)).toBe(true);
  });

  it("handles empty samples and an empty chart without NaN", () => {
    expect(pChart([])).toEqual({ centre: null, sigmaZ: null, points: [] });
    const chart = pChart([
      { n: 0, count: 0 },
      { n: 10, count: 3 },
    ]);
    expect(chart.centre).toBeCloseTo(0.3, 12);
    expect(chart.points[0]).toEqual({ n: 0, count: 0, p: null, lcl: null, ucl: null, outside: false });
    expect(pChart([{ n: 0, count: 0 }]).centre).toBeNull();
  });

  it("rejects counts above n with the sample number", () => {
    expect(() =>
      pChart([
        { n: 10, count: 2 },
        { n: 5, count: 6 },
      ]),
    ).toThrow(/sample 2/);
  });
  it("takes centre and limits from a stated baseline, so later samples never move their own centre line", () => {
    // Montgomery's revised limits (samples 15 and 23 removed) as the baseline: centre 0.215, LCL 0.04070284,
    // UCL 0.3892972 at n = 50. New samples judged against it, worked by hand: 21/50 = 0.42 is above the UCL.
    const baseline = canSamples.filter((_, index) => index !== 14 && index !== 22);
    const judged = [
      { n: 50, count: 9 },
      { n: 50, count: 21 },
    ];
    const chart = pChart(judged, { baseline });
    expect(chart.centre).toBeCloseTo(0.215, 10);
    expect(chart.points[0].lcl).toBeCloseTo(0.04070284, 8);
    expect(chart.points[0].ucl).toBeCloseTo(0.3892972, 7);
    expect(chart.points.map((point) => point.outside)).toEqual([false, true]);
    // another quarter arriving changes nothing for the ones before
    const later = pChart([...judged, { n: 50, count: 2 }], { baseline });
    expect(later.centre).toBe(chart.centre);
    expect(later.points.slice(0, 2)).toEqual(chart.points);
  });

  it("widens the limits by Laney's σ_z from the baseline's moving ranges (Laney 2002)", () => {
    // worked by hand: counts 10, 20, 10, 20 of 100 → p̄ = 0.15, σ_p = √(0.15·0.85/100) = 0.0357071;
    // z = ∓1.40028, every moving range 2.80056, σ_z = 2.80056 / 1.128 = 2.48277; limits 0.15 ± 3·0.0357071·2.48277
    // = 0.15 ± 0.265957 → 0 (clamped) and 0.415957, against 0.042879 and 0.257121 without Laney's factor
    const samples = [10, 20, 10, 20].map((count) => ({ n: 100, count }));
    const laney = pChart(samples, { laney: true });
    expect(laney.sigmaZ).toBeCloseTo(2.48277, 5);
    expect(laney.points[0].lcl).toBe(0);
    expect(laney.points[0].ucl).toBeCloseTo(0.415957, 5);
    const plain = pChart(samples);
    expect(plain.sigmaZ).toBeNull();
    expect(plain.points[0].lcl).toBeCloseTo(0.042879, 5);
    expect(plain.points[0].ucl).toBeCloseTo(0.257121, 5);
  });

  it("keeps plain limits when the baseline has too few samples to estimate σ_z", () => {
    expect(pChart([{ n: 100, count: 10 }], { laney: true }).sigmaZ).toBeNull();
    expect(() => pChart([{ n: 10, count: 2 }], { baseline: [{ n: 5, count: 6 }] })).toThrow(/baseline sample 1/);
  });
});
