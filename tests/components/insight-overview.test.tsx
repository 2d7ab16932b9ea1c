// The network overview page, rendered through the real router and query client, with the server's answers
// stubbed at the HTTP boundary. The figures in the answers are the API's; the page only formats them.
import { cleanup, configure, fireEvent, screen, waitFor, within } from "@testing-library/react";
import { afterEach, beforeAll, describe, expect, it, vi } from "vitest";
import type { UserRole } from "../../shared/domain";
import { optionsAnswerSchema, overviewAnswerSchema, type OptionsAnswer, type OverviewAnswer } from "../../shared/schemas/insight";
import { kappaWords } from "../../src/features/insight/format";
import { renderApp } from "./renderApp";
import { answer, fakeServer, sessionFor } from "./testServer";

vi.setConfig({ testTimeout: 30_000 });
// The first render loads the lazy page and Observable Plot; allow for a slow, busy machine.
configure({ asyncUtilTimeout: 10_000 });

// Load the page (and Observable Plot) once up front, so the first test does not pay for it.
beforeAll(async () => {
  await import("../../src/features/insight/overview/OverviewPage");
}, 120_000);

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

const options: OptionsAnswer = {
  quarters: ["2026-Q3", "2026-Q2", "2026-Q1"],
  sites: [{ id: 1, code: "WRM", name: "Wrenmoor Learning Centre" }],
  patientTypes: ["infant", "child", "adult"],
  feedbackModes: ["live", "hidden"],
  errors: [],
  instructors: [],
  manikins: [],
};

const rate = (successes: number, n: number, value: number, low: number, high: number) => ({ successes, n, rate: value, low, high, suppressed: false });
const hiddenRate = { successes: null, n: null, rate: null, low: null, high: null, suppressed: true };

const overview: OverviewAnswer = {
  period: { from: "2026-Q3", to: "2026-Q3", quarters: ["2026-Q3"] },
  previousPeriod: { from: "2026-Q2", to: "2026-Q2", quarters: ["2026-Q2"] },
  suppressionMinCount: 5,
  suppressed: false,
  learners: 1262,
  classes: 48,
  attempts: 1392,
  passRate: rate(411, 1392, 0.2953, 0.2712, 0.3188),
  // 411/1392 against 240/941: difference interval 0.0031 to 0.0765 (Newcombe's hybrid score), a clear rise
  passRateChange: { previous: rate(240, 941, 0.2551, 0.2283, 0.2838), absolute: 0.0402, relative: 0.1576, low: 0.0031, high: 0.0765, verdict: "up" },
  learnerOutcomes: { measured: 1180, firstAttempt: rate(380, 1180, 0.322, 0.296, 0.3492), everPassed: rate(566, 1180, 0.4797, 0.4513, 0.5082) },
  recordedCompletion: rate(761, 1262, 0.603, 0.5757, 0.6297),
  agreement: {
    pairs: 537,
    table: [
      [212, 165],
      [12, 148],
    ],
    observed: 0.6704,
    expected: 0.4665,
    kappa: 0.3822,
    suppressed: false,
  },
  medianScore: 83.3333,
  series: {
    centre: 0.2719,
    baseline: { from: "2025-Q4", to: "2026-Q3", source: "default", attempts: 3640 },
    limits: "binomial",
    sigmaZ: null,
    // 25.7 %, 25.5 %, 29.5 %: around the median 25.7 % one point below, one above (Anhøj limits for 2 points: run 4, crossings 0)
    runChart: { median: 0.2568, useful: 2, run: 1, longestRun: 4, crossings: 1, fewestCrossings: 0, shift: false },
    split: null,
    points: [
      { quarter: "2026-Q1", attempts: 666, passed: 171, rate: 0.2568, low: 0.225, high: 0.2913, lcl: 0.2196, ucl: 0.3242, outside: false, suppressed: false },
      { quarter: "2026-Q2", attempts: 941, passed: 240, rate: 0.2551, low: 0.2283, high: 0.2838, lcl: 0.2282, ucl: 0.3156, outside: false, suppressed: false },
      { quarter: "2026-Q3", attempts: 1392, passed: 411, rate: 0.2953, low: 0.2712, high: 0.3188, lcl: 0.2363, ucl: 0.3075, outside: false, suppressed: false },
    ],
  },
  errors: {
    attempts: 1392,
    suppressed: false,
    rows: [
      { error: "too_shallow", label: "Compressions mostly not deep enough", count: 205, share: 0.5, cumulativeShare: 0.5, attemptShare: 0.1473 },
      { error: "too_fast", label: "Compression rate mostly above the target", count: 164, share: 0.4, cumulativeShare: 0.9, attemptShare: 0.1178 },
      { error: "long_pause", label: "An interruption longer than allowed", count: 41, share: 0.1, cumulativeShare: 1, attemptShare: 0.0295 },
    ],
  },
  feedback: [
    { mode: "live", attempts: 812, passRate: rate(421, 812, 0.5185, 0.4841, 0.5527), medianScore: 88, suppressed: false },
    { mode: "hidden", attempts: 580, passRate: rate(170, 580, 0.2931, 0.2574, 0.3316), medianScore: 74.5, suppressed: false },
  ],
};

