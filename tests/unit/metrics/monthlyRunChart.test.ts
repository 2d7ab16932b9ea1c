// The monthly run chart's phases and its rules for short series (server/metrics/monthlyRunChart.ts).
import { describe, expect, it } from "vitest";
import { phaseOfMonth, runChartRules } from "../../../server/metrics/monthlyRunChart";

describe("phaseOfMonth", () => {
  it("counts the start's own month on neither side unless the action starts on its first day", () => {
    expect(phaseOfMonth("2026-01", "2026-02-15")).toBe("before");
    expect(phaseOfMonth("2026-02", "2026-02-15")).toBe("transition");
    expect(phaseOfMonth("2026-03", "2026-02-15")).toBe("after");
    expect(phaseOfMonth("2026-02", "2026-02-01")).toBe("after");
  });
});

describe("runChartRules", () => {
  it("applies Anhøj's limits to the points off the centre", () => {
    // 10 points alternating around 0.5, one on it: 9 useful, 8 crossings; limits for 9 useful points
    // (Anhøj & Olesen 2014, PLoS One 9:e113825): round(log2(9) + 3) = 6, and the 5th percentile of
    // Binomial(8, 0.5) is 2 (P(X ≤ 1) = 9/256 = 0.035, P(X ≤ 2) = 37/256 = 0.145)
    const rates = [0.4, 0.6, 0.4, 0.6, 0.5, 0.4, 0.6, 0.4, 0.6, 0.4];
    expect(runChartRules(rates, 0.5)).toEqual({ median: 0.5, useful: 9, longestRun: 1, longestRunLimit: 6, crossings: 8, crossingsLimit: 2, signal: false });
  });

  it("signals nothing with fewer than two useful points, and has no limits without any", () => {
    expect(runChartRules([0.7], 0.5)).toEqual({ median: 0.5, useful: 1, longestRun: 1, longestRunLimit: 3, crossings: 0, crossingsLimit: 0, signal: false });
    expect(runChartRules([0.5, 0.5], 0.5)).toEqual({
      median: 0.5,
      useful: 0,
      longestRun: 0,
      longestRunLimit: null,
      crossings: 0,
      crossingsLimit: null,
      signal: false,
    });
    expect(runChartRules([], null)).toMatchObject({ median: null, useful: 0, signal: false });
  });
});
