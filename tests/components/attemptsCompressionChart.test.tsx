import { cleanup, fireEvent, render, screen, within } from "@testing-library/react";
import { afterEach, describe, expect, it } from "vitest";
import { DEFAULT_POLICY } from "../../shared/scoring/policy";
import { CompressionCharts } from "../../src/features/attempts/CompressionCharts";
import { compressionSeries } from "../../src/features/attempts/compressionSeries";

afterEach(cleanup);

// The worked example of docs/scoring.md section 4 (seven compressions, adult manikin). The adult band
// 50–60 mm is AHA 2020 (at least 2 in / 5 cm, at most 2.4 in / 6 cm) and ERC 2021 (5–6 cm); rate 100–120 per
// minute AHA 2020; the 5 mm recoil tolerance and the 2 s pause threshold are project defaults.
const stream = {
  t_ms: [0, 500, 1050, 1650, 4650, 5150, 5600],
  depth_mm: [52, 48, 55, 61, 57, 58, 50],
  release_mm: [2, 1, 6, 3, 0, 5, 2],
};
const band = DEFAULT_POLICY.bands.adult;

function renderCharts(unit: "mm" | "in" = "mm") {
  const series = compressionSeries(stream, band, DEFAULT_POLICY.pauseThresholdS, DEFAULT_POLICY.longPauseLimitS);
  render(<CompressionCharts series={series} band={band} unit={unit} pauseThresholdS={2} longPauseLimitS={10} />);
}

function tableOf(chartTitle: string) {
  const figure = screen.getByRole("heading", { name: chartTitle }).closest("figure")!;
  fireEvent.click(within(figure).getByRole("button", { name: "Show as table" }));
  const table = within(figure).getByRole("table");
  const header = within(table)
    .getAllByRole("columnheader")
    .map((cell) => cell.textContent?.trim());
  const rows = within(table)
    .getAllByRole("row")
    .slice(1)
    .map((row) =>
      within(row)
        .getAllByRole("cell")
        .map((cell) => cell.textContent?.trim() ?? ""),
    );
  return { header, rows };
}

describe("compression charts, table view", { timeout: 30_000 }, () => {
  it("lists every compression with its depth class, matching the band (limits on target)", () => {
    renderCharts();
    const { header, rows } = tableOf("Depth of each compression");
    expect(header).toEqual(["Compression", "Time (s)", "Depth (mm)", "Depth class"]);
    expect(rows).toHaveLength(7);
    // Classes worked by hand in docs/scoring.md: 48 mm is below 50 (too shallow), 61 mm above 60 (too deep),
    // 50 mm sits on the lower limit and counts as on target.
    expect(rows.map((r) => [r[0], r[2], r[3]])).toEqual([
      ["1", "52", "On target"],
      ["2", "48", "Too shallow"],
      ["3", "55", "On target"],
      ["4", "61", "Too deep"],
      ["5", "57", "On target"],
      ["6", "58", "On target"],
      ["7", "50", "On target"],
    ]);
    // Independently of the component: every class agrees with the band for the depth shown.
    for (const [, , depth, cls] of rows) {
      const mm = Number(depth);
      const expected = mm < band.depthMinMm ? "Too shallow" : mm > band.depthMaxMm ? "Too deep" : "On target";
      expect(cls).toBe(expected);
    }
  });

  it("keeps the classes when depths are shown in inches", () => {
    renderCharts("in");
    const { header, rows } = tableOf("Depth of each compression");
    expect(header[2]).toBe("Depth (in)");
    // 48 mm = 1.89 in and 61 mm = 2.40 in (1 in = 25.4 mm, 1959 international yard and pound agreement).
    expect(rows[1].slice(2)).toEqual(["1.89", "Too shallow"]);
    expect(rows[3].slice(2)).toEqual(["2.4", "Too deep"]);
  });

  it("gives a rate only where the interval is not a pause, classed against 100–120 per minute", () => {
    renderCharts();
    const { rows } = tableOf("Rate from each interval");
    // docs/scoring.md section 4: 500 ms → 120 (on target, the limit), 550 ms → 109, 600 ms → 100 (the limit),
    // 3000 ms is a pause (no rate), 500 ms → 120, 450 ms → 133 (too fast).
    expect(rows.map((r) => [r[0], r[2], r[3], r[4]])).toEqual([
      ["2", "500", "120", "On target"],
      ["3", "550", "109", "On target"],
      ["4", "600", "100", "On target"],
      ["6", "500", "120", "On target"],
      ["7", "450", "133", "Too fast"],
    ]);
  });

  it("marks incomplete recoil above the tolerance and lists the pause with its length", () => {
    renderCharts();
    const { rows } = tableOf("Recoil after each compression");
    expect(rows.map((r) => r[3])).toEqual(["Full", "Full", "Incomplete", "Full", "Full", "Full", "Full"]);
    const pauses = within(screen.getByRole("table", { name: "Pauses" }))
      .getAllByRole("row")
      .slice(1);
    expect(
      pauses.map((row) =>
        within(row)
          .getAllByRole("cell")
          .map((c) => c.textContent),
      ),
    ).toEqual([["1.65", "4.65", "3", "5", "No"]]);
  });
});
