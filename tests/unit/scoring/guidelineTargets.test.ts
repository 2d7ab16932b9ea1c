// Stream analysis checked against published resuscitation targets. Each check names its source.
import { describe, expect, it } from "vitest";
import { analyzeStream } from "../../../shared/scoring/analyzeStream";
import { DEFAULT_POLICY } from "../../../shared/scoring/policy";
import { MM_PER_INCH, toMm } from "../../../shared/units";
import { atTimes, metronome, withDepths } from "./streamFixtures";

const adult = DEFAULT_POLICY.bands.adult;
const child = DEFAULT_POLICY.bands.child;
const infant = DEFAULT_POLICY.bands.infant;

describe("compression rate 100–120 per minute (AHA 2020 adult BLS table and Part 4 pediatric; ERC 2021 BLS)", () => {
  it("a metronome at exactly 100/min (600 ms) is on target", () => {
    const m = analyzeStream(metronome(30, 600), adult, DEFAULT_POLICY);
    expect(m.rate_ok_pct).toBe(100);
    expect(m.rate_cpm).toBe(100);
  });

  it("a metronome at exactly 120/min (500 ms) is on target", () => {
    const m = analyzeStream(metronome(30, 500), adult, DEFAULT_POLICY);
    expect(m.rate_ok_pct).toBe(100);
    expect(m.rate_cpm).toBe(120);
  });

  it("99.8/min (interval 60000/99.8 ms) is too slow", () => {
    const m = analyzeStream(metronome(30, 60000 / 99.8), adult, DEFAULT_POLICY);
    expect(m.rate_cpm).toBeCloseTo(99.8, 9);
    expect(m.too_slow_pct).toBe(100);
    expect(m.rate_ok_pct).toBe(0);
  });

  it("120.2/min (interval 60000/120.2 ms) is too fast", () => {
    const m = analyzeStream(metronome(30, 60000 / 120.2), adult, DEFAULT_POLICY);
    expect(m.rate_cpm).toBeCloseTo(120.2, 9);
    expect(m.too_fast_pct).toBe(100);
    expect(m.rate_ok_pct).toBe(0);
  });

  it("the same rate limits apply to child and infant bands (AHA 2020 Part 4)", () => {
    for (const band of [child, infant]) {
      expect(analyzeStream(metronome(10, 600, 40), band, DEFAULT_POLICY).rate_ok_pct).toBe(100);
      expect(analyzeStream(metronome(10, 60000 / 99.8, 40), band, DEFAULT_POLICY).too_slow_pct).toBe(100);
      expect(analyzeStream(metronome(10, 60000 / 120.2, 40), band, DEFAULT_POLICY).too_fast_pct).toBe(100);
    }
  });
});

describe("adult depth 5–6 cm (AHA 2020 adult BLS table: at least 2 in / 5 cm, not more than 2.4 in / 6 cm; ERC 2021: 5–6 cm)", () => {
  it("50.0 and 60.0 mm are on target", () => {
    const m = analyzeStream(withDepths([50.0, 60.0]), adult, DEFAULT_POLICY);
    expect(m.depth_ok_pct).toBe(100);
  });

  it("49.9 mm is too shallow and 60.1 mm too deep", () => {
    const m = analyzeStream(withDepths([49.9, 60.1]), adult, DEFAULT_POLICY);
    expect(m.depth_ok_pct).toBe(0);
    expect(m.too_shallow_pct).toBe(50);
    expect(m.too_deep_pct).toBe(50);
  });
});

describe("infant about 1.5 in (4 cm), child about 2 in (5 cm) (AHA 2020 Part 4, pediatric BLS)", () => {
  // 1 in = 25.4 mm exactly (international yard and pound agreement, 1959): 1.5 in = 38.1 mm, 2 in = 50.8 mm.
  it("1.5 in (38.1 mm) is on target for an infant", () => {
    expect(toMm(1.5, "in")).toBeCloseTo(38.1, 12);
    const m = analyzeStream(withDepths([1.5 * MM_PER_INCH, 1.5 * MM_PER_INCH]), infant, DEFAULT_POLICY);
    expect(m.depth_ok_pct).toBe(100);
  });

  it("2 in (50.8 mm) is on target for a child", () => {
    expect(toMm(2, "in")).toBe(50.8);
    const m = analyzeStream(withDepths([2 * MM_PER_INCH, 2 * MM_PER_INCH]), child, DEFAULT_POLICY);
    expect(m.depth_ok_pct).toBe(100);
  });

  it("an adult depth of 2 in is too deep for an infant", () => {
    expect(analyzeStream(withDepths([50.8]), infant, DEFAULT_POLICY).too_deep_pct).toBe(100);
  });
});

describe("interruptions under 10 s (AHA 2020 adult BLS table: do not interrupt compressions for more than 10 s)", () => {
  it("a 10.5 s gap is a pause and a long pause", () => {
    const m = analyzeStream(atTimes([0, 500, 1000, 11_500, 12_000]), adult, DEFAULT_POLICY);
    expect(m.pauses).toBe(1);
    expect(m.longest_pause_s).toBe(10.5);
    expect(m.pauses_over_10s).toBe(1);
  });

  it("a 9.5 s gap is a pause but not a long pause", () => {
    const m = analyzeStream(atTimes([0, 500, 1000, 10_500, 11_000]), adult, DEFAULT_POLICY);
    expect(m.pauses).toBe(1);
    expect(m.longest_pause_s).toBe(9.5);
    expect(m.pauses_over_10s).toBe(0);
  });
});

describe("full chest recoil, no leaning (AHA 2020 adult BLS table; the mm tolerance is a project default)", () => {
  it("residual depth at the tolerance is full recoil, just above it is not", () => {
    const rows = [
      { t_ms: 0, depth_mm: 55, release_mm: adult.recoilMaxMm },
      { t_ms: 500, depth_mm: 55, release_mm: adult.recoilMaxMm + 0.1 },
    ];
    expect(analyzeStream(rows, adult, DEFAULT_POLICY).recoil_ok_pct).toBe(50);
  });
});
