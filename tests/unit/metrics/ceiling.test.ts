import { describe, expect, it } from "vitest";
import { ceilingFigures, medianAtCeiling } from "../../../server/metrics/ceiling";
import { quantile } from "../../../shared/stats";

describe("ceiling figures", () => {
  // worked by hand: values 60, 80, 90, 100 ×7 (10 attempts): 7 of 10 at 100; type-7 10th percentile at
  // h = 9 × 0.1 = 0.9 → 60 + 0.9 × (80 − 60) = 78 (Hyndman & Fan 1996)
  const counts = [
    { value: 60, count: 1 },
    { value: 80, count: 1 },
    { value: 90, count: 1 },
    { value: 100, count: 7 },
  ];

  it("gives the share at 100 % and the 10th percentile", () => {
    expect(ceilingFigures(counts)).toEqual({ shareAtCeiling: 0.7, p10: 78 });
    expect(quantile([60, 80, 90, ...Array(7).fill(100)], 0.1)).toBeCloseTo(78, 12);
  });

  it("knows when the median sits at the ceiling", () => {
    expect(medianAtCeiling(counts)).toBe(true);
    expect(
      medianAtCeiling([
        { value: 90, count: 6 },
        { value: 100, count: 4 },
      ]),
    ).toBe(false);
    expect(medianAtCeiling([])).toBe(false);
    expect(ceilingFigures([])).toEqual({ shareAtCeiling: null, p10: null });
  });
});
