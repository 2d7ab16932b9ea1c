// The attempt page through the real router with the server's answer stubbed: the pass rule as a checklist
// (the value that decided, never rounded onto its threshold; the pass mark; the margin; which way a share
// missed), the attempt's percentile among the network's attempts, the demoted composite score, and the
// per-compression view behind its toggle.
import { cleanup, configure, fireEvent, screen, within } from "@testing-library/react";
import { afterEach, beforeAll, describe, expect, it, vi } from "vitest";
import { attemptDetailAnswerSchema, type AttemptDetailAnswer } from "../../shared/schemas/insight";
import { DEFAULT_POLICY } from "../../shared/scoring/policy";
import { decisiveDecimals, marginWords, ordinal } from "../../src/features/attempts/labels";
import { compressionSeries } from "../../src/features/attempts/compressionSeries";
import { distribution, ribbon } from "../../src/features/attempts/compressionDistribution";
import { renderApp } from "./renderApp";
import { answer, fakeServer, sessionFor } from "./testServer";

vi.setConfig({ testTimeout: 30_000 });
configure({ asyncUtilTimeout: 10_000 });

beforeAll(async () => {
  await import("../../src/features/attempts/AttemptDetailPage");
}, 120_000);

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

const adult = DEFAULT_POLICY.bands.adult;
// eight compressions at 0.5 s (120/min), a 3 s pause, then three more; depths around the 50–60 mm band
const stream = {
  compressions: 11,
  t_ms: [0, 500, 1000, 1500, 2000, 2500, 3000, 3500, 6500, 7000, 7500],
  depth_mm: [48, 52, 55, 61, 49.5, 50, 60, 58, 47, 53, 56],
  release_mm: [1, 0, 2, 6, 0, 1, 0, 0, 0, 1, 0],
  band: adult,
};

const detailBody = (overrides: { placement?: AttemptDetailAnswer["placement"]; stream?: typeof stream | null } = {}): AttemptDetailAnswer => ({
  attempt: {
    id: "AT-9",
    classId: "CL-0276",
    learner: "L-5WVLM",
    startedAt: "2026-10-17T09:09:00Z",
    quarter: "2026-Q4",
    profile: "adult",
    feedback: "live",
    site: { id: 1, code: "WRM" },
    instructor: { id: 3, code: "IN03" },
    manikin: null,
    metrics: {
      durationS: 120,
      compressions: 230,
      rateCpm: 119.4,
      depthMm: 52,
      depthOkPct: 69.6,
      tooShallowPct: 26.1,
      tooDeepPct: 4.3,
      rateOkPct: 56,
      tooSlowPct: 2,
      tooFastPct: 42,
      recoilOkPct: 70,
      handsOnPct: 78,
      longestPauseS: 10.4,
      pauses: 2,
      pausesOver10s: 1,
    },
    score: 65.2,
    passed: false,
    instructorResult: "pass",
    errors: ["too_shallow", "too_fast", "long_pause"],
    policyVersion: 1,
    source: "stream",
    hasStream: true,
  },
  scoring: { passRule: DEFAULT_POLICY.passRule, band: adult, pauseThresholdS: 2, longPauseLimitS: 10 },
  placement: overrides.placement ?? {
    quarter: "2026-Q4",
    profile: "adult",
    attempts: 236,
    hidden: false,
    percentiles: { score: 23.4, depthOkPct: 31.25, rateOkPct: 12, recoilOkPct: 40.5, handsOnPct: 61 },
  },
  errorLabels: [],
  scoreHistory: [],
  stream: overrides.stream === undefined ? stream : overrides.stream,
});

function open(body = detailBody(), role: "quality_lead" | "instructor" | "coordinator" = "quality_lead") {
  fakeServer({ "GET /api/me": sessionFor(role), "GET /api/attempts/AT-9": answer(attemptDetailAnswerSchema, body) });
  return renderApp("/attempts/AT-9?from=%2Fattempts%3Fquarter%3D2026-Q4");
}

