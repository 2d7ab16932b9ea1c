// The report's figures for the invented network in fixture.ts, worked out by hand from the fixture's rows.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Db } from "../../../server/db/client";
import { buildReportData, saveQuarterNotes } from "../../../server/reports/data";
import { reportNumbers } from "../../../server/reports/queries";
import { saveChartBaseline } from "../../../server/insight/chartBaseline";
import { quarterSummary } from "../../../server/stats/quarterSummary";
import type { ReportData } from "../../../shared/schemas/report";
import { attemptErrorNames } from "../../../shared/scoring/scoreAttempt";
import { makeTestDb, seedPeople } from "../../helpers/testApp";
import { insertReportFixture } from "./fixture";

let db: Db;
let q3: ReportData;

beforeAll(async () => {
  db = makeTestDb();
  insertReportFixture(db, await seedPeople(db));
  saveQuarterNotes(db, "2026-Q3", "Depth drill at the start of every class.", null);
  q3 = buildReportData(db, "2026-Q3", { now: new Date("2026-10-02T09:30:00Z") });
});
afterAll(() => db.$client.close());

describe("report data for 2026-Q3", () => {
  it("counts reach, hides the instructors (2) and shows the sites (2), which describe no person", () => {
    expect(q3.hasData).toBe(true);
    expect(q3.reach.learners.value).toBe(10 + 8 + 6 + 9 + 3 + 12);
    expect(q3.reach.attempts.value).toBe(40);
    expect(q3.reach.instructors).toEqual({ value: null, hidden: "small", text: "fewer than 5" });
    expect(q3.reach.sites).toEqual({ value: 2, hidden: null, text: "2" });
  });

  it("shows this quarter's 6 classes and hides the year's 7, which less them would be 2026-Q2's single class", () => {
    expect(q3.reach.classes).toEqual({ value: 6, hidden: null, text: "6" });
    expect(buildReportData(db, "2026-Q2").reach.classes).toEqual({ value: null, hidden: "small", text: "fewer than 5" });
    expect(buildReportData(db, "2026").reach.classes).toEqual({ value: null, hidden: "protects-other", text: "not shown" });
  });

  it('splits learners by course: infant (3) hidden with child (6), no all-ages learners reads "no data"', () => {
    const learners = Object.fromEntries(q3.reach.byCourse.map((c) => [c.key, c.learners.text]));
    expect(learners).toEqual({ adult: "39", child: "not shown", infant: "fewer than 5", "all-ages": "no data" });
    // classes per course are 4, 1, 1 and 0: under 5, except the empty one
    expect(q3.reach.byCourse.map((c) => c.classes.text)).toEqual(["fewer than 5", "fewer than 5", "fewer than 5", "no data"]);
  });

  it("gives the objective pass rate 26/40 with its Wilson 95 % interval", () => {
    // Wilson score interval without continuity correction (Newcombe, Stat Med 1998, method 3), computed by
    // hand for 26/40: 0.49506 – 0.77865.
    expect(q3.passRate.value).toBe(0.65);
    expect(q3.passRate.low).toBeCloseTo(0.49506, 4);
    expect(q3.passRate.high).toBeCloseTo(0.77865, 4);
    expect(q3.passRate.text).toBe("65.0 %");
    expect(q3.passRate.intervalText).toBe("49.5–77.9 %");
  });

  it("compares with the previous quarter (6/20, clearly lower) and the same quarter last year (6/10, no clear change)", () => {
    const [previous, lastYear] = q3.comparisons;
    expect(previous.period).toBe("2026-Q2");
    expect(previous.passRate.value).toBe(0.3);
    // 26/40 − 6/20 = +35 points, 95 % interval +8.2 to +55.1 (Newcombe's hybrid score): up
    expect(previous.verdict).toBe("up");
    expect(previous.changePoints).toBeCloseTo(35, 6);
    expect(previous.relativeChange).toBeCloseTo(0.35 / 0.3, 6);
    expect(lastYear.period).toBe("2025-Q3");
    expect(lastYear.passRate.value).toBe(0.6);
    // 26/40 − 6/10 = +5 points, 95 % interval −22.9 to +36.5: no clear change
    expect(lastYear.verdict).toBe("no clear change");
  });

  it("draws eight quarters with p-chart limits around the baseline's centre 38/70", () => {
    expect(q3.trend.points.map((p) => p.quarter)).toEqual(["2024-Q4", "2025-Q1", "2025-Q2", "2025-Q3", "2025-Q4", "2026-Q1", "2026-Q2", "2026-Q3"]);
    // the overview's default baseline, the first four quarters with attempts: here only three exist
    // (2025-Q3 6/10, 2026-Q2 6/20, 2026-Q3 26/40)
    expect(q3.trend.baseline).toEqual({ from: "2025-Q3", to: "2026-Q3" });
    expect(q3.trend.centre).toBeCloseTo(38 / 70, 10);
    const last = q3.trend.points[7];
    // Montgomery's p-chart: p̄ ± 3·sqrt(p̄(1 − p̄)/n), computed by hand for p̄ = 38/70, n = 40
    expect(last.lcl).toBeCloseTo(0.30656, 4);
    expect(last.ucl).toBeCloseTo(0.77916, 4);
    expect(last.outside).toBe(false);
    // quarters without attempts have no data, and no limits: nothing is hidden there
    expect(q3.trend.points[0]).toMatchObject({ lcl: null, ucl: null, passRate: { value: null, hidden: null, text: "no data" } });
  });

  it("never takes the centre from quarters after the report's period, and follows a coordinator's baseline", () => {
    // 2026-Q2's report: the baseline is cut at its own last quarter, 6/10 + 6/20 = 12/30
    const q2 = buildReportData(db, "2026-Q2");
    expect(q2.trend.baseline).toEqual({ from: "2025-Q3", to: "2026-Q2" });
    expect(q2.trend.centre).toBeCloseTo(12 / 30, 10);
    saveChartBaseline(db, { from: "2026-Q2", to: "2026-Q2" });
    try {
      const withSetting = buildReportData(db, "2026-Q3");
      expect(withSetting.trend.baseline).toEqual({ from: "2026-Q2", to: "2026-Q2" });
      // Montgomery's p-chart around p̄ = 6/20 = 0.3 for n = 40: 0.3 ± 3·√(0.3 · 0.7 / 40) = 0.082630 to 0.517370;
      // 26/40 = 0.65 lies above it
      expect(withSetting.trend.centre).toBeCloseTo(0.3, 10);
      expect(withSetting.trend.points[7]).toMatchObject({ outside: true });
      expect(withSetting.trend.points[7].ucl).toBeCloseTo(0.51737, 4);
      // a report of a period before the baseline has no centre and no limits to judge it by
      const early = buildReportData(db, "2025-Q3");
      expect(early.trend).toMatchObject({ centre: null, baseline: null });
      expect(early.trend.points.every((p) => p.lcl === null && p.ucl === null && !p.outside)).toBe(true);
    } finally {
      saveChartBaseline(db, null);
    }
  });

  it("hides the 2 infant attempts and, so the total cannot reveal them, the 6 child attempts", () => {
    const byType = Object.fromEntries(q3.byPatientType.map((g) => [g.key, g]));
    expect(byType.infant.attempts.hidden).toBe("small");
    expect(byType.child.attempts).toEqual({ value: null, hidden: "protects-other", text: "not shown" });
    expect(byType.child.passRate.value).toBeNull();
    expect(byType.adult.attempts.value).toBe(32);
    expect(byType.adult.passRate.text).toBe("68.8 %");
  });

  it('ranks errors: 11 too shallow shown, the three under 5 hidden together with their shares, the absent ones "no data"', () => {
    const [first, ...rest] = q3.errors.rows;
    expect(first.name).toBe("too_shallow");
    expect(first.count.value).toBe(11);
    // 17 errors in all (11 too shallow, 3 too fast, 2 recoil, 1 long pause)
    expect(first.share).toBeCloseTo(11 / 17, 10);
    expect(first.cumulativeShare).toBeCloseTo(11 / 17, 10);
    const hidden = rest.filter((r) => r.count.value === null);
    expect(hidden.map((r) => r.name).sort()).toEqual(["incomplete_recoil", "long_pause", "too_fast"]);
    expect(hidden.every((r) => r.count.text === "fewer than 5" && r.share === null && r.cumulativeShare === null)).toBe(true);
    expect(rest.filter((r) => r.count.value !== null).every((r) => r.count.value === 0 && r.count.text === "no data")).toBe(true);
    expect(q3.errors.attemptsWithErrors.value).toBe(14);
    expect(q3.errors.actions).toBe("Depth drill at the start of every class.");
  });

  it("compares live display shown (17/24) with hidden (9/16) and calls it no clear change", () => {
    expect(q3.feedback.live.passRate.text).toBe("70.8 %");
    expect(q3.feedback.hidden.passRate.text).toBe("56.3 %");
    expect(q3.feedback.differencePoints).toBeCloseTo((17 / 24 - 9 / 16) * 100, 6);
    expect(q3.feedback.verdict).toBe("no clear change");
  });

  it("measures agreement between instructors and measurement with Cohen's kappa", () => {
    // Table [[22, 6], [0, 4]]: p0 = 26/32 = 0.8125, pe = 0.875·0.6875 + 0.125·0.3125 = 0.640625,
    // kappa = (0.8125 − 0.640625) / (1 − 0.640625) = 0.47826 (Cohen 1960 formula, computed by hand).
    expect(q3.agreement.pairs.value).toBe(32);
    expect(q3.agreement.observedAgreement).toBeCloseTo(0.8125, 10);
    expect(q3.agreement.kappa).toBeCloseTo(0.47826, 4);
    expect(q3.agreement.kappaText).toBe("0.48");
    expect(q3.agreement.completionRate.value).toBe(42 / 48);
  });

  it("reports equipment use per 100 learners and counts services and faults inside the quarter only", () => {
    const e = q3.equipment;
    expect(e.manikinsUsed.value).toBe(5);
    expect(e.compressions.value).toBe(40 * 200);
    expect(e.compressionsPerManikin).toBe(1600);
    expect(e.lungsPer100Learners.text).toBe("10.4"); // 5 lungs / 48 learners
    expect(e.mouthpiecesPer100Learners.text).toBe("100.0");
    // 2 batteries per 48 learners: a rate over a group of 48 is shown, however few the events
    expect(e.batteriesPer100Learners.text).toBe("4.2");
    expect(e.services.value).toBe(5); // the 2026-10-01 service belongs to the next quarter
    expect(e.faults).toEqual({ value: 2, hidden: null, text: "2" });
  });

  it("describes the method from the current policy with the guideline sources and the safety note", () => {
    const adult = q3.methods.bands.find((b) => b.key === "adult")!;
    expect(adult.depth).toBe("50–60 mm");
    expect(adult.rate).toBe("100–120 per minute");
    expect(q3.methods.sources.join(" ")).toMatch(/American Heart Association/);
    expect(q3.methods.sources.join(" ")).toMatch(/European Resuscitation Council Guidelines 2021/);
    expect(q3.methods.safetyNote).toMatch(/not a medical device/);
    expect(q3.methods.scoredUnderVersions).toEqual([1]);
  });

  it('shows retention\'s empty bins as "no data", so the 40 first-timers stay shown', () => {
    // Every attempt of the fixture has its own learner, so all 40 learner–class pairs are first courses and
    // every bin of returns is empty: no one is in them, so nothing needs protecting.
    expect(q3.retention!.firstTime.learners).toEqual({ value: 40, hidden: null, text: "40" });
    expect(q3.retention!.firstTime.firstAttemptPassRate.value).toBe(26 / 40);
    expect(q3.retention!.returning.map((g) => [g.key, g.learners.hidden, g.firstAttemptPassRate.text])).toEqual([
      ["0-6", null, "no data"],
      ["6-12", null, "no data"],
      ["12-18", null, "no data"],
      ["18-24", null, "no data"],
      ["24+", null, "no data"],
    ]);
  });

  it("holds no instructor, learner, site or manikin identifiers", () => {
    const text = JSON.stringify(q3);
    for (const identifier of ["A1", "B1", "Instructor A1", "Northfield", "Southmoor", "NORTH", "SOUTH", "RF-M", "RF-A", "L0001", "Q3-1"]) {
      expect(text).not.toContain(identifier);
    }
  });
});

