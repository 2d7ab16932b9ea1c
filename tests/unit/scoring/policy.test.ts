// The network policy schema and its defaults.
import { describe, expect, it } from "vitest";
import { DEFAULT_POLICY, GUIDELINE_SOURCES, networkPolicySchema, patientTypes, SAFETY_NOTE, type NetworkPolicy } from "../../../shared/scoring/policy";

const clone = (): NetworkPolicy => structuredClone(DEFAULT_POLICY);
const messages = (input: unknown) => {
  const result = networkPolicySchema.safeParse(input);
  return result.success ? [] : result.error.issues.map((i) => `${i.path.join(".")}: ${i.message}`);
};

describe("default policy", () => {
  it("is valid under its own schema", () => {
    expect(networkPolicySchema.parse(DEFAULT_POLICY)).toEqual(DEFAULT_POLICY);
  });

  it("uses the guideline targets", () => {
    // Rate 100–120/min for all ages: AHA 2020 (adult BLS table; Part 4 pediatric).
    for (const type of patientTypes) {
      expect(DEFAULT_POLICY.bands[type]).toMatchObject({ rateMin: 100, rateMax: 120 });
    }
    // Adult 5–6 cm: AHA 2020 adult BLS table (2–2.4 in) and ERC 2021 BLS.
    expect(DEFAULT_POLICY.bands.adult).toMatchObject({ depthMinMm: 50, depthMaxMm: 60 });
    // Infant about 4 cm, child about 5 cm (AHA 2020 Part 4), each ± 5 mm as a project default.
    expect(DEFAULT_POLICY.bands.infant).toMatchObject({ depthMinMm: 35, depthMaxMm: 45 });
    expect(DEFAULT_POLICY.bands.child).toMatchObject({ depthMinMm: 45, depthMaxMm: 55 });
    // Interruptions under 10 s: AHA 2020 adult BLS table.
    expect(DEFAULT_POLICY.longPauseLimitS).toBe(10);
    expect(DEFAULT_POLICY.passRule.maxLongestPauseS).toBe(10);
    // Chest compression fraction at least 60 %: AHA 2015 Part 5, kept in 2020 (from memory).
    expect(DEFAULT_POLICY.passRule.minHandsOnPct).toBe(60);
  });

  it("lists its guideline sources and a safety note", () => {
    expect(GUIDELINE_SOURCES.map((s) => s.id)).toEqual(["aha-2020-adult", "aha-2020-pediatric", "erc-2021-bls"]);
    expect(new Set(GUIDELINE_SOURCES.map((s) => s.id)).size).toBe(GUIDELINE_SOURCES.length);
    expect(SAFETY_NOTE).toMatch(/not a medical device/);
    expect(SAFETY_NOTE).toMatch(/local protocols/);
  });
});

describe("policy schema rejects bad input with readable messages", () => {
  it("minimum depth above maximum", () => {
    const p = clone();
    p.bands.child.depthMinMm = 60;
    expect(messages(p)).toEqual(["bands.child.depthMaxMm: Minimum depth must not exceed maximum depth"]);
  });

  it("minimum rate above maximum", () => {
    const p = clone();
    p.bands.adult.rateMin = 130;
    expect(messages(p)).toEqual(["bands.adult.rateMax: Minimum rate must not exceed maximum rate"]);
  });

  it("negative and zero values", () => {
    const p = clone();
    p.bands.infant.recoilMaxMm = -1;
    p.pauseThresholdS = 0;
    expect(messages(p)).toEqual([
      "bands.infant.recoilMaxMm: Largest residual depth for full recoil (mm) must not be negative",
      "pauseThresholdS: Pause threshold (s) must be greater than 0",
    ]);
  });

  it("percentages outside 0–100", () => {
    const p = clone();
    p.passRule.minDepthOkPct = 120;
    p.passRule.minHandsOnPct = -5;
    expect(messages(p)).toEqual([
      "passRule.minDepthOkPct: Minimum share of compressions at target depth (%) is a percentage and must be at most 100",
      "passRule.minHandsOnPct: Minimum hands-on time (%) must not be negative",
    ]);
  });

  it("non-numbers, fractions where whole numbers are needed, and missing fields", () => {
    const p = clone() as unknown as Record<string, unknown>;
    p.suppressionMinCount = 2.5;
    (p.equipment as Record<string, unknown>).serviceEveryDays = "yearly";
    delete p.passRule;
    expect(messages(p)).toEqual([
      "passRule: Invalid input: expected object, received undefined",
      "suppressionMinCount: Smallest group shown must be a whole number",
      "equipment.serviceEveryDays: Days between services must be a finite number",
    ]);
  });

  it("a fewest-instructors setting that is not a whole number of at least 1; a policy saved without it reads 3", () => {
    const p = clone() as unknown as Record<string, unknown>;
    p.suppressionMinInstructors = 0;
    expect(messages(p)).toEqual(["suppressionMinInstructors: Fewest other instructors in a group shown must be greater than 0"]);
    delete p.suppressionMinInstructors;
    expect(networkPolicySchema.parse(p).suppressionMinInstructors).toBe(3);
  });

  it("a long-pause limit shorter than the pause threshold", () => {
    const p = clone();
    p.longPauseLimitS = 1;
    expect(messages(p)).toEqual(["longPauseLimitS: The long-pause limit must not be shorter than the pause threshold"]);
  });

  it("a recoil tolerance as deep as the minimum depth", () => {
    const p = clone();
    p.bands.infant.recoilMaxMm = 35;
    expect(messages(p)).toEqual(["bands.infant.recoilMaxMm: The full-recoil tolerance must be smaller than the minimum depth"]);
  });
});