async function criterion(name: string) {
  const heading = await screen.findByRole("heading", { name, level: 3 });
  return heading.closest("li")!;
}

const figure = (item: HTMLElement, label: string) => within(item).getByText(label, { selector: "dt" }).nextElementSibling!.textContent;

describe("pass rule checklist", () => {
  it("shows the value that decided, never rounded onto the pass mark, with the margin and which way the share missed", async () => {
    open();
    const depth = await criterion("Depth on target");
    expect(figure(depth, "This attempt")).toBe("69.6 %");
    expect(figure(depth, "Pass mark")).toBe("at least 70 %");
    expect(figure(depth, "Margin")).toBe("0.4 points short");
    expect(within(depth).getByText("Missed: mostly too shallow")).toBeTruthy();
    expect(depth.textContent).toContain("26.1 % too shallow, 4.3 % too deep");

    const rate = await criterion("Rate on target");
    expect(figure(rate, "This attempt")).toBe("56 %");
    expect(figure(rate, "Margin")).toBe("14 points short");
    expect(within(rate).getByText("Missed: mostly too fast")).toBeTruthy();
  });

  it("counts a value exactly on the pass mark as met, and a pause over the limit as missed", async () => {
    open();
    const recoil = await criterion("Full recoil");
    expect(figure(recoil, "This attempt")).toBe("70 %");
    expect(figure(recoil, "Margin")).toBe("exactly on the mark");
    expect(within(recoil).getByText("Met")).toBeTruthy();

    const handsOn = await criterion("Hands-on time");
    expect(figure(handsOn, "Pass mark")).toBe("at least 60 %");
    expect(figure(handsOn, "Margin")).toBe("18 points to spare");

    const pause = await criterion("Longest pause");
    expect(figure(pause, "This attempt")).toBe("10.4 s");
    expect(figure(pause, "Pass mark")).toBe("at most 10 s");
    expect(figure(pause, "Margin")).toBe("0.4 s over");
    expect(within(pause).getByText("Missed: long interruption")).toBeTruthy();

    expect(screen.getByText("Not passed: 3 of 5 criteria missed")).toBeTruthy();
    expect(screen.getByRole("complementary", { name: "About these targets" }).textContent).toContain("not a medical device");
  });

  it("gives each share's percentile among the network's attempts", async () => {
    open();
    expect(figure(await criterion("Depth on target"), "In the network")).toBe("31st percentile");
    expect(figure(await criterion("Rate on target"), "In the network")).toBe("12th percentile");
    expect(figure(await criterion("Hands-on time"), "In the network")).toBe("61st percentile");
  });
});

describe("the attempt among the network", () => {
  it("places the score among the network's attempts of its patient type and quarter, and demotes the composite score", async () => {
    open();
    const section = (await screen.findByRole("heading", { name: "Among the network", level: 2 })).closest("section")!;
    expect(section.textContent).toContain("23rd percentile of the network’s 236 adult attempts in 2026 Q4");
    expect(section.textContent).toContain("higher than 23.4 % of them");
    expect(section.textContent).toContain("Composite score 65 of 100");
    expect(section.textContent).toContain("ignores hands-on time and pauses");
  });

  it("says why the placement is not shown when the group is hidden from an instructor", async () => {
    const hidden: AttemptDetailAnswer["placement"] = {
      quarter: "2026-Q4",
      profile: "adult",
      attempts: null,
      hidden: true,
      percentiles: { score: null, depthOkPct: null, rateOkPct: null, recoilOkPct: null, handsOnPct: null },
    };
    open(detailBody({ placement: hidden }), "instructor");
    const section = (await screen.findByRole("heading", { name: "Among the network", level: 2 })).closest("section")!;
    expect(section.textContent).toContain("are not shown");
    expect(section.textContent).not.toContain("percentile of");
    expect(figure(await criterion("Depth on target"), "In the network")).toBe("not shown");
  });
});

