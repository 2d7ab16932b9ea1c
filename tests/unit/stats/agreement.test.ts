import { describe, expect, it } from "vitest";
import { kappaInterval, mcnemarExactP, pabak } from "../../../shared/stats/agreement";

const table = [
  [40, 9],
  [6, 45],
] as const;

describe("agreement beyond kappa", () => {
  it("gives kappa's 95 % interval from the large-sample standard error", () => {
    // κ 0.6995 (Gerstman, Epidemiology Kept Simple, Example 10.1); SE 0.07139 from the large-sample formula
    // of Fleiss, Cohen & Everitt, Psychological Bulletin 1969;72:323 → 0.5596–0.8394 (computed, and agrees
    // with a general-purpose statistics library)
    const [low, high] = kappaInterval(table)!;
    expect(low).toBeCloseTo(0.5596, 3);
    expect(high).toBeCloseTo(0.8394, 3);
    // [[80, 10], [5, 5]]: κ 0.3182 (Gerstman, Example 10.2), SE 0.13346 → 0.0566–0.5798 (same formula)
    const [low2, high2] = kappaInterval([
      [80, 10],
      [5, 5],
    ])!;
    expect(low2).toBeCloseTo(0.0566, 3);
    expect(high2).toBeCloseTo(0.5798, 3);
  });

  it("gives PABAK = 2·p0 − 1", () => {
    // p0 = 85/100 → 0.70 (Byrt, Bishop & Carlin, J Clin Epidemiol 1993;46:423)
    expect(pabak(table)).toBeCloseTo(0.7, 12);
  });

  it("gives the exact McNemar p for 9 against 6 disagreements", () => {
    // 2 × P(X ≤ 6), X ~ Binomial(15, 0.5) = 0.6072 (McNemar 1947, exact binomial form)
    expect(mcnemarExactP(table)).toBeCloseTo(0.6072, 4);
    expect(
      mcnemarExactP([
        [5, 0],
        [0, 5],
      ]),
    ).toBe(1);
  });

  it("has no interval for an empty table", () => {
    expect(
      kappaInterval([
        [0, 0],
        [0, 0],
      ]),
    ).toBeNull();
  });
});
