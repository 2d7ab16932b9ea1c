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
    expect(pChart([])).toEqual({ centre: null, points: [] });
    const chart = pChart([
      { n: 0, count: 0 },
      { n: 10, count: 3 },
    ]);
    expect(chart.centre).toBeCloseTo(0.3, 12);
    expect(chart.points[0]).toEqual({ n: 0, count: 0, p: null, lcl: null, ucl: null, outside: false });
    expect(pChart([{ n: 0, count: 0 }]).centre).toBeNull();
  });

  it("rejects counts above n with the sample number", () => {
    expect(() => pChart([{ n: 10, count: 2 }, { n: 5, count: 6 }])).toThrow(/sample 2/);
  });
});