describe("compressions", () => {
  it("shows the time in the band and the distributions, and each compression only when asked", async () => {
    open();
    await screen.findByRole("heading", { name: "Time in the band" });
    expect(screen.getByRole("heading", { name: "How deep the compressions were" })).toBeTruthy();
    expect(screen.queryByRole("heading", { name: "Depth of each compression" })).toBeNull();
    const toggle = screen.getByRole("button", { name: "Show each compression" });
    expect(toggle.getAttribute("aria-expanded")).toBe("false");
    fireEvent.click(toggle);
    expect(await screen.findByRole("heading", { name: "Depth of each compression" })).toBeTruthy();
    expect(screen.getByRole("button", { name: "Hide each compression" }).getAttribute("aria-expanded")).toBe("true");
    fireEvent.click(screen.getByRole("button", { name: "Hide each compression" }));
    expect(screen.queryByRole("heading", { name: "Depth of each compression" })).toBeNull();
  });

  it("says so when the manikin sent a summary only", async () => {
    open(detailBody({ stream: null }), "coordinator");
    expect(await screen.findByText("No compression stream for this attempt")).toBeTruthy();
    expect(screen.queryByRole("button", { name: "Show each compression" })).toBeNull();
  });
});

describe("numbers beside a threshold", () => {
  it("takes as many decimals as keep a value on its side of the threshold and its margin from reading zero", () => {
    expect(decisiveDecimals(69.6, 70)).toBe(1);
    expect(decisiveDecimals(69.96, 70)).toBe(2);
    expect(decisiveDecimals(70.04, 70)).toBe(2);
    expect(decisiveDecimals(70, 70)).toBe(0);
    expect(decisiveDecimals(84.4, 70)).toBe(0);
    expect(marginWords(69.86301369863014, 70, "atLeast", "points")).toBe("0.1 points short");
    expect(marginWords(71, 70, "atLeast", "points")).toBe("1 point to spare");
    expect(marginWords(8.3, 10, "atMost", "s", 1)).toBe("1.7 s to spare");
    expect(ordinal(1)).toBe("1st");
    expect(ordinal(12)).toBe("12th");
    expect(ordinal(23)).toBe("23rd");
    expect(ordinal(101)).toBe("101st");
  });
});

describe("compression distribution and time in the band", () => {
  const series = compressionSeries(stream, adult, 2, 10);

  it("bins depths with edges on the band's limits", () => {
    const bins = distribution(
      series.points.map((p) => ({ value: p.depthMm, cls: p.depthClass === "too_shallow" ? "low" : p.depthClass === "too_deep" ? "high" : "on" })),
      1,
      0,
      Infinity,
    );
    expect(bins[0]).toMatchObject({ from: 47, to: 48, low: 1 });
    // 60 mm is on target (limits on target) and 61 mm too deep: each in its own bin
    expect(bins.find((b) => b.from === 60)).toMatchObject({ on: 1, high: 0 });
    expect(bins.find((b) => b.from === 61)).toMatchObject({ on: 0, high: 1 });
    expect(bins.reduce((n, b) => n + b.low + b.on + b.high, 0)).toBe(11);
  });

  it("counts the compressing time in each band, leaving the pause out", () => {
    const { shares } = ribbon(series);
    const depth = shares.find((s) => s.lane === "depth")!;
    // 11 compressions, each holding 0.5 s (the typical interval before the pause and for the last): 5.5 s;
    // in the band: 52, 55, 50, 60, 58, 53, 56 → 7 × 0.5 s
    expect(depth.seconds).toBeCloseTo(5.5, 9);
    expect(depth.on).toBeCloseTo(3.5, 9);
    expect(depth.low).toBeCloseTo(1.5, 9);
    const rate = shares.find((s) => s.lane === "rate")!;
    // 9 rated intervals of 0.5 s (120/min, on target); the first compression and the one after the pause have none
    expect(rate.seconds).toBeCloseTo(4.5, 9);
    expect(rate.on).toBeCloseTo(4.5, 9);
  });
});
