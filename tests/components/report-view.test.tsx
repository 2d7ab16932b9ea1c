import { cleanup, render, screen, within } from "@testing-library/react";
import { afterEach, describe, expect, it, vi } from "vitest";
import type { CountFigure, RateFigure, ReportData } from "../../shared/schemas/report";
import { rateWithInterval } from "../../src/features/report/figures";
import { describeTrend } from "../../src/features/report/TrendChart";
import { ReportView } from "../../src/features/report/ReportView";

vi.setConfig({ testTimeout: 20_000 });
afterEach(cleanup);

const count = (value: number): CountFigure => ({ value, hidden: null, text: value.toLocaleString("en-GB") });
const small: CountFigure = { value: null, hidden: "small", text: "fewer than 5" };
const rate = (value: number, low: number, high: number, n: number, text: string, intervalText: string): RateFigure => ({
  value,
  low,
  high,
  n: count(n),
  hidden: null,
  text,
  intervalText,
});
const hiddenRate: RateFigure = { value: null, low: null, high: null, n: small, hidden: "small", text: "hidden", intervalText: "" };

/** A report as the API answers it: texts already made, some figures suppressed. */
function reportData(): ReportData {
  // 326 passes of 855 attempts: 38.1 %, Wilson 95 % interval 34.9–41.4 % (Wilson 1927 score interval, z = 1.96).
  const pass = rate(326 / 855, 0.3493, 0.4143, 855, "38.1 %", "34.9–41.4 %");
  return {
    period: "2026-Q3",
    kind: "quarter",
    periodLabel: "July–September 2026",
    quarters: ["2026-Q3"],
    networkName: "Harrowmere Valley CPR Training Network",
    generatedAt: "2026-10-02T09:00:00.000Z",
    policyVersion: 1,
    suppressionMinCount: 5,
    hasData: true,
    reach: {
      classes: count(41),
      learners: count(417),
      sites: count(4),
      instructors: count(12),
      attempts: count(855),
      byCourse: [
        { key: "infant", label: "Infant CPR", classes: count(10), learners: count(93) },
        { key: "child", label: "Child CPR", classes: small, learners: { value: null, hidden: "protects-other", text: "not shown" } },
      ],
    },
    passRate: pass,
    comparisons: [
      {
        label: "the previous quarter",
        period: "2026-Q2",
        passRate: rate(0.378, 0.3465, 0.4113, 859, "37.8 %", "34.7–41.1 %"),
        changePoints: 0.29,
        relativeChange: 0.0078,
        verdict: "no clear change",
        text: "No clear change from the previous quarter (37.8 %).",
      },
    ],
    trend: {
      points: [
        { quarter: "2026-Q2", passRate: hiddenRate, lcl: null, ucl: null, outside: false },
        { quarter: "2026-Q3", passRate: pass, lcl: 0.2347, ucl: 0.3269, outside: true },
      ],
      centre: 0.2808,
    },
    byPatientType: [
      { key: "infant", label: "Infant", attempts: count(299), passRate: rate(0.3846, 0.3313, 0.4409, 299, "38.5 %", "33.1–44.1 %") },
      { key: "child", label: "Child", attempts: small, passRate: hiddenRate },
    ],
    errors: {
      rows: [
        { name: "too_fast", label: "Compression rate mostly above the target", count: count(284), share: 0.3674, cumulativeShare: 0.3674 },
        { name: "low_hands_on", label: "Too little of the time spent compressing", count: small, share: null, cumulativeShare: null },
      ],
      attemptsWithErrors: count(529),
      actions: "Refresher sessions on compression rate at every site.",
    },
    feedback: {
      live: { key: "live", label: "Live display shown", attempts: count(481), passRate: rate(0.4574, 0.4134, 0.5021, 481, "45.7 %", "41.3–50.2 %") },
      hidden: { key: "hidden", label: "Live display hidden", attempts: count(374), passRate: rate(0.2834, 0.2401, 0.3311, 374, "28.3 %", "24.0–33.1 %") },
      differencePoints: 17.4,
      verdict: "up",
    },
    agreement: {
      pairs: count(753),
      kappa: 0.403,
      observedAgreement: 0.6746,
      kappaText: "0.40",
      completionRate: rate(0.6355, 0.5883, 0.6803, 417, "63.5 %", "58.8–68.0 %"),
      everPassedRate: rate(0.5746, 0.5257, 0.6221, 402, "57.5 %", "52.6–62.2 %"),
      objectivePassRate: pass,
    },
    equipment: {
      manikinsUsed: count(39),
      compressions: count(155652),
      compressionsPerManikin: 3991.08,
      lungsPer100Learners: { value: 1.68, hidden: null, text: "1.7" },
      mouthpiecesPer100Learners: { value: 109.6, hidden: null, text: "109.6" },
      batteriesPer100Learners: { value: 0.5, hidden: null, text: "0.5" },
      services: count(19),
      faults: count(2),
    },
    methods: {
      scoredUnderVersions: [1],
      bands: [{ key: "adult", label: "Adult", depth: "50–60 mm", rate: "100–120 per minute", recoil: "released to within 5 mm" }],
      passRule: ["at least 70 % of compressions at the target depth"],
      passRuleNote: "The pass rule is network policy (version 1), not a guideline value.",
      sources: [
        "Olasveengen TM, Semeraro F, Ristagno G, et al. European Resuscitation Council Guidelines 2021: Basic Life Support. Resuscitation. 2021;161:98–114.",
      ],
      safetyNote:
        "Quarterbeat is a training-quality tool, not a medical device. Learners follow current resuscitation guidelines, their training organisation and local protocols.",
      suppressionNote:
        'To protect learners and instructors, a count of people or their activity below 5 reads "fewer than 5", and a period or group with none reads "no data".',
    },
    narrative: ["In July–September 2026, 12 instructors at 4 sites ran 41 classes for 417 learners."],
  };
}

