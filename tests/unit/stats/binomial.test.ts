import { describe, expect, it } from "vitest";
import { binomialCdf, binomialLogPmf } from "../../../shared/stats";

// Exact check: with theta = a/b, P(R = k) = C(n, k) · a^k · (b − a)^(n − k) / b^n is a ratio of
// whole numbers, so BigInt gives the true value (computed from the binomial definition).
function exactCdf(r: number, n: number, a: bigint, b: bigint): { numerator: bigint; denominator: bigint } {
  let coefficient = 1n;
  let numerator = 0n;
  for (let k = 0; k <= r; k += 1) {
    if (k > 0) coefficient = (coefficient * BigInt(n - k + 1)) / BigInt(k);
    numerator += coefficient * a ** BigInt(k) * (b - a) ** BigInt(n - k);
  }
  return { numerator, denominator: b ** BigInt(n) };
}

function scaledRatio({ numerator, denominator }: { numerator: bigint; denominator: bigint }): number {
  const scale = 10n ** 40n;
  return Number((numerator * scale) / denominator) / 1e40;
}

describe("binomial distribution", () => {
  it("matches exact rational CDF values for n = 50, theta = 0.8 at every r", () => {
    for (let r = 0; r <= 50; r += 1) {
      const exact = exactCdf(r, 50, 4n, 5n);
      // b^50 fits a double, so Number() of both parts keeps ~16 significant digits even in the far tail
      const expected = Number(exact.numerator) / Number(exact.denominator);
      const actual = binomialCdf(r, 50, 0.8);
      expect(Math.abs(actual - expected)).toBeLessThanOrEqual(1e-12 * expected + 1e-300);
    }
  });

  it("stays accurate for large n (n = 1000, theta = 0.3)", () => {
    for (const r of [250, 280, 300, 320, 350]) {
      const expected = scaledRatio(exactCdf(r, 1000, 3n, 10n));
      expect(binomialCdf(r, 1000, 0.3)).toBeCloseTo(expected, 11);
    }
  });

  it("handles the ends of the range without NaN", () => {
    expect(binomialCdf(-1, 10, 0.5)).toBe(0);
    expect(binomialCdf(10, 10, 0.5)).toBe(1);
    expect(binomialCdf(0, 10, 0)).toBe(1);
    expect(binomialCdf(9, 10, 1)).toBe(0);
    expect(binomialLogPmf(11, 10, 0.5)).toBe(Number.NEGATIVE_INFINITY);
  });

  it("keeps total probability within the documented precision for n = 100 000", () => {
    // computed: P(R ≤ n − 1) = 1 − theta^n; log-gamma terms near 1e6 limit precision to about 1e-10 here
    expect(Math.abs(binomialCdf(99_999, 100_000, 0.5) - 1)).toBeLessThan(1e-9);
    // computed: by symmetry P(R ≤ m − 1) = (1 − P(R = m)) / 2 for n = 2m, theta = ½, and
    // P(R = m) = C(2m, m) / 4^m ≈ (1 − 1/(8m)) / sqrt(πm) (Stirling; next term ~1e-11 here)
    const m = 50_000;
    const middle = (1 - 1 / (8 * m)) / Math.sqrt(Math.PI * m);
    expect(Math.abs(binomialCdf(m - 1, 2 * m, 0.5) - (1 - middle) / 2)).toBeLessThan(1e-9);
  });
});
