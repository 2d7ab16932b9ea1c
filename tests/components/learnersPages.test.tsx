// The Skill retention and Judgement calibration pages through the real router, with the server's answers
// stubbed at the HTTP boundary: what the quality lead and an instructor each see.
import { cleanup, configure, screen, within } from "@testing-library/react";
import { afterEach, beforeAll, describe, expect, it, vi } from "vitest";
import { optionsAnswerSchema, type OptionsAnswer } from "../../shared/schemas/insight";
import {
  calibrationAnswerSchema,
  retentionAnswerSchema,
  type CalibrationAnswer,
  type CalibrationRow,
  type RetentionAnswer,
  retentionBins,
} from "../../shared/schemas/learners";
import { renderApp } from "./renderApp";
import { answer, fakeServer, sessionFor } from "./testServer";

vi.setConfig({ testTimeout: 30_000 });
configure({ asyncUtilTimeout: 10_000 });

beforeAll(async () => {
  await import("../../src/features/learners/RetentionPage");
  await import("../../src/features/learners/CalibrationPage");
}, 120_000);

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

const options: OptionsAnswer = {
  quarters: ["2026-Q4", "2026-Q3"],
  sites: [],
  patientTypes: ["infant", "child", "adult"],
  feedbackModes: ["live", "hidden"],
  errors: [],
  instructors: [],
  manikins: [],
};
const period = { from: "2026-Q4", to: "2026-Q4", quarters: ["2026-Q4"] };

const retention: RetentionAnswer = {
  period,
  profile: null,
  first_time: { learners: 120, passed: 48, rate: 0.4, ci95: [0.3171, 0.4885] },
  returning: retentionBins.map((months) =>
    months === "6-12" ? { months, learners: 30, passed: 18, rate: 0.6, ci95: [0.4232, 0.7541] } : { months, learners: 0, passed: 0, rate: null, ci95: null },
  ),
};

function row(id: number, code: string, lenient: number, rank: number): CalibrationRow {
  return {
    instructor: { id, code, name: `Name of ${code}` },
    judged: 100,
    both_pass: 40,
    instructor_pass_measured_fail: lenient,
    instructor_fail_measured_pass: 5,
    both_fail: 55 - lenient,
    lenient_share: lenient / 55,
    lenient_ci95: [0.1, 0.9],
    strict_share: 5 / 45,
    strict_ci95: [0.05, 0.24],
    kappa: 0.5,
    kappa_ci95: [0.35, 0.65],
    lenient_rank: rank,
  };
}

describe("Skill retention page", () => {
  it("shows the quality lead first-timers and returns by months, asking for the chosen period", async () => {
    const { requests } = fakeServer({
      "GET /api/me": sessionFor("quality_lead"),
      "GET /api/insight/options": answer(optionsAnswerSchema, options),
      "GET /api/learners/retention?quarter=2026-Q4": answer(retentionAnswerSchema, retention),
    });
    renderApp("/retention?quarter=2026-Q4");
    const table = await screen.findByRole("table", { name: /Returning and first-time learners/ });
    const cells = within(table)
      .getAllByRole("row")
      .slice(1)
      .map((r) => within(r).getAllByRole("cell")[0].textContent);
    expect(cells.slice(0, 3)).toEqual(["First course in the data", "Back within 6 months", "Back after 6–12 months"]);
    expect(requests.some((r) => r.path === "/api/learners/retention?quarter=2026-Q4")).toBe(true);
  });
});

describe("Judgement calibration page", () => {
  it("shows an instructor their own table and no other instructor's name", async () => {
    const own: CalibrationAnswer = {
      period,
      ranked: 3,
      rows: [row(3, "IN03", 20, 2)],
      others: [{ lenient_share: 0.9, strict_share: 0.02, kappa: 0.05 }],
      othersHidden: 1,
    };
    fakeServer({
      "GET /api/me": sessionFor("instructor"),
      "GET /api/insight/options": answer(optionsAnswerSchema, options),
      "GET /api/learners/calibration?quarter=2026-Q4": answer(calibrationAnswerSchema, own),
    });
    renderApp("/calibration?quarter=2026-Q4");
    await screen.findByText(/Your judgement against the measurement \(100 attempts you marked\)/);
    expect(screen.getByText(/How your own pass\/fail agrees/)).toBeTruthy();
    expect(screen.getByText(/Among 3 instructors you pass the 2nd largest share/)).toBeTruthy();
    expect(screen.queryByRole("table", { name: /Each instructor's judgement/ })).toBeNull();
  });

  it("shows the quality lead every instructor, most lenient first", async () => {
    const all: CalibrationAnswer = { period, ranked: 2, rows: [row(1, "IN01", 10, 2), row(11, "IN11", 50, 1)], others: [], othersHidden: 0 };
    fakeServer({
      "GET /api/me": sessionFor("quality_lead"),
      "GET /api/insight/options": answer(optionsAnswerSchema, options),
      "GET /api/learners/calibration?quarter=2026-Q4": answer(calibrationAnswerSchema, all),
    });
    renderApp("/calibration?quarter=2026-Q4");
    const table = await screen.findByRole("table", { name: /Each instructor's judgement/ });
    const first = within(table)
      .getAllByRole("row")
      .slice(1)
      .map((r) => within(r).getAllByRole("cell")[0].textContent);
    expect(first).toEqual(["IN11 · Name of IN11", "IN01 · Name of IN01"]);
    expect(screen.getByText(/Most lenient in 2026 Q4:/).textContent).toContain("IN11 passed 90.9 % of measured failures");
  });
});
