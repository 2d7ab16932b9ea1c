// The retention view and the calibration views on hand-built answers: what each role reads.
import { cleanup, render, screen, within } from "@testing-library/react";
import { afterEach, describe, expect, it } from "vitest";
import type { CalibrationAnswer, CalibrationRow, RetentionAnswer } from "../../shared/schemas/learners";
import { AllCalibration, InstructorCalibration, OwnCalibration } from "../../src/features/learners/CalibrationViews";
import { RetentionView, retentionRows } from "../../src/features/learners/RetentionView";

afterEach(cleanup);

const period = { from: "2025-Q1", to: "2026-Q4", quarters: ["2025-Q1", "2025-Q2", "2025-Q3", "2025-Q4", "2026-Q1", "2026-Q2", "2026-Q3", "2026-Q4"] };
const empty = { learners: 0, passed: 0, rate: null, ci95: null };

const retention: RetentionAnswer = {
  period,
  profile: null,
  first_time: { learners: 200, passed: 60, rate: 0.3, ci95: [0.2427, 0.3643] },
  returning: [
    { months: "0-6", ...empty },
    { months: "6-12", learners: 50, passed: 25, rate: 0.5, ci95: [0.366, 0.634] },
    { months: "12-18", learners: 20, passed: 6, rate: 0.3, ci95: [0.1455, 0.519] },
    { months: "18-24", ...empty },
    { months: "24+", ...empty },
  ],
};

describe("RetentionView", { timeout: 30_000 }, () => {
  it("lists first-timers first, then every bin of returns", () => {
    expect(retentionRows(retention).map((r) => [r.group, r.learners, r.rate])).toEqual([
      ["First course in the data", 200, 0.3],
      ["Back within 6 months", 0, null],
      ["Back after 6–12 months", 50, 0.5],
      ["Back after 12–18 months", 20, 0.3],
      ["Back after 18–24 months", 0, null],
      ["Back after 24 months or more", 0, null],
    ]);
  });

  it("describes the fade in words and shows rates with their intervals in the table", () => {
    render(<RetentionView answer={retention} />);
    expect(screen.getByText(/back after 6–12 months 50\.0 % of 50; back after 12–18 months 30\.0 % of 20; first course 30\.0 % of 200/)).toBeTruthy();
    const table = screen.getByRole("table", { name: /Returning and first-time learners/ });
    const second = within(table).getAllByRole("row")[3];
    expect(
      within(second)
        .getAllByRole("cell")
        .map((c) => c.textContent),
    ).toEqual(["Back after 6–12 months", "50", "25", "50.0 %", "36.6–63.4 %"]);
  });
});

function row(code: string, cells: [number, number, number, number], rank: number | null): CalibrationRow {
  const [pp, pf, fp, ff] = cells;
  return {
    instructor: { id: Number(code.slice(2)), code, name: `Instructor ${code}` },
    judged: pp + pf + fp + ff,
    both_pass: pp,
    instructor_pass_measured_fail: pf,
    instructor_fail_measured_pass: fp,
    both_fail: ff,
    lenient_share: pf / (pf + ff),
    lenient_ci95: [0.1, 0.9],
    strict_share: fp / (pp + fp),
    strict_ci95: [0, 0.2],
    kappa: 0.45,
    kappa_ci95: [0.3, 0.6],
    lenient_rank: rank,
  };
}

describe("OwnCalibration", { timeout: 30_000 }, () => {
  const own: CalibrationAnswer = {
    period,
    ranked: 3,
    rows: [row("IN03", [40, 9, 6, 45], 2)],
    others: [
      { lenient_share: 0.9, strict_share: 0.05, kappa: 0.05 },
      { lenient_share: 0.1, strict_share: 0.2, kappa: 0.6 },
    ],
    othersHidden: 1,
  };

  it("shows the instructor's 2×2 table and their figures in words, naming nobody else", () => {
    render(<OwnCalibration answer={own} />);
    const table = screen.getByRole("table");
    expect(
      within(table)
        .getAllByRole("row")
        .map((r) => r.textContent),
    ).toEqual(["Measured passMeasured fail", "You passed409", "You failed645"]);
    // 9 of the 54 measured failures passed; 6 of the 46 measured passes failed
    expect(screen.getByText(/Of 54 attempts the manikin measured as failing, you passed 9/)).toBeTruthy();
    expect(screen.getByText(/Of 46 attempts measured as passing, you failed 6/)).toBeTruthy();
    expect(screen.getByText(/Kappa 0\.45 \(0\.30 to 0\.60\): moderate agreement beyond chance/)).toBeTruthy();
    expect(screen.getByText(/Among 3 instructors you pass the 2nd largest share of measured failures/)).toBeTruthy();
    expect(screen.getByText(/between 10\.0 % and 90\.0 %/).textContent).toContain("1 instructor judged too few attempts");
    expect(document.body.textContent).not.toMatch(/IN0[^3]/);
  });

  it("says so when the instructor marked nothing", () => {
    render(<OwnCalibration answer={{ ...own, rows: [] }} />);
    expect(screen.getByText(/You marked no attempts pass or fail/)).toBeTruthy();
  });
});

describe("AllCalibration", { timeout: 30_000 }, () => {
  it("names the most lenient instructor and lists everyone, most lenient first", () => {
    const all: CalibrationAnswer = { period, ranked: 2, rows: [row("IN01", [40, 5, 2, 45], 2), row("IN11", [40, 45, 1, 5], 1)], others: [], othersHidden: 0 };
    render(<AllCalibration answer={all} />);
    expect(screen.getByText(/Most lenient in 2025 Q1 to 2026 Q4:/).textContent).toContain("IN11 passed 90.0 % of measured failures");
    const table = screen.getByRole("table", { name: /Each instructor's judgement/ });
    const names = within(table)
      .getAllByRole("row")
      .slice(1)
      .map((r) => within(r).getAllByRole("cell")[0].textContent);
    expect(names).toEqual(["IN11 · Instructor IN11", "IN01 · Instructor IN01"]);
    // the 2×2 cells of the lenient instructor: 40 both pass, 45 passed measured failures, 1, 5
    const cells = within(within(table).getAllByRole("row")[1])
      .getAllByRole("cell")
      .map((c) => c.textContent);
    expect(cells.slice(1, 6)).toEqual(["91", "40", "45", "1", "5"]);
  });
});

describe("InstructorCalibration", { timeout: 30_000 }, () => {
  it("speaks of the instructor by code on their page", () => {
    const all: CalibrationAnswer = { period, ranked: 2, rows: [row("IN01", [40, 5, 2, 45], 2), row("IN11", [40, 45, 1, 5], 1)], others: [], othersHidden: 0 };
    render(<InstructorCalibration answer={all} instructorId={11} />);
    expect(screen.getByText(/IN11's judgement against the measurement \(91 attempts they marked\)/)).toBeTruthy();
    expect(screen.getByText(/Of 50 attempts the manikin measured as failing, IN11 passed 45/)).toBeTruthy();
    expect(screen.getByText(/Among 2 instructors IN11 passes the largest share of measured failures/)).toBeTruthy();
    expect(within(screen.getByRole("table")).getAllByRole("row")[1].textContent).toBe("IN11 passed4045");
  });

  it("says so when the instructor marked nothing", () => {
    render(<InstructorCalibration answer={{ period, ranked: 0, rows: [], others: [], othersHidden: 0 }} instructorId={11} />);
    expect(screen.getByText(/This instructor marked no attempts pass or fail in 2025 Q1 to 2026 Q4/)).toBeTruthy();
  });
});
