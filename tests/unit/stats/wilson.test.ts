import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { wilsonInterval } from "../../../shared/stats";

describe("wilsonInterval", () => {
  it.each([
    // Newcombe, Stat Med 1998;17:857–872, Table I, method 3 (score, no continuity correction), 4 dp
    [81, 263, 0.2553, 0.3662],
    [15, 148, 0.0624, 0.1605],
    [0, 20, 0, 0.1611],
    [1, 29, 0.0061, 0.1718],
  ])("%i/%i → %f–%f (Newcombe 1998, Table I)", (successes, n, low, high) => {
    const interval = wilsonInterval(successes, n);
    expect(interval).not.toBeNull();
    const [actualLow, actualHigh] = interval!;
    expect(actualLow).toBeCloseTo(low, 4);
    expect(actualHigh).toBeCloseTo(high, 4);
  });

  it("gives null when there are no attempts", () => {
    expect(wilsonInterval(0, 0)).toBeNull();
  });

  it("rejects impossible counts", () => {
    expect(() => wilsonInterval(5, 3)).toThrow(/successes/);
    expect(() => wilsonInterval(1, -1)).toThrow(/n must be/);
  });

  it("stays in [0, 1], contains the observed proportion and mirrors for failures", () => {
    // properties of the score interval (Wilson 1927): not a published value, but each can fail
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 5000 }), fc.nat(), (n, raw) => {
        const successes = raw % (n + 1);
        const [low, high] = wilsonInterval(successes, n)!;
        const [mirrorLow, mirrorHigh] = wilsonInterval(n - successes, n)!;
        const p = successes / n;
        expect(low).toBeGreaterThanOrEqual(0);
        expect(high).toBeLessThanOrEqual(1);
        expect(low).toBeLessThanOrEqual(p + 1e-12);
        expect(high).toBeGreaterThanOrEqual(p - 1e-12);
        expect(mirrorLow).toBeCloseTo(1 - high, 12);
        expect(mirrorHigh).toBeCloseTo(1 - low, 12);
      }),
      { numRuns: 300 },
    );
  });
});