describe("consistency with the statistics service", () => {
  it("counts what quarterSummary counts for the same quarter, so the report and the statistics pages agree", () => {
    // The report keeps its own queries because it also needs years, breakdowns and the agreement table;
    // this check stops the two from drifting apart.
    const summary = quarterSummary(db, "2026-Q3");
    const numbers = reportNumbers(db, ["2026-Q3"]);
    expect(numbers.classes).toBe(summary.classes);
    expect(numbers.learners).toBe(summary.learners);
    expect(numbers.instructors).toBe(summary.instructors);
    expect(numbers.sites).toBe(summary.sites);
    expect(numbers.attempts).toEqual({ attempts: summary.attempts, passed: summary.passed });
    expect(numbers.completions / numbers.learners).toBeCloseTo(summary.course_pass_rate!, 12);
    expect(Object.fromEntries(attemptErrorNames.map((name, bit) => [name, numbers.errorCounts[bit]]))).toEqual(summary.errors);
    expect(numbers.byFeedback.live.attempts).toBe(summary.by_feedback.live.attempts);
    expect(numbers.byFeedback.live.passed / numbers.byFeedback.live.attempts).toBeCloseTo(summary.by_feedback.live.pass_rate!, 12);
    expect(q3.agreement.kappa).toBeCloseTo(summary.agreement.kappa!, 12);
    expect(q3.passRate.low).toBeCloseTo(summary.pass_rate_ci95![0], 12);
  });

  it("adds learner outcomes, the change against the previous quarter and agreement in full", () => {
    const summary = quarterSummary(db, "2026-Q3");
    // every fixture attempt has its own learner code: 40 learners, first attempt = ever passed = 26/40
    expect(summary).toMatchObject({ learners_measured: 40, attempts_per_learner: 1 });
    expect(summary.first_attempt_pass_rate).toBeCloseTo(26 / 40, 12);
    expect(summary.ever_passed_rate).toBeCloseTo(26 / 40, 12);
    // 26/40 − 6/20 = +0.35, 95 % interval 0.0818 to 0.5511 (Newcombe's hybrid score, method 10): up
    expect(summary.change).toMatchObject({ from: "2026-Q2", verdict: "up" });
    expect(summary.change!.difference).toBeCloseTo(0.35, 12);
    expect(summary.change!.ci95[0]).toBeCloseTo(0.0818, 4);
    expect(summary.change!.ci95[1]).toBeCloseTo(0.5511, 4);
    // the 32 adult attempts were judged: 22 passes both ways, 6 measured failures passed, 4 failed both ways;
    // the 8 child and infant attempts have no judgement
    expect(summary.agreement.table).toEqual({ both_pass: 22, instructor_pass_measured_fail: 6, instructor_fail_measured_pass: 0, both_fail: 4 });
    expect(summary.agreement.unjudged).toBe(8);
    // 6 against 0 disagreements: 2 × P(X ≤ 0), X ~ Binomial(6, 0.5) = 2/64 = 0.03125 (exact McNemar)
    expect(summary.agreement.mcnemar_p).toBeCloseTo(0.03125, 12);
    expect(summary.agreement.pabak).toBeCloseTo(2 * (26 / 32) - 1, 12);
    expect(summary.agreement.kappa_ci95).not.toBeNull();
  });
});

