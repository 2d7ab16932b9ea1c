// Score and pass rule. The pass marks are the project defaults of the network policy (no guideline publishes
// a pass mark in percent of compressions); the 10 s pause limit is AHA 2020 (adult BLS table).
import { describe, expect, it } from "vitest";
import { analyzeStream } from "../../../shared/scoring/analyzeStream";
import { DEFAULT_POLICY, type NetworkPolicy } from "../../../shared/scoring/policy";
import {
  attemptErrorNames,
  errorsToMask,
  maskToErrors,
  scoreAttempt,
  ScoringInputError,
  type AttemptError,
  type ScoringInput,
} from "../../../shared/scoring/scoreAttempt";
import { exampleA } from "./streamFixtures";
import { errorLabels } from "../../../shared/vocabulary";

/** A device summary that passes every criterion; tests change one field at a time. */
const good: ScoringInput = {
  compressions: 60,
  depth_ok_pct: 90,
  too_shallow_pct: 6,
  too_deep_pct: 4,
  rate_ok_pct: 85,
  too_slow_pct: 10,
  too_fast_pct: 5,
  recoil_ok_pct: 95,
  hands_on_pct: 80,
  longest_pause_s: 4,
};
const score = (changes: Partial<ScoringInput>) => scoreAttempt({ ...good, ...changes }, "adult", DEFAULT_POLICY);

describe("scoreAttempt", () => {
  it("passes an attempt meeting every criterion; score is the mean of the three on-target shares", () => {
    expect(score({})).toEqual({ score: (90 + 85 + 95) / 3, passed: true, errors: [] });
  });

  it("passes at exactly the limits (70 %, 70 %, 70 %, 60 %, 10 s)", () => {
    const r = score({ depth_ok_pct: 70, rate_ok_pct: 70, recoil_ok_pct: 70, hands_on_pct: 60, longest_pause_s: 10 });
    expect(r.passed).toBe(true);
    expect(r.score).toBe(70);
  });

  it.each<[Partial<ScoringInput>, AttemptError]>([
    [{ depth_ok_pct: 69.9, too_shallow_pct: 20, too_deep_pct: 10.1 }, "too_shallow"],
    [{ depth_ok_pct: 69.9, too_shallow_pct: 10, too_deep_pct: 20.1 }, "too_deep"],
    [{ rate_ok_pct: 60, too_slow_pct: 30, too_fast_pct: 10 }, "too_slow"],
    [{ rate_ok_pct: 60, too_slow_pct: 10, too_fast_pct: 30 }, "too_fast"],
    [{ recoil_ok_pct: 69 }, "incomplete_recoil"],
    [{ hands_on_pct: 59.9 }, "low_hands_on"],
    [{ longest_pause_s: 10.5 }, "long_pause"],
  ])("fails %o with %s", (changes, error) => {
    const r = score(changes);
    expect(r.passed).toBe(false);
    expect(r.errors).toEqual([error]);
    expect(r.reason).toBeUndefined();
  });

  it("a tie between too shallow and too deep counts as too shallow", () => {
    expect(score({ depth_ok_pct: 50, too_shallow_pct: 25, too_deep_pct: 25 }).errors).toEqual(["too_shallow"]);
  });

  it("a tie between too slow and too fast counts as too slow", () => {
    expect(score({ rate_ok_pct: 0, too_slow_pct: 0, too_fast_pct: 0 }).errors).toEqual(["too_slow"]);
    expect(score({ rate_ok_pct: 40, too_slow_pct: 30, too_fast_pct: 30 }).errors).toEqual(["too_slow"]);
  });

  it("lists every failed criterion in the fixed order", () => {
    const r = score({
      depth_ok_pct: 0,
      too_shallow_pct: 0,
      too_deep_pct: 100,
      rate_ok_pct: 0,
      too_slow_pct: 0,
      too_fast_pct: 100,
      recoil_ok_pct: 0,
      hands_on_pct: 0,
      longest_pause_s: 30,
    });
    expect(r.errors).toEqual(["too_deep", "too_fast", "incomplete_recoil", "low_hands_on", "long_pause"]);
    expect(r.score).toBe(0);
  });

  it("fewer than 2 compressions cannot pass and says why, without technique errors", () => {
    const none = score({ compressions: 0 });
    expect(none.passed).toBe(false);
    expect(none.errors).toEqual([]);
    expect(none.reason).toMatch(/no compressions/i);
    const one = score({ compressions: 1 });
    expect(one.passed).toBe(false);
    expect(one.errors).toEqual([]);
    expect(one.reason).toMatch(/two/);
  });

  it("follows a network policy that changes the pass marks", () => {
    const strict: NetworkPolicy = { ...DEFAULT_POLICY, passRule: { ...DEFAULT_POLICY.passRule, minRateOkPct: 90 } };
    expect(scoreAttempt(good, "adult", strict).errors).toEqual(["too_slow"]);
  });

  it("scores worked example A: fails on hands-on time only", () => {
    // From analyzeStream.test.ts: depth 5/7 = 71.43 %, rate 80 %, recoil 6/7 = 85.71 %, hands-on 46.43 %.
    // Score (500/7 + 80 + 600/7) / 3 = 79.05.
    const r = scoreAttempt(analyzeStream(exampleA, DEFAULT_POLICY.bands.adult, DEFAULT_POLICY), "adult", DEFAULT_POLICY);
    expect(r.score).toBeCloseTo((500 / 7 + 80 + 600 / 7) / 3, 12);
    expect(r.passed).toBe(false);
    expect(r.errors).toEqual(["low_hands_on"]);
  });

  it("rejects unusable input with the field named", () => {
    expect(() => score({ depth_ok_pct: NaN })).toThrow(ScoringInputError);
    expect(() => score({ rate_ok_pct: 100.5 })).toThrow(/rate_ok_pct/);
    expect(() => score({ compressions: 2.5 })).toThrow(/compressions/);
    expect(() => score({ longest_pause_s: -1 })).toThrow(/longest_pause_s/);
    expect(() => scoreAttempt(good, "elderly" as never, DEFAULT_POLICY)).toThrow(/patient type/);
  });
});

describe("error labels and masks", () => {
  it("has a label for every error", () => {
    for (const name of attemptErrorNames) expect(errorLabels[name].length).toBeGreaterThan(5);
  });

  it("bit i stands for attemptErrorNames[i]", () => {
    expect(errorsToMask([])).toBe(0);
    expect(errorsToMask(["too_shallow"])).toBe(1);
    expect(errorsToMask(["too_deep"])).toBe(2);
    expect(errorsToMask(["long_pause"])).toBe(64);
    expect(errorsToMask(["too_slow", "incomplete_recoil"])).toBe(4 + 16);
  });

  it("round-trips every combination", () => {
    for (let mask = 0; mask < 1 << attemptErrorNames.length; mask++) {
      const errors = maskToErrors(mask);
      expect(errorsToMask(errors)).toBe(mask);
      expect(errors).toEqual(attemptErrorNames.filter((name) => errors.includes(name)));
    }
  });

  it("rejects unknown errors and masks", () => {
    expect(() => errorsToMask(["wobbly" as AttemptError])).toThrow(/wobbly/);
    expect(() => maskToErrors(128)).toThrow(RangeError);
    expect(() => maskToErrors(-1)).toThrow(RangeError);
    expect(() => maskToErrors(1.5)).toThrow(RangeError);
  });
});
