import { describe, expect, it } from "vitest";
import { classifyAgainstFunnel, funnelCurve, funnelLimits } from "../../../shared/stats";

describe("funnelLimits", () => {
  it("normal approximation, theta0 = 0.8, n = 50", () => {
    // Spiegelhalter, Stat Med 2005;24:1185–1202, theta0 ± z·sqrt(theta0(1 − theta0)/n); values computed, 4 dp
    const ninetyFive = funnelLimits(0.8, 50, { level: 0.95, method: "normal" });
    expect(ninetyFive.low).toBeCloseTo(0.6891, 4);
    expect(ninetyFive.high).toBeCloseTo(0.9109, 4);
    const ninetyNinePointEight = funnelLimits(0.8, 50, { level: 0.998, method: "normal" });
    expect(ninetyNinePointEight.low).toBeCloseTo(0.6252, 4);
    expect(ninetyNinePointEight.high).toBeCloseTo(0.9748, 4);
  });

  it("exact binomial with interpolation, theta0 = 0.8, n = 50", () => {
    // Spiegelhalter 2005, appendix A.1.1 (r_p − alpha)/n; values computed from that method, 4 dp
    const ninetyFive = funnelLimits(0.8, 50, { level: 0.95, method: "exact" });
    expect(ninetyFive.low).toBeCloseTo(0.6729, 4);
    expect(ninetyFive.high).toBeCloseTo(0.8956, 4);
    const ninetyNinePointEight = funnelLimits(0.8, 50, { level: 0.998, method: "exact" });
    expect(ninetyNinePointEight.low).toBeCloseTo(0.6009, 4);
    expect(ninetyNinePointEight.high).toBeCloseTo(0.9452, 4);
  });

  it("exact limits lie within one step 1/n of the plain binomial quantile", () => {
    // computed: r_p = 34 and 45 for p = 0.025 and 0.975 at n = 50, theta0 = 0.8; 0 ≤ alpha < 1
    const { low, high } = funnelLimits(0.8, 50, { level: 0.95, method: "exact" });
    expect(low).toBeGreaterThan(33 / 50);
    expect(low).toBeLessThanOrEqual(34 / 50);
    expect(high).toBeGreaterThan(44 / 50);
    expect(high).toBeLessThanOrEqual(45 / 50);
  });

  it("exact and normal limits converge for large n", () => {
    // computed: the binomial approaches the normal (de Moivre–Laplace); gap shrinks with n
    const exact = funnelLimits(0.8, 20_000, { level: 0.95, method: "exact" });
    const normal = funnelLimits(0.8, 20_000, { level: 0.95, method: "normal" });
    expect(Math.abs(exact.low - normal.low)).toBeLessThan(1e-3);
    expect(Math.abs(exact.high - normal.high)).toBeLessThan(1e-3);
  });

  it("clamps to [0, 1] and handles degenerate inputs without NaN", () => {
    const small = funnelLimits(0.95, 5, { level: 0.998, method: "normal" });
    expect(small.high).toBe(1);
    expect(funnelLimits(0.8, 0, { level: 0.95, method: "exact" })).toEqual({ low: 0, high: 1 });
    expect(funnelLimits(1, 30, { level: 0.95, method: "exact" })).toEqual({ low: 1, high: 1 });
    expect(funnelLimits(0, 30, { level: 0.998, method: "normal" })).toEqual({ low: 0, high: 0 });
    const tiny = funnelLimits(0.02, 3, { level: 0.998, method: "exact" });
    expect(tiny.low).toBe(0);
    expect(Number.isNaN(tiny.high)).toBe(false);
  });

  it("rejects an invalid target or size", () => {
    expect(() => funnelLimits(1.2, 10, { level: 0.95, method: "normal" })).toThrow(/theta/);
    expect(() => funnelLimits(0.5, 2.5, { level: 0.95, method: "exact" })).toThrow(/n must be/);
  });
});

describe("funnelCurve", () => {
  it("runs from n = 1 to nMax with a narrowing funnel", () => {
    const curve = funnelCurve(0.8, 500, { level: 0.95, method: "exact", points: 40 });
    expect(curve[0].n).toBe(1);
    expect(curve[curve.length - 1].n).toBe(500);
    for (let i = 1; i < curve.length; i += 1) {
      expect(curve[i].n).toBeGreaterThan(curve[i - 1].n);
    }
    const first = curve[0];
    const last = curve[curve.length - 1];
    expect(last.high - last.low).toBeLessThan(first.high - first.low);
    expect(last).toEqual({ n: 500, ...funnelLimits(0.8, 500, { level: 0.95, method: "exact" }) });
  });

  it("gives no points for nMax = 0", () => {
    expect(funnelCurve(0.8, 0, { level: 0.95, method: "normal" })).toEqual([]);
  });
});

describe("classifyAgainstFunnel", () => {
  it.each([
    // computed from the exact limits above (theta0 = 0.8, n = 50): 95 % 0.6729–0.8956, 99.8 % 0.6009–0.9452
    [30, "below998"], // 0.60
    [33, "below95"], // 0.66
    [40, "inside"], // 0.80
    [44, "inside"], // 0.88
    [45, "above95"], // 0.90
    [48, "above998"], // 0.96
  ] as const)("%i/50 is %s", (successes, expected) => {
    expect(classifyAgainstFunnel(successes, 50, 0.8)).toBe(expected);
  });

  it("uses the chosen method", () => {
    // computed: 0.90 is inside the normal 95 % limit 0.9109 but above the exact one 0.8956
    expect(classifyAgainstFunnel(45, 50, 0.8, "normal")).toBe("inside");
  });

  it("gives null when there is nothing to place", () => {
    expect(classifyAgainstFunnel(0, 0, 0.8)).toBeNull();
  });
});
