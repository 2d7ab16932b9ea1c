import { chiSquaredDistributionTable } from "simple-statistics";
import { describe, expect, it } from "vitest";
import { chiSquaredCdf, chiSquaredQuantile } from "../../../shared/stats/chiSquared";
import { dispersionOf, positionOfZ, scaledFunnelLimits } from "../../../shared/stats/overdispersion";

describe("chiSquaredQuantile", () => {
  // R 4.x: qchisq(0.95, df) for df = 1, 2, 5, 6, 10, 29, 100 and qchisq(0.5, 1) (from memory of R's output;
  // the same values are in any χ² table to the decimals printed there)
  it.each([
    [0.95, 1, 3.841459],
    [0.95, 2, 5.991465],
    [0.95, 5, 11.070498],
    [0.95, 6, 12.591587],
    [0.95, 10, 18.307038],
    [0.95, 29, 42.556968],
    [0.95, 100, 124.342113],
    [0.5, 1, 0.4549364],
  ])("qchisq(%f, %i) = %f", (p, df, expected) => {
    expect(chiSquaredQuantile(p, df)).toBeCloseTo(expected, 5);
  });

  it("matches every row of simple-statistics' table (Hines & Montgomery 1980, two decimals)", () => {
    const rows = Object.entries(chiSquaredDistributionTable);
    expect(rows.length).toBeGreaterThan(30);
    for (const [df, row] of rows) {
      // the table is keyed by the upper tail: 0.05 is the 95th percentile, 0.5 the median; a few entries are
      // cut rather than rounded (df 90: 113.14 for 113.1453), hence a little over half a unit in the last place
      expect(Math.abs(chiSquaredQuantile(0.95, Number(df)) - row[0.05]), `df ${df}`).toBeLessThanOrEqual(0.006);
      expect(Math.abs(chiSquaredQuantile(0.5, Number(df)) - row[0.5]), `df ${df}`).toBeLessThanOrEqual(0.006);
    }
  });

  it("is the inverse of the distribution function", () => {
    expect(chiSquaredCdf(chiSquaredQuantile(0.9, 37), 37)).toBeCloseTo(0.9, 10);
    expect(chiSquaredCdf(0, 3)).toBe(0);
    expect(() => chiSquaredQuantile(1, 3)).toThrow(/below 1/);
    expect(() => chiSquaredQuantile(0.5, 0)).toThrow(/degrees of freedom/);
  });
});

describe("dispersionOf (Spiegelhalter 2005, Qual Saf Health Care 14:347)", () => {
  it("winsorises at the type-7 10th and 90th percentiles before averaging the squares (worked by hand)", () => {
    // z = −3, −1, 0, 0.5, 1, 2, 4: Q10 = −3 + 0.6·2 = −1.8, Q90 = 2 + 0.4·2 = 2.8; winsorised squares
    // 3.24 + 1 + 0 + 0.25 + 1 + 4 + 7.84 = 17.33, φ = 17.33 / 7 = 2.475714; I·φ = 17.33 > qchisq(0.95, 6) = 12.5916
    const result = dispersionOf([-3, -1, 0, 0.5, 1, 2, 4]);
    expect(result.phi).toBeCloseTo(2.475714, 6);
    expect(result.threshold).toBeCloseTo(12.591587, 5);
    expect(result.overdispersed).toBe(true);
    expect(result.scale).toBeCloseTo(Math.sqrt(2.475714), 6);
  });

  it("keeps the plain limits when I·φ stays under the χ² threshold", () => {
    // Q10 = −1 + 0.6·0.5 = −0.7, Q90 = 1 + 0.4·0.2 = 1.08; squares 0.49 + 0.25 + 0 + 0.04 + 0.49 + 1 + 1.1664
    // = 3.4364, under 12.59
    const result = dispersionOf([-1, -0.5, 0, 0.2, 0.7, 1, 1.2]);
    expect(result.phi).toBeCloseTo(3.4364 / 7, 6);
    expect(result.overdispersed).toBe(false);
    expect(result.scale).toBe(1);
  });

  it("has no estimate with fewer than two units", () => {
    expect(dispersionOf([2.5])).toMatchObject({ phi: null, overdispersed: false, scale: 1 });
  });
});

describe("positionOfZ", () => {
  it("flags beyond ±1.959964 and ±3.090232 times the scale; a z on a limit is inside", () => {
    expect(positionOfZ(1.959964)).toBe("inside");
    expect(positionOfZ(1.97)).toBe("above95");
    expect(positionOfZ(-3.1)).toBe("below998");
    expect(positionOfZ(3.1, 1.5)).toBe("above95");
    expect(positionOfZ(-2.5, 1.5)).toBe("inside");
  });

  it("draws limits that a z-score on them reaches exactly", () => {
    const limits = scaledFunnelLimits(0.6, 40, 1.5);
    expect((limits.high95 - 0.6) / Math.sqrt(0.24 / 40)).toBeCloseTo(1.959964 * 1.5, 10);
  });
});
