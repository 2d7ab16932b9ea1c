// Instructors list with the funnel plot, and one instructor's page, through the real router with the
// server's answers stubbed at the HTTP boundary.
import { cleanup, configure, fireEvent, screen, within } from "@testing-library/react";
import { afterEach, beforeAll, describe, expect, it, vi } from "vitest";
import {
  instructorDetailAnswerSchema,
  instructorsAnswerSchema,
  optionsAnswerSchema,
  overviewAnswerSchema,
  type InstructorDetailAnswer,
  type InstructorsAnswer,
  type OptionsAnswer,
  type OverviewAnswer,
} from "../../shared/schemas/insight";
import { scaledFunnelLimits, wilsonInterval } from "../../shared/stats";
import { renderApp } from "./renderApp";
import { answer, fakeServer, sessionFor } from "./testServer";

vi.setConfig({ testTimeout: 30_000 });
configure({ asyncUtilTimeout: 10_000 });

beforeAll(async () => {
  await import("../../src/features/insight/instructors/InstructorsPage");
  await import("../../src/features/insight/instructors/InstructorDetailPage");
}, 120_000);

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

const options: OptionsAnswer = {
  quarters: ["2026-Q4", "2026-Q3"],
  sites: [{ id: 2, code: "CLB", name: "Callowby Fire Station Training Room" }],
  patientTypes: ["infant", "child", "adult"],
  feedbackModes: ["live", "hidden"],
  errors: [],
  instructors: [
    { id: 4, code: "IN04", name: "Callum Ferrowin", siteId: 2 },
    { id: 6, code: "IN06", name: "Desmond Quarrie", siteId: 2 },
  ],
  manikins: [],
};

function rate(successes: number, n: number) {
  const interval = wilsonInterval(successes, n);
  return { successes, n, rate: n === 0 ? null : successes / n, low: interval?.[0] ?? null, high: interval?.[1] ?? null, suppressed: false };
}

const instructors: InstructorsAnswer = {
  period: { from: "2026-Q4", to: "2026-Q4", quarters: ["2026-Q4"] },
  funnel: {
    networkRate: 0.42,
    method: "normal",
    adjust: "case-mix",
    phi: 1.44,
    overdispersed: true,
    scale: 1.2,
    curve: [
      { n: 1, low95: 0, high95: 0.94, low998: 0, high998: 0.998 },
      { n: 60, low95: 0.3, high95: 0.55, low998: 0.23, high998: 0.62 },
      { n: 120, low95: 0.33, high95: 0.51, low998: 0.28, high998: 0.56 },
    ],
  },
  instructors: [
    {
      id: 4,
      code: "IN04",
      name: "Callum Ferrowin",
      site: { id: 2, code: "CLB" },
      classes: 2,
      attempts: 30,
      passRate: rate(12, 30),
      medianScore: 83.5,
      expected: 12.9,
      z: -0.33,
      adjustedRate: 0.39,
      effectiveAttempts: 31.2,
      position: "inside",
    },
    {
      id: 6,
      code: "IN06",
      name: "Desmond Quarrie",
      site: { id: 2, code: "CLB" },
      classes: 2,
      attempts: 68,
      passRate: rate(7, 68),
      medianScore: 62.8333,
      expected: 30.1,
      z: -5.6,
      adjustedRate: 0.08,
      effectiveAttempts: 70.4,
      position: "below998",
    },
    {
      id: 8,
      code: "IN08",
      name: "Jonah Thistlecombe",
      site: null,
      classes: 3,
      attempts: 117,
      passRate: rate(63, 117),
      medianScore: 90,
      expected: 48.2,
      z: 2.81,
      adjustedRate: 0.55,
      effectiveAttempts: 112.5,
      position: "above95",
    },
  ],
};

// the crude view: points at their measured rates and attempts, limits not widened
const crude: InstructorsAnswer = {
  ...instructors,
  funnel: { ...instructors.funnel, adjust: "none", phi: 0.8, overdispersed: false, scale: 1 },
  instructors: instructors.instructors.map((r) => ({ ...r, adjustedRate: r.passRate.rate, effectiveAttempts: r.attempts })),
};

const pct = (share: number) => `${(Math.round(share * 1000) / 10).toFixed(1)} %`;
const range = (low: number, high: number) => `${(Math.round(low * 1000) / 10).toFixed(1)}–${(Math.round(high * 1000) / 10).toFixed(1)} %`;

function tableOf(title: string): string[][] {
  const frame = screen.getByRole("heading", { name: title, level: 3 }).closest("figure")!;
  fireEvent.click(within(frame).getByRole("button", { name: "Show as table" }));
  return within(within(frame).getByRole("table"))
    .getAllByRole("row")
    .slice(1)
    .map((row) =>
      within(row)
        .getAllByRole("cell")
        .map((cell) => cell.textContent ?? ""),
    );
}

