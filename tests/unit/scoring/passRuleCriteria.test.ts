// The pass rule as a list of criteria: the criteria it marks missed must be exactly the errors scoreAttempt
// gives, for any metrics, so the attempt page's checklist can never disagree with the stored result.
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { passRuleCriteria } from "../../../shared/scoring/passRuleCriteria";
import { DEFAULT_POLICY } from "../../../shared/scoring/policy";
import { scoreAttempt } from "../../../shared/scoring/scoreAttempt";

const rule = DEFAULT_POLICY.passRule;
// values at, just beside and far from the default thresholds (70 %, 60 %, 10 s)
const pct = fc.oneof(fc.double({ min: 0, max: 100, noNaN: true }), fc.constantFrom(0, 59.9, 60, 60.1, 69.6, 69.96, 70, 70.04, 100));
const seconds = fc.oneof(fc.double({ min: 0, max: 30, noNaN: true }), fc.constantFrom(9.99, 10, 10.01));
const metrics = fc.record({
  compressions: fc.integer({ min: 2, max: 400 }),
  depth_ok_pct: pct,
  too_shallow_pct: pct,
  too_deep_pct: pct,
  rate_ok_pct: pct,
  too_slow_pct: pct,
  too_fast_pct: pct,
  recoil_ok_pct: pct,
  hands_on_pct: pct,
  longest_pause_s: seconds,
});

describe("passRuleCriteria", () => {
  it("misses exactly the criteria that give scoreAttempt's errors", () => {
    fc.assert(
      fc.property(metrics, (m) => {
        const missed = passRuleCriteria(m, rule).flatMap((c) => (c.met ? [] : [c.error]));
        expect(missed).toEqual(scoreAttempt(m, "adult", DEFAULT_POLICY).errors);
      }),
    );
  });

  it("gives the value as recorded, the threshold and the margin, and which way a share missed", () => {
    const [depth, rate, recoil, handsOn, pause] = passRuleCriteria(
      {
        compressions: 230,
        depth_ok_pct: 69.6,
        too_shallow_pct: 26.1,
        too_deep_pct: 4.3,
        rate_ok_pct: 56,
        too_slow_pct: 2,
        too_fast_pct: 42,
        recoil_ok_pct: 70,
        hands_on_pct: 78,
        longest_pause_s: 10.4,
      },
      rule,
    );
    expect(depth).toMatchObject({ value: 69.6, threshold: 70, comparison: "atLeast", met: false, error: "too_shallow", split: { low: 26.1, high: 4.3 } });
    expect(depth.margin).toBeCloseTo(-0.4, 12);
    expect(rate).toMatchObject({ met: false, error: "too_fast" });
    // exactly on the pass mark meets it ("at least 70 %")
    expect(recoil).toMatchObject({ value: 70, met: true, margin: 0, error: null });
    expect(handsOn).toMatchObject({ threshold: 60, met: true, margin: 18 });
    expect(pause).toMatchObject({ comparison: "atMost", met: false, error: "long_pause" });
    expect(pause.margin).toBeCloseTo(0.4, 12);
  });
});
