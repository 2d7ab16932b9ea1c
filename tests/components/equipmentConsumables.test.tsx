import { cleanup, fireEvent, render, screen, within } from "@testing-library/react";
import { afterEach, describe, expect, it } from "vitest";
import type { EquipmentAnswer } from "../../shared/schemas/equipment";
import { ConsumablesCharts, consumablesBySite } from "../../src/features/equipment/ConsumablesChart";

afterEach(cleanup);

const item = (fromClassLogs: number, fromEvents: number, learners: number) => ({
  fromClassLogs,
  fromEvents,
  total: fromClassLogs,
  per100Learners: learners ? (100 * fromClassLogs) / learners : null,
});
const row = (
  site: string,
  id: number,
  quarter: string,
  learners: number,
  lungs: [number, number],
  mouthpieces: [number, number],
  batteries: [number, number],
) => ({
  site: { id, code: site },
  quarter,
  learners,
  lungs: item(...lungs, learners),
  mouthpieces: item(...mouthpieces, learners),
  batteries: item(...batteries, learners),
});

// Two quarters at NTH (40 + 60 learners) and one at RIV (30 learners). Per 100 learners = 100 × total /
// learners over the whole period, not the mean of the quarters' rates; the total is the class logs' count
// (the equipment log's, second in each pair, is not added): NTH lungs 2 + 1 = 3 over 100 learners = 3.0;
// RIV lungs 2 over 30 learners = 6.7 (worked by hand).
const rows: EquipmentAnswer["consumables"] = [
  row("NTH", 1, "2026-Q1", 40, [2, 1], [40, 10], [1, 0]),
  row("NTH", 1, "2026-Q2", 60, [1, 1], [70, 0], [0, 2]),
  row("RIV", 2, "2026-Q2", 30, [2, 0], [25, 0], [0, 0]),
];

describe("consumables per 100 learners", { timeout: 30_000 }, () => {
  it("sums each site's quarters before dividing by its learners", () => {
    expect(consumablesBySite(rows)).toEqual([
      { site: "NTH", learners: 100, lungs: 3, mouthpieces: 110, batteries: 1 },
      { site: "RIV", learners: 30, lungs: 2, mouthpieces: 25, batteries: 0 },
    ]);
  });

  it("shows the rates in the table view of each chart", () => {
    render(<ConsumablesCharts rows={rows} period="2026 Q1 to 2026 Q2" />);
    const figure = screen.getByRole("heading", { name: "Lungs replaced" }).closest("figure")!;
    expect(figure.textContent).toContain("most at RIV (6.7), fewest at NTH (3)");
    fireEvent.click(within(figure).getByRole("button", { name: "Show as table" }));
    const cells = within(within(figure).getByRole("table"))
      .getAllByRole("row")
      .slice(1)
      .map((r) =>
        within(r)
          .getAllByRole("cell")
          .map((c) => c.textContent),
      );
    expect(cells).toEqual([
      ["NTH", "100", "3", "3"],
      ["RIV", "30", "2", "6.7"],
    ]);
  });

  it("says so when nothing was recorded", () => {
    render(<ConsumablesCharts rows={[]} period="2026 Q3" />);
    expect(screen.getByText("No consumables recorded in 2026 Q3")).toBeTruthy();
  });
});