describe("narrative", () => {
  it("says what rose, what did not clearly change, and nothing about hidden cells", () => {
    const text = q3.narrative.join(" ");
    expect(text).toContain("65.0 % of measured attempts met the network's pass rule (95 % interval 49.5–77.9 %)");
    expect(text).toContain("the pass rate rose from 30.0 % to 65.0 %");
    expect(text).toContain("That is no clear change from the same quarter last year (60.0 %)");
    expect(text).toContain("fewer than 5 instructors at 2 sites ran 6 classes for 48 learners");
    expect(text).toContain("moderate agreement");
    // like with like: 42 of 48 learners recorded as completing against 26 of 40 learners passing at least once
    expect(text).toContain(
      "Instructors recorded 87.5 % of learners as completing the course; on the manikin, 65.0 % of the learners measured passed at least once.",
    );
    expect(text).not.toMatch(/infant/i);
  });
});

describe("other periods", () => {
  it("reports a whole year against the previous year, with the trend ending at its last quarter", () => {
    const year = buildReportData(db, "2026");
    expect(year.quarters).toEqual(["2026-Q1", "2026-Q2", "2026-Q3", "2026-Q4"]);
    expect(year.passRate.value).toBe((26 + 6) / (40 + 20));
    expect(year.comparisons).toHaveLength(1);
    expect(year.comparisons[0]).toMatchObject({ period: "2025", passRate: { value: 0.6 } });
    expect(year.trend.points.at(-1)!.quarter).toBe("2026-Q4");
    // the year's classes hide to protect 2026-Q2's single class, and the words say so without a number
    expect(year.narrative[0]).toContain("ran a number of classes not shown here for 68 learners");
  });

  it("says plainly when a period has no data", () => {
    const empty = buildReportData(db, "2027-Q1");
    expect(empty.hasData).toBe(false);
    expect(empty.narrative).toEqual(["No classes or measured attempts were recorded for January–March 2027."]);
  });

  it("refuses a period it cannot read", () => {
    expect(() => buildReportData(db, "2026-Q5")).toThrow(/not a report period/);
  });
});
