import { describe, expect, it } from "vitest";
import fc from "fast-check";
import * as ss from "simple-statistics";
import { iqr, median, percentileRank, quantile } from "../../../shared/stats";

const oneToTen = [1, 2, 3, 4, 5, 6, 7, 8, 9, 10];

describe("quantile (R type 7)", () => {
  it("matches the type-7 quartiles of 1..10", () => {
    // Hyndman & Fan, Am Stat 1996;50:361–365, and R `quantile` documentation (type 7 is R's default);
    // values computed from the type-7 definition. Type 6 would give 2.75 and 8.25 instead.
    expect(quantile(oneToTen, 0.25)).toBeCloseTo(3.25, 12);
    expect(median(oneToTen)).toBeCloseTo(5.5, 12);
    expect(quantile(oneToTen, 0.75)).toBeCloseTo(7.75, 12);
    expect(iqr(oneToTen)).toBeCloseTo(4.5, 12); // computed: 7.75 − 3.25
  });

  it("returns the extremes at p = 0 and p = 1 and ignores input order", () => {
    const shuffled = [7, 3, 10, 1, 5, 9, 2, 8, 4, 6];
    expect(quantile(shuffled, 0)).toBe(1);
    expect(quantile(shuffled, 1)).toBe(10);
    expect(quantile(shuffled, 0.25)).toBeCloseTo(3.25, 12);
    expect(shuffled[0]).toBe(7); // the caller's array is not sorted in place
  });

  it("gives null for an empty sample instead of NaN", () => {
    expect(quantile([], 0.5)).toBeNull();
    expect(median([])).toBeNull();
    expect(iqr([])).toBeNull();
    expect(percentileRank([], 3)).toBeNull();
  });

  it("rejects p outside [0, 1] and non-finite values with a clear message", () => {
    expect(() => quantile(oneToTen, 1.5)).toThrow(/p must be between 0 and 1/);
    expect(() => quantile([1, Number.NaN], 0.5)).toThrow(/index 1/);
  });
});

describe("percentileRank (below + half of ties)", () => {
  it("counts values below plus half of those equal", () => {
    const values = [1, 2, 3, 3, 4];
    // hand-computed from the definition
    expect(percentileRank(values, 3)).toBeCloseTo(60, 12); // (2 + 2/2) / 5
    expect(percentileRank(values, 2.5)).toBeCloseTo(40, 12); // 2 / 5
    expect(percentileRank(values, 0)).toBe(0);
    expect(percentileRank(values, 9)).toBe(100);
    expect(percentileRank([5, 5, 5], 5)).toBeCloseTo(50, 12);
  });
});

// Second opinion: simple-statistics 7.12.1 (quantile, median, interquartileRange, quantileRank).
describe("agreement with simple-statistics on random samples", () => {
  const sample = fc.array(fc.double({ min: -1e6, max: 1e6, noNaN: true }), { minLength: 1, maxLength: 60 });
  const closeTo = (actual: number | null, expected: number) => actual !== null && Math.abs(actual - expected) <= 1e-9 * (1 + Math.abs(expected));

  it("quantile, median and IQR agree (both are type 7)", () => {
    fc.assert(
      fc.property(sample, fc.double({ min: 0, max: 1, noNaN: true }), (values, p) => {
        expect(closeTo(quantile(values, p), ss.quantile(values, p))).toBe(true);
        expect(closeTo(median(values), ss.median(values))).toBe(true);
        expect(closeTo(iqr(values), ss.interquartileRange(values) as number)).toBe(true);
      }),
      { numRuns: 500 },
    );
  });

  it("percentileRank agrees with quantileRank for values not in the sample", () => {
    fc.assert(
      fc.property(sample, fc.double({ min: -2e6, max: 2e6, noNaN: true }), (values, x) => {
        fc.pre(!values.includes(x));
        expect(closeTo(percentileRank(values, x), 100 * ss.quantileRank(values, x))).toBe(true);
      }),
      { numRuns: 500 },
    );
  });

  it("percentileRank sits half a sample below quantileRank for values in the sample", () => {
    // simple-statistics places a tied block at the mean of its 1-based ranks, (below + (equal + 1) / 2) / n;
    // our definition uses (below + equal / 2) / n, so the two differ by exactly 1 / (2n).
    fc.assert(
      fc.property(fc.array(fc.integer({ min: 0, max: 8 }), { minLength: 1, maxLength: 40 }), fc.nat(), (values, pick) => {
        const x = values[pick % values.length];
        const expected = 100 * ss.quantileRank(values, x) - 50 / values.length;
        expect(closeTo(percentileRank(values, x), expected)).toBe(true);
      }),
      { numRuns: 500 },
    );
  });
});
