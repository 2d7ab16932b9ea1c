// "My standing" for an instructor, through the real router with the server's answers stubbed at the HTTP
// boundary: medians beside the network's, the anonymous spread, the funnel point, the error profile and
// the classes; hidden network figures in words.
import { cleanup, configure, fireEvent, screen, within } from "@testing-library/react";
import { afterEach, beforeAll, describe, expect, it, vi } from "vitest";
import { optionsAnswerSchema, standingAnswerSchema, type OptionsAnswer, type StandingAnswer } from "../../shared/schemas/insight";
import { scaledFunnelLimits } from "../../shared/stats";
import { renderApp } from "./renderApp";
import { answer, fakeServer, sessionFor } from "./testServer";

vi.setConfig({ testTimeout: 30_000 });
configure({ asyncUtilTimeout: 10_000 });

beforeAll(async () => {
  await import("../../src/features/insight/standing/MyStandingPage");
}, 120_000);

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

const options: OptionsAnswer = {
  quarters: ["2026-Q4", "2026-Q3"],
  sites: [{ id: 1, code: "WRM", name: "Wrenmoor Learning Centre" }],
  patientTypes: ["infant", "child", "adult"],
  feedbackModes: ["live", "hidden"],
  errors: [],
  instructors: [{ id: 3, code: "IN03", name: "Ilse Pendrake", siteId: 1 }],
  manikins: [],
};

const standing: StandingAnswer = {
  period: { from: "2026-Q4", to: "2026-Q4", quarters: ["2026-Q4"] },
  me: { instructorId: 3, code: "IN03", name: "Ilse Pendrake" },
  suppressionMinCount: 5,
  attempts: 37,
  metrics: [
    { key: "score", mine: 86.3333, network: 83.3333, percentileRank: 87.5, ceiling: null },
    { key: "depth_ok_pct", mine: 80, network: 82, percentileRank: 37.5, ceiling: null },
    { key: "rate_ok_pct", mine: 91, network: 85.2814, percentileRank: 87.5, ceiling: null },
    {
      key: "recoil_ok_pct",
      mine: 100,
      network: 100,
      percentileRank: 62.5,
      ceiling: { mine: { shareAtCeiling: 0.7297, p10: 88 }, network: { shareAtCeiling: 0.6812, p10: 84.5 } },
    },
    {
      key: "hands_on_pct",
      mine: 100,
      network: 100,
      percentileRank: 54.1667,
      ceiling: { mine: { shareAtCeiling: 0.6486, p10: 90 }, network: { shareAtCeiling: 0.6705, p10: 91 } },
    },
  ],
  spread: {
    minAttempts: 5,
    instructorsLeftOut: 1,
    points: [
      { medianScore: 62.8333, passRate: 0.1029, isMe: false },
      { medianScore: 78.3333, passRate: 0.3889, isMe: false },
      { medianScore: 86.3333, passRate: 0.5405, isMe: true },
      { medianScore: 90, passRate: 0.5385, isMe: false },
    ],
  },
  funnel: {
    networkRate: 0.4211,
    method: "normal",
    adjust: "case-mix",
    phi: 0.9,
    overdispersed: false,
    scale: 1,
    curve: [
      { n: 1, low95: 0, high95: 0.94, low998: 0, high998: 0.998 },
      { n: 40, low95: 0.275, high95: 0.575, low998: 0.2, high998: 0.65 },
      { n: 117, low95: 0.33, high95: 0.51, low998: 0.28, high998: 0.56 },
    ],
    me: {
      successes: 20,
      n: 37,
      rate: 20 / 37,
      low: 0.3838,
      high: 0.6896,
      suppressed: false,
      expected: 16.1,
      z: 1.32,
      adjustedRate: 0.5265,
      effectiveAttempts: 38.4,
      position: "inside",
    },
  },
  errorProfile: {
    networkSuppressed: false,
    rows: [
      { error: "too_shallow", label: "Compressions mostly not deep enough", mine: 0.3243, network: 0.3333 },
      { error: "too_deep", label: "Compressions mostly deeper than the target", mine: 0, network: 0.0098 },
      { error: "too_fast", label: "Compression rate mostly above the target", mine: 0.1622, network: 0.2667 },
      { error: "long_pause", label: "An interruption longer than allowed", mine: 0.0541, network: 0.0293 },
    ],
  },
  classes: [
    {
      id: "CL-0276",
      date: "2026-10-17",
      course: "adult",
      learners: 6,
      passed: 5,
      attempts: 9,
      passRate: { successes: 6, n: 9, rate: 0.6667, low: 0.3542, high: 0.8794, suppressed: false },
    },
    {
      id: "CL-0269",
      date: "2026-10-08",
      course: "infant",
      learners: 14,
      passed: 13,
      attempts: 20,
      passRate: { successes: 9, n: 20, rate: 0.45, low: 0.2582, high: 0.6579, suppressed: false },
    },
  ],
};

