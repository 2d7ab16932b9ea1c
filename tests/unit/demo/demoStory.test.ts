// The demo network must give the screens something true to find. Each story is measured crudely from the
// generated rows, the way an analyst with a spreadsheet would: every attempt (summaries and streams, the
// streams analysed and all attempts scored with Quarterbeat's default policy), grouped and averaged.
import { beforeAll, describe, expect, it } from "vitest";
import { generateDemoNetwork } from "../../../server/demo/generate";
import type { AttemptError } from "../../../shared/scoring/scoreAttempt";
import { classifyAgainstFunnel, cohensKappa, kappaTableFromPairs } from "../../../shared/stats";
import { groupBy, mean, measuredAttempts, quarterOfDate, readFiles, type DemoFiles, type MeasuredAttempt } from "./demoRows";

const LOW_OUTLIER = "IN06";
const HIGH_OUTLIER = "IN08";

let files: DemoFiles;
let attempts: MeasuredAttempt[];

beforeAll(() => {
  files = readFiles(generateDemoNetwork({ seed: 20261201, today: "2026-12-01" }));
  attempts = measuredAttempts(files);
});

const passRate = (list: MeasuredAttempt[]) => mean(list.map((a) => (a.score.passed ? 1 : 0)));
const meanOf = (list: MeasuredAttempt[], value: (a: MeasuredAttempt) => number) => mean(list.map(value));

/** Mean share of compressions with each fault, for one group of attempts. */
function faultShares(list: MeasuredAttempt[]): Record<string, number> {
  return {
    too_shallow: meanOf(list, (a) => a.metrics.too_shallow_pct),
    too_deep: meanOf(list, (a) => a.metrics.too_deep_pct),
    too_slow: meanOf(list, (a) => a.metrics.too_slow_pct),
    too_fast: meanOf(list, (a) => a.metrics.too_fast_pct),
    incomplete_recoil: meanOf(list, (a) => 100 - a.metrics.recoil_ok_pct),
  };
}

/** The attempt error (as scored) that most attempts of the group have. */
function commonestError(list: MeasuredAttempt[]): AttemptError {
  const counts = new Map<AttemptError, number>();
  for (const a of list) for (const e of a.score.errors) counts.set(e, (counts.get(e) ?? 0) + 1);
  return [...counts].sort((x, y) => y[1] - x[1])[0][0];
}

const largest = (shares: Record<string, number>) => Object.entries(shares).sort((a, b) => b[1] - a[1])[0][0];

describe("demo story: faults by patient type", () => {
  it("infant attempts are most often too shallow", () => {
    const infants = attempts.filter((a) => a.profile === "infant");
    expect(infants.length).toBeGreaterThan(1000);
    expect(largest(faultShares(infants))).toBe("too_shallow");
    expect(commonestError(infants)).toBe("too_shallow");
  });

  it("adult attempts are most often too fast or leaning", () => {
    const adults = attempts.filter((a) => a.profile === "adult");
    const infants = attempts.filter((a) => a.profile === "infant");
    expect(["too_fast", "incomplete_recoil"]).toContain(largest(faultShares(adults)));
    expect(["too_fast", "incomplete_recoil"]).toContain(commonestError(adults));
    // More often than infants, too.
    expect(faultShares(adults).too_fast).toBeGreaterThan(faultShares(infants).too_fast);
    expect(faultShares(adults).incomplete_recoil).toBeGreaterThan(faultShares(infants).incomplete_recoil);
    expect(faultShares(adults).too_shallow).toBeLessThan(faultShares(infants).too_shallow);
  });
});

describe("demo story: live feedback", () => {
  it("scores lower with the live display hidden", () => {
    const hidden = attempts.filter((a) => a.feedback === "hidden");
    const live = attempts.filter((a) => a.feedback === "live");
    expect(hidden.length).toBeGreaterThan(1000);
    expect(live.length).toBeGreaterThan(1000);
    expect(meanOf(hidden, (a) => a.metrics.depth_ok_pct)).toBeLessThan(meanOf(live, (a) => a.metrics.depth_ok_pct) - 5);
    expect(passRate(hidden)).toBeLessThan(passRate(live) - 0.1);
  });
});

