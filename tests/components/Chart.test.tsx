import * as Plot from "@observablehq/plot";
import { cleanup, fireEvent, render, screen, within } from "@testing-library/react";
import { afterEach, describe, expect, it, vi } from "vitest";
import { MemoryRouter, Route, Routes, useLocation } from "react-router";
import { Chart } from "../../src/components/Chart";
import type { Column } from "../../src/components/DataTable";

// Rendering with role queries in jsdom is slow on a busy machine; allow for it.
vi.setConfig({ testTimeout: 20_000 });

interface QuarterShare {
  quarter: string;
  share: number;
}

const data: QuarterShare[] = [
  { quarter: "2025-Q1", share: 0.58 },
  { quarter: "2025-Q2", share: 0.64 },
  { quarter: "2025-Q3", share: 0.71 },
];

const columns: Column<QuarterShare>[] = [
  { key: "quarter", header: "Quarter", value: (r) => r.quarter },
  { key: "share", header: "Share in target", value: (r) => r.share, align: "right" },
];

const plot = (rows: readonly QuarterShare[]) => ({ marks: [Plot.barY(rows as QuarterShare[], { x: "quarter", y: "share" })] });

afterEach(cleanup);

function renderChart() {
  return render(
    <Chart
      title="Compressions in target range"
      description="Share of compressions in the target range per quarter, rising from 58 % to 71 %."
      data={data}
      columns={columns}
      rowKey={(r) => r.quarter}
      plot={plot}
    />,
  );
}

describe("Chart", () => {
  it("draws the plot as one labelled image inside a figure with a caption", () => {
    const { container } = renderChart();
    const figure = container.querySelector("figure");
    expect(figure?.querySelector("figcaption")?.textContent).toContain("rising from 58 % to 71 %");
    const image = screen.getByRole("img", { name: "Compressions in target range" });
    expect(image.querySelector("svg")).not.toBeNull();
    expect(screen.queryByRole("table")).toBeNull();
  });

  it("shows the same rows as a table, and the chart again on a second click", () => {
    renderChart();
    fireEvent.click(screen.getByRole("button", { name: "Show as table" }));

    const table = screen.getByRole("table");
    const bodyRows = within(table).getAllByRole("row").slice(1);
    expect(
      bodyRows.map((row) =>
        within(row)
          .getAllByRole("cell")
          .map((cell) => cell.textContent),
      ),
    ).toEqual([
      ["2025-Q1", "0.58"],
      ["2025-Q2", "0.64"],
      ["2025-Q3", "0.71"],
    ]);
    expect(screen.queryByRole("img", { name: "Compressions in target range" })).toBeNull();

    fireEvent.click(screen.getByRole("button", { name: "Show as chart" }));
    expect(screen.queryByRole("table")).toBeNull();
    expect(screen.getByRole("img", { name: "Compressions in target range" }).querySelector("svg")).not.toBeNull();
  });
});

describe("chart marks that open the rows behind them", () => {
  const linkedPlot = (rows: readonly QuarterShare[]) => ({
    marks: [Plot.barY(rows as QuarterShare[], { x: "quarter", y: "share", href: (r: QuarterShare) => `/attempts?quarter=${r.quarter}` })],
  });

  function Where() {
    const location = useLocation();
    return <p data-testid="where">{location.pathname + location.search}</p>;
  }

  function renderLinked() {
    return render(
      <MemoryRouter initialEntries={["/overview"]}>
        <Routes>
          <Route
            path="*"
            element={
              <>
                <Chart
                  title="Linked bars"
                  description="Each bar opens its quarter's attempts."
                  data={data}
                  columns={columns}
                  rowKey={(r) => r.quarter}
                  plot={linkedPlot}
                />
                <Where />
              </>
            }
          />
        </Routes>
      </MemoryRouter>,
    );
  }

  it("follows a click on a mark inside the app, to the mark's own address", () => {
    const { container } = renderLinked();
    const links = container.querySelectorAll('div[role="img"] [data-href]');
    expect(links).toHaveLength(3);
    fireEvent.click(links[1].querySelector("rect") ?? links[1]);
    expect(screen.getByTestId("where").textContent).toBe("/attempts?quarter=2025-Q2");
  });

  it("puts nothing focusable inside the picture: the table view's links are the keyboard's way", () => {
    const { container } = renderLinked();
    expect(container.querySelectorAll('div[role="img"] a, div[role="img"] [tabindex]')).toHaveLength(0);
  });
});