function serve(standingBody: StandingAnswer) {
  return fakeServer({
    "GET /api/me": sessionFor("instructor"),
    "GET /api/insight/options": answer(optionsAnswerSchema, options),
    "GET /api/insight/standing?quarter=2026-Q4&adjust=case-mix": answer(standingAnswerSchema, standingBody),
  });
}

const pct = (share: number) => `${(Math.round(share * 1000) / 10).toFixed(1)} %`;

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

function metricCard(label: string): HTMLElement {
  return screen.getByRole("heading", { name: label, level: 3 }).closest("li")!;
}

describe("my standing", () => {
  it("shows my medians beside the network's, with my percentile among instructors", async () => {
    serve(standing);
    renderApp("/my-standing?quarter=2026-Q4");
    await screen.findByRole("heading", { name: "IN03 · Ilse Pendrake, 2026 Q4" });
    const score = metricCard("Score");
    expect(within(score).getByText("86.3")).toBeTruthy();
    expect(score.textContent).toContain("Network: 83.3");
    expect(score.textContent).toContain("88th percentile of 4 instructors, on the same patient types and displays: among the highest.");
    const depth = metricCard("Depth");
    expect(within(depth).getByText("80.0 %")).toBeTruthy();
    expect(depth.textContent).toContain("Network: 82.0 %");
    // 80 % against 82 %: two points from the network's median reads as about the same, whatever the rank
    expect(depth.textContent).toContain(
      "38th percentile of 4 instructors, on the same patient types and displays, but within 3 points of the network's median: about the same as the network.",
    );
    const rate = metricCard("Rate");
    expect(rate.textContent).toContain("88th percentile of 4 instructors, on the same patient types and displays: among the highest.");
    // recoil sits at 100 % for most attempts: the share at 100 % and the 10th percentile replace the medians
    const recoil = metricCard("Release (recoil)");
    expect(within(recoil).getByText("73.0 %")).toBeTruthy();
    expect(recoil.textContent).toContain("of your attempts at 100 %");
    expect(recoil.textContent).toContain("Network: 68.1 %");
    expect(recoil.textContent).toContain("Weakest tenth below: you 88.0 %, network 84.5 %");
    expect(recoil.textContent).toContain("(ranked by the share at 100 %)");
    expect(recoil.textContent).not.toContain("Network: 100");
  });

  it("the spread's table lists every instructor's point, me as 'You' and others without names", async () => {
    serve(standing);
    renderApp("/my-standing?quarter=2026-Q4");
    await screen.findByRole("heading", { name: "Where you sit among instructors" });
    expect(tableOf("Where you sit among instructors")).toEqual(
      standing.spread.points.map((p) => [p.isMe ? "You" : "Another instructor", (Math.round(p.medianScore * 10) / 10).toFixed(1), pct(p.passRate)]),
    );
    expect(screen.getByText(/1 instructor is left out \(fewer than 5 attempts, or too few instructors to show\)/)).toBeTruthy();
  });

  it("the funnel's table holds my attempts, my adjusted rate and the limits at my effective number of attempts", async () => {
    serve(standing);
    renderApp("/my-standing?quarter=2026-Q4");
    await screen.findByRole("heading", { name: "Your pass rate on the network funnel" });
    const limits = scaledFunnelLimits(0.4211, 38.4, 1);
    const range = (low: number, high: number) => `${(Math.round(low * 1000) / 10).toFixed(1)}–${(Math.round(high * 1000) / 10).toFixed(1)} %`;
    expect(tableOf("Your pass rate on the network funnel")).toEqual([
      ["You", "37", "38.4", pct(0.5265), "1.32", range(limits.low95, limits.high95), range(limits.low998, limits.high998), "Expected range"],
    ]);
    expect(screen.getByText(/dispersion φ = 0\.90\), so the limits are those of chance alone, not widened/)).toBeTruthy();
  });

  it("the error profile's table holds my share and the network's for each error", async () => {
    serve(standing);
    renderApp("/my-standing?quarter=2026-Q4");
    await screen.findByRole("heading", { name: "Your errors against the network's" });
    const rows = tableOf("Your errors against the network's");
    expect(rows.map((r) => r.slice(0, 3))).toEqual(standing.errorProfile.rows.map((r) => [r.label, pct(r.mine!), pct(r.network!)]));
    expect(rows[2][3]).toBe("−10.5 points");
  });

  it("links each error I made to my own attempts with that error, most common first, keeping the filters", async () => {
    fakeServer({
      "GET /api/me": sessionFor("instructor"),
      "GET /api/insight/options": answer(optionsAnswerSchema, options),
      "GET /api/insight/standing?quarter=2026-Q4&feedback=hidden&adjust=case-mix": answer(standingAnswerSchema, standing),
    });
    renderApp("/my-standing?quarter=2026-Q4&feedback=hidden");
    const nav = await screen.findByRole("navigation", { name: "Open your attempts with an error" });
    const links = within(nav).getAllByRole("link");
    expect(links.map((l) => l.textContent)).toEqual(["Too shallow", "Too fast", "Long interruption"]);
    expect(links[0].getAttribute("href")).toBe("/attempts?quarter=2026-Q4&feedback=hidden&error=too_shallow");
    // an error I never made is named without a link to an empty list
    expect(within(nav).queryByRole("link", { name: "Too deep" })).toBeNull();
    expect(within(nav).getByText("Too deep")).toBeTruthy();
    const frame = screen.getByRole("heading", { name: "Your errors against the network's", level: 3 }).closest("figure")!;
    fireEvent.click(within(frame).getByRole("button", { name: "Show as table" }));
    expect(within(frame).getByRole("link", { name: "Compression rate mostly above the target" }).getAttribute("href")).toBe(
      "/attempts?quarter=2026-Q4&feedback=hidden&error=too_fast",
    );
  });

  it("lists my classes, each linking to its page", async () => {
    serve(standing);
    renderApp("/my-standing?quarter=2026-Q4");
    const table = await screen.findByRole("table", { name: "Your classes" });
    expect(within(table).getByRole("link", { name: "CL-0276" }).getAttribute("href")).toBe("/classes/CL-0276");
    expect(within(table).getByRole("link", { name: "CL-0269" }).getAttribute("href")).toBe("/classes/CL-0269");
    expect(within(table).getByText("5 (83.3 %)")).toBeTruthy();
  });

  it("writes 'too few to show' where the network is hidden, never a zero", async () => {
    const hidden: StandingAnswer = {
      ...standing,
      suppressionMinCount: 8,
      metrics: standing.metrics.map((m) => ({ ...m, network: null, percentileRank: null, ceiling: m.ceiling && { ...m.ceiling, network: null } })),
      spread: { ...standing.spread, points: standing.spread.points.filter((p) => p.isMe) },
      funnel: { ...standing.funnel, networkRate: null, curve: [], me: { ...standing.funnel.me, position: null } },
      errorProfile: { networkSuppressed: true, rows: standing.errorProfile.rows.map((r) => ({ ...r, network: null })) },
    };
    serve(hidden);
    renderApp("/my-standing?quarter=2026-Q4");
    await screen.findByRole("heading", { name: "IN03 · Ilse Pendrake, 2026 Q4" });
    for (const label of ["Score", "Depth", "Rate", "Release (recoil)", "Hands-on time"]) {
      const card = metricCard(label);
      // the ceiling cards name it twice: for the share at 100 % and for the 10th percentile
      expect(within(card).getAllByText("too few to show").length).toBeGreaterThan(0);
      expect(card.textContent).not.toMatch(/Network: 0/);
    }
    expect(screen.getByText(/The network's figures are hidden for these filters/)).toBeTruthy();
    const rows = tableOf("Your errors against the network's");
    expect(rows.map((r) => r[2])).toEqual(standing.errorProfile.rows.map(() => "too few to show"));
  });

  it("compares over the last four quarters too, naming the range in the heading and the classes", async () => {
    const range = { ...standing, period: { from: "2026-Q3", to: "2026-Q4", quarters: ["2026-Q3", "2026-Q4"] } };
    fakeServer({
      "GET /api/me": sessionFor("instructor"),
      "GET /api/insight/options": answer(optionsAnswerSchema, options),
      "GET /api/insight/standing?from=2026-Q3&to=2026-Q4&adjust=case-mix": answer(standingAnswerSchema, range),
    });
    renderApp("/my-standing?quarter=last-4");
    expect(await screen.findByRole("heading", { name: "IN03 · Ilse Pendrake, 2026 Q3 to 2026 Q4" })).toBeTruthy();
    expect(screen.getByRole("heading", { name: "Your classes in 2026 Q3 to 2026 Q4" })).toBeTruthy();
    const period = screen.getByRole("combobox", { name: "Period" }) as HTMLSelectElement;
    expect(period.value).toBe("last-4");
  });

  it("says so when I have no attempts in the quarter", async () => {
    serve({ ...standing, attempts: 0 });
    renderApp("/my-standing?quarter=2026-Q4");
    expect(await screen.findByText("No attempts in your classes in 2026 Q4")).toBeTruthy();
    expect(screen.getByRole("link", { name: "Show 2026 Q3" })).toBeTruthy();
  });
});
