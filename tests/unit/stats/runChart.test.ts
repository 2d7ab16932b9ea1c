import { describe, expect, it } from "vitest";
import { runChartLimits, runChartSignals } from "../../../shared/stats/runChart";

describe("runChartLimits", () => {
  // Anhøj & Olesen, "Run charts revisited", PLoS One 2014;9:e113825, Table 1: useful points → longest run
  // allowed, fewest crossings expected
  it.each([
    [10, 6, 2],
    [12, 7, 3],
    [16, 7, 4],
    [20, 7, 6],
    [24, 8, 8],
    [30, 8, 10],
    [40, 8, 14],
    [50, 9, 19],
  ])("n = %i: run > %i or crossings < %i signals a shift", (n, run, crossings) => {
    expect(runChartLimits(n)).toEqual({ longestRun: run, fewestCrossings: crossings });
  });
});

describe("runChartSignals", () => {
  it("finds no shift in a series that crosses its median often", () => {
    const signals = runChartSignals([3, 7, 2, 8, 4, 6, 1, 9, 3, 7])!;
    expect(signals).toMatchObject({ median: 5, useful: 10, run: 1, crossings: 9, shift: false });
  });

  it("signals a step change: a run of 7 below and then above a baseline median (n = 12: runs over 7 signal)", () => {
    // baseline median 10; 4 points below, then 8 above: the run of 8 exceeds 7
    const signals = runChartSignals([8, 9, 7, 9, 12, 13, 11, 12, 14, 12, 13, 11], 10)!;
    expect(signals).toMatchObject({ useful: 12, run: 8, crossings: 1, shift: true });
  });

  it("leaves points on the median out", () => {
    expect(runChartSignals([5, 5, 5], 5)).toBeNull();
    expect(runChartSignals([4, 5, 6], 5)).toMatchObject({ useful: 2, crossings: 1 });
  });
});