function serve(role: UserRole, overviewBody: OverviewAnswer, query = "quarter=2026-Q3") {
  return fakeServer({
    "GET /api/me": sessionFor(role),
    "GET /api/insight/options": answer(optionsAnswerSchema, options),
    [`GET /api/insight/overview?${query}`]: answer(overviewAnswerSchema, overviewBody),
  });
}

/** A percentage written the way the page should write it, computed here independently. */
const pct = (share: number) => `${(Math.round(share * 1000) / 10).toFixed(1)} %`;

function card(label: string): HTMLElement {
  return screen.getByRole("heading", { name: label, level: 3 }).closest("section")!;
}

function figure(title: string): HTMLElement {
  return screen.getByRole("heading", { name: title, level: 3 }).closest("figure")!;
}

/** The table view of a chart: its body rows as arrays of cell texts. */
function tableOf(title: string): string[][] {
  const frame = figure(title);
  fireEvent.click(within(frame).getByRole("button", { name: "Show as table" }));
  const table = within(frame).getByRole("table");
  return within(table)
    .getAllByRole("row")
    .slice(1)
    .map((row) =>
      within(row)
        .getAllByRole("cell")
        .map((cell) => cell.textContent ?? ""),
    );
}

describe("network overview", () => {
  it("calls a change whose interval includes zero no clear change, without a colour of better or worse", async () => {
    // 300/1000 against 295/1000: difference +0.5 points, interval −3.5 to +4.5 points (Newcombe's hybrid score)
    const small: OverviewAnswer = {
      ...overview,
      passRate: rate(300, 1000, 0.3, 0.2724, 0.3291),
      passRateChange: {
        previous: rate(295, 1000, 0.295, 0.2675, 0.324),
        absolute: 0.005,
        relative: 0.0169,
        low: -0.035,
        high: 0.045,
        verdict: "no clear change",
      },
    };
    serve("coordinator", small);
    renderApp("/overview?quarter=2026-Q3");
    await screen.findByRole("heading", { name: "2026 Q3 at a glance" });

    const measured = card("Measured pass rate");
    expect(measured.textContent).toContain("+0.5 points since 2026 Q2 (no clear change)");
    expect(measured.textContent).not.toContain("(better)");
    expect(measured.textContent).toContain("runs from −3.5 points to +4.5 points, so it may be chance.");
  });

  it("shows the API's headline figures formatted: rate, its 95 % interval, change, completion, kappa", async () => {
    serve("coordinator", overview);
    renderApp("/overview?quarter=2026-Q3");
    await screen.findByRole("heading", { name: "2026 Q3 at a glance" });

    const measured = card("Measured pass rate");
    expect(within(measured).getByText("29.5 %")).toBeTruthy();
    expect(measured.textContent).toContain("95 % interval: 27.1–31.9 %");
    expect(measured.textContent).toContain("+4.0 points since 2026 Q2 (better)");
    expect(measured.textContent).toContain("411 of 1,392 manikin attempts");
    expect(measured.textContent).toContain("The change's 95 % interval runs from +0.3 points to +7.7 points.");
    const trend = screen.getByRole("heading", { name: "Measured pass rate by quarter" }).closest("figure")!;
    expect(trend.textContent).toContain(
      "The run-chart rules find no shift: the longest run on one side of the median 25.7 % is 1 (a shift needs more than 4) and the series crosses it 1 time.",
    );

    const recorded = card("Instructor-recorded completion");
    expect(within(recorded).getByText("60.3 %")).toBeTruthy();
    expect(recorded.textContent).toContain("95 % interval: 57.6–63.0 %");

    const agreement = card("Agreement, instructor and measurement (kappa)");
    expect(within(agreement).getByText("0.38")).toBeTruthy();
    expect(agreement.textContent).toContain("Fair agreement");
    expect(agreement.textContent).toContain("67.0 % of 537 attempts");

    expect(within(card("Learners trained")).getByText("1,262")).toBeTruthy();
    expect(within(card("Classes")).getByText("48")).toBeTruthy();
    expect(within(card("Median score")).getByText("83.3")).toBeTruthy();
  });

  it("makes the gap between recorded completions and measured passes visible and says why it matters", async () => {
    serve("quality_lead", overview);
    renderApp("/overview?quarter=2026-Q3");
    // like with like: learners recorded as completed against learners who passed at least once (60.3 − 48.0)
    const callout = await screen.findByText(
      "Instructors recorded 60.3 % of learners as completed, but only 48.0 % of measured learners passed on the manikin at least once: a gap of 12.3 points.",
    );
    expect(callout.tagName).toBe("P");
    expect(screen.getByText(/Why it matters:/).parentElement?.textContent).toMatch(/leaves believing their CPR would work/);
    // the 2×2 table of the same attempts under both results
    const agreement = screen.getByRole("table", { name: "Instructor's result against the measured result" });
    const rows = within(agreement)
      .getAllByRole("row")
      .slice(1)
      .map((row) =>
        within(row)
          .getAllByRole("cell")
          .map((c) => c.textContent),
      );
    expect(rows).toEqual([
      ["Recorded as passed", "212", "165", "377"],
      ["Recorded as not passed", "12", "148", "160"],
    ]);
  });

  it("the p-chart's table holds the same numbers as the series", async () => {
    serve("coordinator", overview);
    renderApp("/overview?quarter=2026-Q3");
    await screen.findByRole("heading", { name: "Measured pass rate by quarter" });
    const rows = tableOf("Measured pass rate by quarter");
    expect(rows).toEqual(
      overview.series.points.map((p) => [
        p.quarter.replace("-", " "),
        p.attempts!.toLocaleString("en-GB"),
        p.passed!.toLocaleString("en-GB"),
        pct(p.rate!),
        `${(p.low! * 100).toFixed(1)}–${(p.high! * 100).toFixed(1)} %`,
        pct(p.lcl!),
        pct(p.ucl!),
        p.outside ? "Yes" : "No",
      ]),
    );
  });

  it("the error Pareto's table holds the same counts and shares", async () => {
    serve("coordinator", overview);
    renderApp("/overview?quarter=2026-Q3");
    await screen.findByRole("heading", { name: "Which errors matter most" });
    // a coordinator may drill down: each row also opens the error's trend and breakdown
    expect(tableOf("Which errors matter most")).toEqual(
      overview.errors.rows.map((r) => [r.label, String(r.count), pct(r.share), pct(r.cumulativeShare), pct(r.attemptShare), "Trend and breakdown"]),
    );
    const first = overview.errors.rows[0];
    const link = screen.getByRole("link", { name: `Trend and breakdown of “${first.label}”` });
    expect(new URLSearchParams(link.getAttribute("href")!.split("?")[1]).get("error")).toBe(first.error);
  });

  it("makes each quarter of the control chart a door to that quarter's attempts for those who may drill down", async () => {
    serve("coordinator", overview);
    renderApp("/overview?quarter=2026-Q3");
    const plot = await screen.findByRole("img", { name: "Measured pass rate by quarter" });
    const doors = [...plot.querySelectorAll("[data-href]")].map((g) => g.getAttribute("data-href"));
    const shown = overview.series.points.filter((p) => p.rate !== null);
    expect(doors).toHaveLength(shown.length);
    expect(doors).toContain("/attempts?quarter=2026-Q3");
  });

  it("the live-against-hidden table and the recorded-against-measured table hold the same rates", async () => {
    serve("coordinator", overview);
    renderApp("/overview?quarter=2026-Q3");
    await screen.findByRole("heading", { name: "Live display against hidden display" });
    expect(tableOf("Live display against hidden display")).toEqual([
      ["Live display", "812", "51.9 %", "48.4–55.3 %", "88.0"],
      ["Hidden display", "580", "29.3 %", "25.7–33.2 %", "74.5"],
    ]);
    expect(tableOf("Recorded completion and measured pass rate")).toEqual([
      ["Instructor-recorded completion", "learners in class logs", "761", "1,262", "60.3 %", "57.6–63.0 %"],
      ["Passed at least once", "learners measured", "566", "1,180", "48.0 %", "45.1–50.8 %"],
      ["Passed on the first attempt", "learners measured", "380", "1,180", "32.2 %", "29.6–34.9 %"],
      ["Measured pass rate", "manikin attempts", "411", "1,392", "29.5 %", "27.1–31.9 %"],
    ]);
  });

  it("states the chart's baseline and offers Laney's limits for quarters with many attempts", async () => {
    const laney = structuredClone(overview);
    laney.series = { ...laney.series, limits: "laney", sigmaZ: 1.84, baseline: { from: "2025-Q4", to: "2026-Q1", source: "setting", attempts: 1205 } };
    fakeServer({
      "GET /api/me": sessionFor("coordinator"),
      "GET /api/insight/options": answer(optionsAnswerSchema, options),
      "GET /api/insight/overview?quarter=2026-Q3": answer(overviewAnswerSchema, overview),
      "GET /api/insight/overview?quarter=2026-Q3&limits=laney": answer(overviewAnswerSchema, laney),
    });
    renderApp("/overview?quarter=2026-Q3");
    await screen.findByRole("heading", { name: "Measured pass rate by quarter" });
    expect(
      screen.getByText(
        "Centre line from 2025 Q4 to 2026 Q3 (the first four quarters with attempts (a coordinator can choose others in Settings), 3,640 attempts): later quarters are judged against it and never move it. Limits are 3 standard errors of each quarter's number of attempts.",
      ),
    ).toBeTruthy();
    // quarters of 666–1,392 attempts: Laney's p′ is offered
    fireEvent.click(screen.getByRole("checkbox", { name: "Widen the limits for large quarters (Laney's p′ chart)" }));
    expect(await screen.findByText(/Centre line from 2025 Q4 to 2026 Q1 \(the baseline a coordinator chose in Settings, 1,205 attempts\)/)).toBeTruthy();
    expect(screen.getByText(/widened by Laney's factor σ_z = 1\.84/)).toBeTruthy();
  });

  it("marks a quarter outside the control limits in the description and the table", async () => {
    const outside = structuredClone(overview);
    outside.series.points[2] = { ...outside.series.points[2], rate: 0.34, outside: true };
    serve("coordinator", outside);
    renderApp("/overview?quarter=2026-Q3");
    const frame = await screen.findByRole("heading", { name: "Measured pass rate by quarter" });
    expect(frame.closest("figure")!.textContent).toContain("1 of 3 quarters fall outside the control limits (above in 2026 Q3)");
    expect(tableOf("Measured pass rate by quarter")[2][7]).toBe("Yes, above");
  });

  it("writes 'too few to show' for hidden groups, never a zero", async () => {
    const hidden: OverviewAnswer = {
      ...overview,
      suppressionMinCount: 10,
      suppressed: true,
      learners: null,
      classes: null,
      attempts: null,
      passRate: hiddenRate,
      passRateChange: { previous: hiddenRate, absolute: null, relative: null, low: null, high: null, verdict: null },
      learnerOutcomes: { measured: null, firstAttempt: hiddenRate, everPassed: hiddenRate },
      recordedCompletion: hiddenRate,
      agreement: { pairs: null, table: null, observed: null, expected: null, kappa: null, suppressed: true },
      medianScore: null,
      series: {
        ...overview.series,
        centre: 0.2719,
        runChart: null,
        split: null,
        points: [
          overview.series.points[0],
          { quarter: "2026-Q2", attempts: null, passed: null, rate: null, low: null, high: null, lcl: null, ucl: null, outside: false, suppressed: true },
          overview.series.points[2],
        ],
      },
      errors: { attempts: null, rows: [], suppressed: true },
      feedback: [
        { mode: "live", attempts: null, passRate: hiddenRate, medianScore: null, suppressed: true },
        { mode: "hidden", attempts: null, passRate: hiddenRate, medianScore: null, suppressed: true },
      ],
    };
    serve("instructor", hidden);
    renderApp("/overview?quarter=2026-Q3");
    await screen.findByRole("heading", { name: "2026 Q3 at a glance" });
    for (const label of ["Measured pass rate", "Instructor-recorded completion", "Learners trained", "Classes", "Attempts measured", "Median score"]) {
      expect(within(card(label)).getByText("too few to show")).toBeTruthy();
      expect(within(card(label)).queryByText(/^0(\.0)?( %)?$/)).toBeNull();
    }
    expect(screen.getByText(/Fewer than 10 attempts match these filters/)).toBeTruthy();
    const rows = tableOf("Measured pass rate by quarter");
    expect(rows[1].slice(0, 4)).toEqual(["2026 Q2", "too few to show", "too few to show", "too few to show"]);
    // nothing to draw: the chart's place says why instead of showing empty axes
    const feedback = screen.getByRole("heading", { name: "Live display against hidden display", level: 3 }).closest("section")!;
    expect(feedback.textContent).toContain("With the display live, the figures are hidden (too few to show)");
  });

  it("says a quarter has no attempts and offers other quarters", async () => {
    serve("coordinator", { ...overview, attempts: 0 }, "quarter=2026-Q3&feedback=hidden");
    renderApp("/overview?quarter=2026-Q3&feedback=hidden");
    expect(await screen.findByText("No attempts in 2026 Q3 with these filters")).toBeTruthy();
    expect(screen.getByRole("link", { name: "Show 2026 Q2" }).getAttribute("href")).toBe("/overview?quarter=2026-Q2&feedback=hidden");
    expect(screen.getByRole("link", { name: "Clear the other filters" }).getAttribute("href")).toBe("/overview?quarter=2026-Q3");
  });

  it("opens on the latest quarter with data and puts it in the address, so a copied link keeps it", async () => {
    const { requests } = serve("coordinator", overview);
    const { router } = renderApp("/overview");
    await screen.findByRole("heading", { name: "2026 Q3 at a glance" });
    await waitFor(() => expect(router.state.location.search).toBe("?quarter=2026-Q3"));
    expect(requests.map((r) => r.path)).toContain("/api/insight/overview?quarter=2026-Q3");
  });

  it("explains when a link names a quarter without data", async () => {
    serve("coordinator", overview);
    renderApp("/overview?quarter=2019-Q1");
    expect(await screen.findByText(/The link asked for 2019 Q1, which has no attempts\. Showing 2026 Q3/)).toBeTruthy();
  });

  it("shows the server's message when the overview cannot be loaded", async () => {
    fakeServer({
      "GET /api/me": sessionFor("coordinator"),
      "GET /api/insight/options": answer(optionsAnswerSchema, options),
      "GET /api/insight/overview?quarter=2026-Q3": { status: 422, body: { error: { code: "invalid", message: "The filters are not valid." } } },
    });
    renderApp("/overview?quarter=2026-Q3");
    const alert = await screen.findByRole("alert");
    expect(alert.textContent).toContain("The overview could not be loaded");
    expect(alert.textContent).toContain("The filters are not valid.");
  });
});

describe("kappa in words", () => {
  // Bands of Landis JR, Koch GG. The measurement of observer agreement for categorical data.
  // Biometrics 1977;33:159–174 (from memory): <0 poor, 0–0.20 slight, 0.21–0.40 fair, 0.41–0.60 moderate,
  // 0.61–0.80 substantial, 0.81–1 almost perfect.
  it("names the agreement band", () => {
    expect(kappaWords(-0.1)).toBe("poor agreement");
    expect(kappaWords(0.15)).toBe("slight agreement");
    expect(kappaWords(0.3822)).toBe("fair agreement");
    expect(kappaWords(0.5)).toBe("moderate agreement");
    expect(kappaWords(0.7)).toBe("substantial agreement");
    expect(kappaWords(0.93)).toBe("almost perfect agreement");
    expect(kappaWords(null)).toBe("not enough pairs");
  });
});