describe("instructors", () => {
  function serve() {
    return fakeServer({
      "GET /api/me": sessionFor("quality_lead"),
      "GET /api/insight/options": answer(optionsAnswerSchema, options),
      "GET /api/insight/instructors?quarter=2026-Q4&adjust=case-mix": answer(instructorsAnswerSchema, instructors),
      "GET /api/insight/instructors?quarter=2026-Q4&adjust=none": answer(instructorsAnswerSchema, crude),
    });
  }

  const funnelTitle = "Pass rate adjusted for case mix against effective attempts";

  it("the funnel's table holds each instructor's attempts, adjusted rate and z, with the widened limits at that size and the position in words", async () => {
    serve();
    renderApp("/instructors?quarter=2026-Q4");
    await screen.findByRole("heading", { name: funnelTitle });
    const words = { inside: "Expected range", below998: "Well below (99.8 % limit)", above95: "Above (95 % limit)" } as const;
    expect(tableOf(funnelTitle)).toEqual(
      instructors.instructors.map((r) => {
        const limits = scaledFunnelLimits(0.42, r.effectiveAttempts!, 1.2);
        return [
          r.code,
          String(r.attempts),
          r.effectiveAttempts!.toFixed(1),
          pct(r.adjustedRate!),
          r.z!.toFixed(2),
          range(limits.low95, limits.high95),
          range(limits.low998, limits.high998),
          words[r.position as keyof typeof words],
        ];
      }),
    );
    // the choice is on the page, adjusted by default, and the widening is said in words
    expect((screen.getByRole("radio", { name: /Adjusted for case mix/ }) as HTMLInputElement).checked).toBe(true);
    expect(screen.getByText(/the same mix of patient types and feedback displays/)).toBeTruthy();
    expect(screen.getByText(/dispersion φ = 1\.44\), so the limits are widened by √φ = 1\.20/)).toBeTruthy();
  });

  it("shows the crude comparison when asked, at measured rates and plain limits", async () => {
    serve();
    renderApp("/instructors?quarter=2026-Q4");
    await screen.findByRole("heading", { name: funnelTitle });
    fireEvent.click(screen.getByRole("radio", { name: /Not adjusted \(crude\)/ }));
    await screen.findByRole("heading", { name: "Pass rate against number of attempts" });
    const rows = tableOf("Pass rate against number of attempts");
    const limits = scaledFunnelLimits(0.42, 30, 1);
    expect(rows[0]).toEqual(["IN04", "30", pct(12 / 30), "-0.33", range(limits.low95, limits.high95), range(limits.low998, limits.high998), "Expected range"]);
    expect(screen.getByText(/compared with the network's overall rate/)).toBeTruthy();
    expect(screen.getByText(/dispersion φ = 0\.80\), so the limits are those of chance alone, not widened/)).toBeTruthy();
  });

  it("names the instructors outside the limits in words, linking to each, not by colour alone", async () => {
    serve();
    renderApp("/instructors?quarter=2026-Q4");
    await screen.findByText("Outside the limits:");
    const link = screen.getByRole("link", { name: "IN06 · Desmond Quarrie" });
    expect(link.getAttribute("href")).toBe("/instructors/6?quarter=2026-Q4");
    expect(link.closest("li")!.textContent).toContain("Well below the network (outside 99.8 % limit)");
    expect(screen.getByRole("link", { name: "IN08 · Jonah Thistlecombe" }).closest("li")!.textContent).toContain("Higher than expected (outside 95 % limit)");
    expect(screen.queryByRole("link", { name: "IN04 · Callum Ferrowin" })).toBeNull();
    // in the plot itself, points outside the limits carry their code as a label; points inside do not
    const plot = screen.getByRole("img", { name: funnelTitle });
    const labels = [...plot.querySelectorAll("text")].map((t) => t.textContent);
    expect(labels).toContain("IN06");
    expect(labels).toContain("IN08");
    expect(labels).not.toContain("IN04");
    // every point is a door to that instructor's page, with the same filters as the table's links
    const doors = [...plot.querySelectorAll("[data-href]")].map((g) => g.getAttribute("data-href"));
    expect(doors).toContain("/instructors/6?quarter=2026-Q4");
    expect(doors).toContain("/instructors/4?quarter=2026-Q4");
  });

  it("lists every instructor in a table whose rows link to the instructor's page, keeping the filters", async () => {
    serve();
    renderApp("/instructors?quarter=2026-Q4");
    const table = await screen.findByRole("table", { name: "Instructors" });
    const rows = within(table)
      .getAllByRole("row")
      .slice(1)
      .map((row) =>
        within(row)
          .getAllByRole("cell")
          .map((c) => c.textContent),
      );
    expect(rows[1]).toEqual([
      "IN06",
      "Desmond Quarrie",
      "CLB",
      "2",
      "68",
      "10.3 %",
      range(rate(7, 68).low!, rate(7, 68).high!),
      "62.8",
      "30.1",
      "-5.60",
      "Well below (99.8 % limit)",
    ]);
    expect(within(table).getByRole("link", { name: "IN04" }).getAttribute("href")).toBe("/instructors/4?quarter=2026-Q4");
    // sortable: attempts, largest first after two clicks
    fireEvent.click(within(table).getByRole("button", { name: "Attempts" }));
    fireEvent.click(within(table).getByRole("button", { name: "Attempts" }));
    expect(within(table).getAllByRole("row")[1].textContent).toContain("IN08");
  });
});

