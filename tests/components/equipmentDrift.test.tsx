// The equipment page's comparison of manikins with their peers, on a hand-built answer: the flagged manikin
// named with its offset, its paired differences over time, and a link to its attempts.
import { cleanup, fireEvent, render, screen, within } from "@testing-library/react";
import { MemoryRouter } from "react-router";
import { afterEach, describe, expect, it } from "vitest";
import type { DriftAnswer } from "../../shared/schemas/equipment";
import { DriftView } from "../../src/features/equipment/DriftSection";

afterEach(cleanup);

const period = { from: "2026-Q1", to: "2026-Q4", quarters: ["2026-Q1", "2026-Q2", "2026-Q3", "2026-Q4"] };
const differences = [4.5, 3.5, 4.25, 3.75, 4].map((difference_mm, i) => ({
  classId: `CL-${i + 1}`,
  date: `2026-0${i + 1}-10`,
  difference_mm,
  attempts: 3,
  peer_attempts: 6,
}));

const answer: DriftAnswer = {
  period,
  rule: { minClasses: 5, minOffsetMm: 3 },
  manikins: [
    {
      manikin: "NTH-A01",
      site: "NTH",
      profile: "adult",
      classes: 5,
      offset_mm: -0.4,
      se_mm: 0.3,
      ci95: [-0.99, 0.19],
      flag: "ok",
      flagged_in_round: null,
      differences: [],
    },
    {
      manikin: "NTH-A02",
      site: "NTH",
      profile: "adult",
      classes: 5,
      offset_mm: 4,
      se_mm: 0.1768,
      ci95: [3.65, 4.35],
      flag: "check",
      flagged_in_round: 1,
      differences,
    },
    {
      manikin: "NTH-I01",
      site: "NTH",
      profile: "infant",
      classes: 2,
      offset_mm: 1,
      se_mm: 0.5,
      ci95: [0.02, 1.98],
      flag: "too few classes",
      flagged_in_round: null,
      differences: [],
    },
  ],
};

function renderView(value: DriftAnswer) {
  render(
    <MemoryRouter>
      <DriftView answer={value} links={{ attempts: (assetId) => `/attempts?manikin=${assetId}`, manikin: (assetId) => `/equipment/manikins/${assetId}` }} />
    </MemoryRouter>,
  );
}

describe("DriftView", { timeout: 30_000 }, () => {
  it("names the flagged manikin with its offset and links to its record and its attempts", () => {
    renderView(answer);
    const verdict = screen.getByText(/reads \+4\.0 mm against its peers/);
    expect(verdict.textContent).toBe("NTH-A02 reads +4.0 mm against its peers");
    expect(within(verdict).getByRole("link", { name: "NTH-A02" }).getAttribute("href")).toBe("/equipment/manikins/NTH-A02");
    expect(screen.getByRole("link", { name: "Open NTH-A02’s record" }).getAttribute("href")).toBe("/equipment/manikins/NTH-A02");
    expect(screen.getByRole("link", { name: "Attempts on NTH-A02" }).getAttribute("href")).toBe("/attempts?manikin=NTH-A02");
    expect(screen.getByText(/at least 5 classes, its mean difference is at least 3 mm/)).toBeTruthy();
  });

  it("shows the paired differences class by class as the chart's table", () => {
    renderView(answer);
    const figure = screen.getByRole("heading", { name: "NTH-A02: depth against its peers, class by class" }).closest("figure")!;
    expect(figure.textContent).toContain("offset +4.0 mm (95 % interval +3.7 mm to +4.4 mm), flagged in comparison round 1");
    fireEvent.click(within(figure).getByRole("button", { name: "Show as table" }));
    const rows = within(within(figure).getByRole("table")).getAllByRole("row").slice(1);
    expect(rows.map((r) => within(r).getAllByRole("cell")[2].textContent)).toEqual(["+4.5 mm", "+3.5 mm", "+4.3 mm", "+3.8 mm", "+4.0 mm"]);
  });

  it("lists every manikin with its judgement, flagged first", () => {
    renderView(answer);
    const table = screen.getByRole("table", { name: /Manikins against their peers/ });
    const rows = within(table)
      .getAllByRole("row")
      .slice(1)
      .map((r) =>
        within(r)
          .getAllByRole("cell")
          .map((c) => c.textContent),
      );
    expect(rows.map((r) => [r[0], r[4], r[6]])).toEqual([
      ["NTH-A02", "+4.0 mm", "Check the depth sensor"],
      ["NTH-A01", "−0.4 mm", "In line with its peers"],
      ["NTH-I01", "+1.0 mm", "Too few shared classes to judge"],
    ]);
  });

  it("says so when no manikin stands out", () => {
    renderView({ ...answer, manikins: [answer.manikins[0]] });
    expect(screen.getByText("No manikin reads clearly deeper or shallower than its peers in this period.")).toBeTruthy();
  });
});
