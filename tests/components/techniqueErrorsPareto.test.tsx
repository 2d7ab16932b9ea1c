import { cleanup, fireEvent, render, screen, within } from "@testing-library/react";
import { MemoryRouter } from "react-router";
import { afterEach, describe, expect, it } from "vitest";
import { ParetoChart, type ParetoRow } from "../../src/features/techniqueErrors/ParetoChart";

afterEach(cleanup);

// A hand-worked Pareto: 100 errors in 160 attempts. Cumulative share = running total / all errors, most
// frequent first (the Pareto chart as in Montgomery, Introduction to Statistical Quality Control, ch. 5;
// from memory): 50/100, 80/100, 95/100, 100/100.
const rows: ParetoRow[] = [
  { error: "too_shallow", label: "Compressions mostly not deep enough", count: 50, share: 0.5, cumulativeShare: 0.5, attemptShare: 50 / 160 },
  { error: "too_fast", label: "Compression rate mostly above the target", count: 30, share: 0.3, cumulativeShare: 0.8, attemptShare: 30 / 160 },
  { error: "incomplete_recoil", label: "Chest not released fully between compressions", count: 15, share: 0.15, cumulativeShare: 0.95, attemptShare: 15 / 160 },
  { error: "long_pause", label: "An interruption longer than allowed", count: 5, share: 0.05, cumulativeShare: 1, attemptShare: 5 / 160 },
];

describe("error Pareto", { timeout: 30_000 }, () => {
  it("shows the cumulative shares of the data, in order, and they follow from the counts", () => {
    render(
      <MemoryRouter>
        <ParetoChart rows={rows} attempts={160} examineHref={(row) => `?error=${row.error}`} />
      </MemoryRouter>,
    );
    expect(screen.getByText(/100 errors in 160 attempts/)).toBeTruthy();
    fireEvent.click(screen.getByRole("button", { name: "Show as table" }));
    const table = screen.getByRole("table");
    const header = within(table)
      .getAllByRole("columnheader")
      .map((c) => c.textContent?.trim());
    const column = header.indexOf("Cumulative share (%)");
    const countColumn = header.indexOf("Attempts with it");
    const body = within(table)
      .getAllByRole("row")
      .slice(1)
      .map((row) =>
        within(row)
          .getAllByRole("cell")
          .map((c) => c.textContent ?? ""),
      );

    expect(body.map((cells) => cells[column])).toEqual(["50.0 %", "80.0 %", "95.0 %", "100.0 %"]);

    // Recompute from the counts shown: running total over the total.
    const counts = body.map((cells) => Number(cells[countColumn]));
    const total = counts.reduce((a, b) => a + b, 0);
    let running = 0;
    for (const [i, count] of counts.entries()) {
      running += count;
      expect(body[i][column]).toBe(`${((100 * running) / total).toFixed(1)} %`);
    }
    // Share of attempts: 50 of 160 attempts = 31.25 %.
    expect(body[0][header.indexOf("Share of attempts (%)")]).toBe("31.3 %");
  });

  it("links each error to its trend and breakdown", () => {
    render(
      <MemoryRouter>
        <ParetoChart rows={rows} attempts={160} examineHref={(row) => `/errors?error=${row.error}`} selected="too_fast" />
      </MemoryRouter>,
    );
    fireEvent.click(screen.getByRole("button", { name: "Show as table" }));
    const link = screen.getByRole("link", { name: /Trend and breakdown of “Compressions mostly not deep enough”/ });
    expect(link.getAttribute("href")).toBe("/errors?error=too_shallow");
    expect(screen.getByText("Shown below")).toBeTruthy();
  });
});
