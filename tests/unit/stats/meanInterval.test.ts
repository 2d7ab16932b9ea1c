import { describe, expect, it } from "vitest";
import { meanWithInterval } from "../../../shared/stats";

describe("meanWithInterval", () => {
  it("gives the mean, s/√n and mean ± 1.959964·SE (worked by hand; SE of a mean difference as in Bland & Altman, Lancet 1986;1:307–310)", () => {
    // mean 3; s² = (4 + 1 + 0 + 1 + 4) / 4 = 2.5; SE = √(2.5 / 5) = 0.70710678; 1.959964 × SE = 1.38590
    const r = meanWithInterval([1, 2, 3, 4, 5]);
    expect(r.n).toBe(5);
    expect(r.mean).toBe(3);
    expect(r.se).toBeCloseTo(0.70710678, 8);
    expect(r.ci95![0]).toBeCloseTo(1.614096, 5);
    expect(r.ci95![1]).toBeCloseTo(4.385904, 5);
  });

  it("has no standard error for fewer than two values, and nothing for none", () => {
    expect(meanWithInterval([4])).toEqual({ n: 1, mean: 4, se: null, ci95: null });
    expect(meanWithInterval([])).toEqual({ n: 0, mean: null, se: null, ci95: null });
  });

  it("gives a zero-width interval when every difference is the same", () => {
    expect(meanWithInterval([2, 2, 2])).toEqual({ n: 3, mean: 2, se: 0, ci95: [2, 2] });
  });
});