describe("demo story: instructors", () => {
  const byInstructor = () => groupBy(attempts, (a) => a.classRow.instructor);

  it("puts the low outlier last and the high outlier first", () => {
    const meanScore = [...byInstructor()].map(([code, list]) => ({ code, score: meanOf(list, (a) => a.score.score) }));
    meanScore.sort((a, b) => a.score - b.score);
    expect(meanScore[0].code).toBe(LOW_OUTLIER);
    expect(meanScore[meanScore.length - 1].code).toBe(HIGH_OUTLIER);
  });

  it("places exactly the two outliers beyond the 99.8 % funnel limits of the network's pass rate", () => {
    // Funnel limits for a proportion: Spiegelhalter, Stat Med 2005;24:1185–1202 (shared/stats, exact method).
    const network = passRate(attempts);
    const positions = Object.fromEntries(
      [...byInstructor()].map(([code, list]) => [code, classifyAgainstFunnel(list.filter((a) => a.score.passed).length, list.length, network)]),
    );
    expect(positions[LOW_OUTLIER]).toBe("below998");
    expect(positions[HIGH_OUTLIER]).toBe("above998");
    const others = Object.entries(positions).filter(([code]) => code !== LOW_OUTLIER && code !== HIGH_OUTLIER);
    expect(others.filter(([, position]) => position === "below998" || position === "above998")).toEqual([]);
  });
});

describe("demo story: instructors' own results", () => {
  it("pass more learners than the measurements do", () => {
    const judged = attempts.filter((a) => a.instructorResult !== "");
    const instructorPass = mean(judged.map((a) => (a.instructorResult === "pass" ? 1 : 0)));
    expect(instructorPass).toBeGreaterThan(passRate(judged) + 0.15);
    // The class log's completions, too.
    const learners = files.classes.reduce((sum, c) => sum + Number(c.learners), 0);
    const passed = files.classes.reduce((sum, c) => sum + Number(c.passed), 0);
    expect(passed / learners).toBeGreaterThan(passRate(attempts) + 0.15);
    // Some attempts carry no instructor result at all.
    expect(attempts.length - judged.length).toBeGreaterThan(100);
  });

  it("agree only modestly with the measurements", () => {
    const judged = attempts.filter((a) => a.instructorResult !== "");
    const table = kappaTableFromPairs(judged.map((a) => [a.instructorResult === "pass", a.score.passed] as const));
    const { kappa } = cohensKappa(table);
    // Landis & Koch (Biometrics 1977) call 0.21–0.40 "fair" agreement (from memory); allow a little either way.
    expect(kappa).toBeGreaterThan(0.15);
    expect(kappa).toBeLessThan(0.5);
  });
});

describe("demo story: the refresher", () => {
  it("is followed by clearly better results from 2026-Q2", () => {
    const byQuarter = groupBy(attempts, (a) => quarterOfDate(a.classRow.date));
    const year2025 = attempts.filter((a) => a.classRow.date < "2026-01-01");
    const afterRefresher = attempts.filter((a) => a.classRow.date >= "2026-04-01");
    expect(meanOf(afterRefresher, (a) => a.score.score)).toBeGreaterThan(meanOf(year2025, (a) => a.score.score) + 3);
    expect(passRate(afterRefresher)).toBeGreaterThan(passRate(year2025) + 0.08);
    // The refresher quarter itself is not yet the step up; every later quarter is above every 2025 quarter.
    const rate = (q: string) => passRate(byQuarter.get(q)!);
    expect(rate("2026-Q1")).toBeLessThan(passRate(afterRefresher));
    const best2025 = Math.max(...["2025-Q1", "2025-Q2", "2025-Q3", "2025-Q4"].map(rate));
    for (const q of ["2026-Q2", "2026-Q3", "2026-Q4"]) expect(rate(q)).toBeGreaterThan(best2025);
  });
});

describe("demo story: equipment", () => {
  it("shows a site that cleaned too few mouthpieces until autumn 2025", () => {
    const cleansPerLearner = (list: typeof files.classes) =>
      list.reduce((s, c) => s + Number(c.mouthpieces_cleaned), 0) / list.reduce((s, c) => s + Number(c.learners), 0);
    const logged = files.classes.filter((c) => c.mouthpieces_cleaned !== "");
    const gap = logged.filter((c) => c.site === "LTQ" && c.date < "2025-10-01");
    const elsewhere = logged.filter((c) => !(c.site === "LTQ" && c.date < "2025-10-01"));
    // Policy default: at least one clean per learner (shared/scoring/policy.ts).
    expect(cleansPerLearner(gap)).toBeLessThan(1);
    expect(cleansPerLearner(elsewhere)).toBeGreaterThanOrEqual(1);
  });
});