describe("one instructor", () => {
  const detail: InstructorDetailAnswer = {
    period: { from: "2026-Q4", to: "2026-Q4", quarters: ["2026-Q4"] },
    instructor: { id: 6, code: "IN06", name: "Desmond Quarrie", site: { id: 2, code: "CLB" } },
    trend: [
      { quarter: "2026-Q2", passRate: rate(0, 0), medianScore: null },
      { quarter: "2026-Q3", passRate: rate(5, 41), medianScore: 65.0 },
      { quarter: "2026-Q4", passRate: rate(7, 68), medianScore: 62.8333 },
    ],
    classes: [{ id: "CL-0283", date: "2026-11-12", course: "adult", learners: 9, passed: 2, attempts: 18, passRate: rate(1, 18) }],
  };
  const point = (quarter: string, passed: number, attempts: number) => ({
    quarter,
    attempts,
    passed,
    rate: passed / attempts,
    low: null,
    high: null,
    lcl: null,
    ucl: null,
    outside: false,
    suppressed: false,
  });
  const network: OverviewAnswer = {
    period: detail.period,
    previousPeriod: { from: "2026-Q3", to: "2026-Q3", quarters: ["2026-Q3"] },
    suppressionMinCount: 5,
    suppressed: false,
    learners: 10,
    classes: 2,
    attempts: 615,
    passRate: rate(259, 615),
    passRateChange: { previous: rate(326, 855), absolute: 0.04, relative: 0.1, low: null, high: null, verdict: null },
    learnerOutcomes: { measured: 600, firstAttempt: rate(240, 600), everPassed: rate(250, 600) },
    recordedCompletion: rate(158, 262),
    agreement: {
      pairs: 0,
      table: [
        [0, 0],
        [0, 0],
      ],
      observed: null,
      expected: null,
      kappa: null,
      suppressed: false,
    },
    medianScore: 83,
    series: {
      centre: 0.3,
      baseline: { from: "2025-Q4", to: "2026-Q3", source: "default", attempts: 3200 },
      limits: "binomial",
      sigmaZ: null,
      runChart: null,
      split: null,
      points: [point("2026-Q2", 325, 859), point("2026-Q3", 326, 855), point("2026-Q4", 259, 615)],
    },
    errors: { attempts: 615, rows: [], suppressed: false },
    feedback: [],
  };

  it("shows the quarterly trend with the same numbers in its table, beside the network's rate, and the classes", async () => {
    fakeServer({
      "GET /api/me": sessionFor("coordinator"),
      "GET /api/insight/options": answer(optionsAnswerSchema, options),
      "GET /api/insight/instructors/6?quarter=2026-Q4": answer(instructorDetailAnswerSchema, detail),
      "GET /api/insight/overview?quarter=2026-Q4": answer(overviewAnswerSchema, network),
      "GET /api/insight/instructors?quarter=2026-Q4&adjust=case-mix": answer(instructorsAnswerSchema, instructors),
    });
    renderApp("/instructors/6?quarter=2026-Q4");
    expect(await screen.findByRole("heading", { name: "IN06 · Desmond Quarrie", level: 1 })).toBeTruthy();
    // the funnel position is the instructors page's, with the comparison it was made by
    expect(await screen.findByText("(network 42.0 %; adjusted for case mix).")).toBeTruthy();
    expect(screen.getByText("Well below the network (outside 99.8 % limit)")).toBeTruthy();
    await screen.findByRole("heading", { name: "Pass rate by quarter" });
    const rows = tableOf("Pass rate by quarter");
    expect(rows).toEqual([
      ["2026 Q2", "0", "no attempts", "", pct(325 / 859), "–"],
      ["2026 Q3", "41", pct(5 / 41), range(rate(5, 41).low!, rate(5, 41).high!), pct(326 / 855), "65.0"],
      ["2026 Q4", "68", pct(7 / 68), range(rate(7, 68).low!, rate(7, 68).high!), pct(259 / 615), "62.8"],
    ]);
    expect(tableOf("Median score by quarter").map((r) => r[2])).toEqual(["no attempts", "65.0", "62.8"]);
    const classes = screen.getByRole("table", { name: "Classes" });
    expect(within(classes).getByRole("link", { name: "CL-0283" }).getAttribute("href")).toBe("/classes/CL-0283");
  });

  it("says plainly when no instructor has the id", async () => {
    fakeServer({
      "GET /api/me": sessionFor("coordinator"),
      "GET /api/insight/options": answer(optionsAnswerSchema, options),
      "GET /api/insight/instructors/99?quarter=2026-Q4": { status: 404, body: { error: { code: "not_found", message: "The instructor was not found." } } },
      "GET /api/insight/overview?quarter=2026-Q4": answer(overviewAnswerSchema, network),
    });
    renderApp("/instructors/99?quarter=2026-Q4");
    expect(await screen.findByText("No instructor has the id “99”")).toBeTruthy();
  });
});