function statValue(label: string): string {
  return screen.getByText(label, { selector: "dt" }).parentElement!.querySelector("dd")!.textContent ?? "";
}

describe("funder report page", () => {
  it("shows suppressed figures exactly as the API words them", () => {
    render(<ReportView data={reportData()} />);
    // sites and faults describe no person: always a number
    expect(statValue("Sites")).toBe("4");
    expect(statValue("Faults reported")).toBe("2");
    const courses = screen.getByRole("table", { name: "Classes and learners by course" });
    const child = within(courses).getByRole("rowheader", { name: "Child CPR" }).closest("tr")!;
    expect(
      within(child)
        .getAllByRole("cell")
        .map((c) => c.textContent),
    ).toEqual(["fewer than 5", "not shown"]);
    // A hidden rate reads "hidden", never as a count, and shows no interval at all.
    const byType = screen.getByRole("table", { name: "Pass rate by patient type" });
    const childType = within(byType).getByRole("rowheader", { name: "Child" }).closest("tr")!;
    expect(
      within(childType)
        .getAllByRole("cell")
        .map((c) => c.textContent),
    ).toEqual(["fewer than 5", "hidden", ""]);
    // And the reason is said under the table that has one.
    expect(screen.getByText(/“fewer than 5”: hidden because it comes from too few people or events/)).toBeTruthy();
  });

  it("tells a hidden quarter of the trend from one without attempts", () => {
    const { trend } = reportData();
    expect(describeTrend(trend)).toContain("1 quarter is hidden to protect small groups.");
    const empty = { ...trend, points: [{ ...trend.points[0], passRate: { ...hiddenRate, n: count(0), hidden: null, text: "no data" } }, trend.points[1]] };
    expect(describeTrend(empty)).toContain("1 quarter has no measured attempts.");
    expect(describeTrend(empty)).not.toContain("hidden");
  });

  it("gives the pass rate with its 95 % interval as text", () => {
    render(<ReportView data={reportData()} />);
    expect(screen.getByText("Pass rate: 38.1 % (95 % interval 34.9–41.4 %)")).toBeTruthy();
    expect(screen.getByText("95 % interval 34.9–41.4 %")).toBeTruthy();
    expect(rateWithInterval(reportData().passRate)).toBe("38.1 % (95 % interval 34.9–41.4 %)");
    expect(rateWithInterval(hiddenRate)).toBe("hidden");
    const byType = screen.getByRole("table", { name: "Pass rate by patient type" });
    const infant = within(byType).getByRole("rowheader", { name: "Infant" }).closest("tr")!;
    expect(
      within(infant)
        .getAllByRole("cell")
        .map((c) => c.textContent),
    ).toEqual(["299", "38.5 %", "33.1–44.1 %"]);
  });

  it("reads the comparisons, the coordinator's text, the feedback difference and the caution", () => {
    render(<ReportView data={reportData()} />);
    expect(screen.getByText(/No clear change from the previous quarter \(37\.8 %\)\./)).toBeTruthy();
    expect(screen.getByText("Refresher sessions on compression rate at every site.")).toBeTruthy();
    expect(screen.getByText("The pass rate with the display shown was 17.4 percentage points higher than with it hidden.")).toBeTruthy();
    expect(screen.getByRole("complementary", { name: "Caution" }).textContent).toContain("not a medical device");
    expect(screen.getByRole("heading", { name: "Pass rate quarter by quarter" })).toBeTruthy();
  });

  it("puts a slot in place of the text when the coordinator edits it", () => {
    render(<ReportView data={reportData()} actionsSlot={<p>editor here</p>} />);
    expect(screen.getByText("editor here")).toBeTruthy();
    expect(screen.queryByText("Refresher sessions on compression rate at every site.")).toBeNull();
  });
});
