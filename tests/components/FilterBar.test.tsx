import { cleanup, fireEvent, render, screen } from "@testing-library/react";
import { RouterProvider, createMemoryRouter } from "react-router";
import { afterEach, describe, expect, it, vi } from "vitest";
import { FilterBar, feedbackFilter, readFilterValues, useFilterValues, type FilterDefinition } from "../../src/components/FilterBar";

// Rendering with role queries in jsdom is slow on a busy machine; allow for it.
vi.setConfig({ testTimeout: 20_000 });

afterEach(cleanup);

const filters: FilterDefinition[] = [
  {
    key: "quarter",
    options: [
      { value: "2025-Q1", label: "2025 Q1" },
      { value: "2025-Q2", label: "2025 Q2" },
    ],
    allLabel: null,
  },
  {
    key: "site",
    options: [
      { value: "NORTH-1", label: "Northfield" },
      { value: "RIVER-2", label: "Riverside" },
    ],
  },
  {
    key: "patientType",
    options: [
      { value: "adult", label: "Adult" },
      { value: "infant", label: "Infant" },
    ],
  },
  feedbackFilter,
];

function Values() {
  return <output data-testid="values">{JSON.stringify(useFilterValues(filters))}</output>;
}

function renderAt(url: string) {
  const router = createMemoryRouter(
    [
      {
        path: "/overview",
        element: (
          <>
            <FilterBar filters={filters} />
            <Values />
          </>
        ),
      },
    ],
    { initialEntries: [url] },
  );
  render(<RouterProvider router={router} />);
  return router;
}

describe("FilterBar", () => {
  it("reads every filter from the address, so a shared link opens the same view", () => {
    renderAt("/overview?quarter=2025-Q1&site=RIVER-2&patient=infant&feedback=hidden");
    expect(JSON.parse(screen.getByTestId("values").textContent!)).toEqual({ quarter: "2025-Q1", site: "RIVER-2", patientType: "infant", feedback: "hidden" });
    expect((screen.getByLabelText("Site") as HTMLSelectElement).value).toBe("RIVER-2");
  });

  it("writes a change into the address and removes a filter set back to All", () => {
    const router = renderAt("/overview?quarter=2025-Q1");
    fireEvent.change(screen.getByLabelText("Site"), { target: { value: "NORTH-1" } });
    expect(router.state.location.search).toBe("?quarter=2025-Q1&site=NORTH-1");
    fireEvent.change(screen.getByLabelText("Site"), { target: { value: "" } });
    expect(router.state.location.search).toBe("?quarter=2025-Q1");
  });

  it("ignores values that are not among the options, and uses the first option for a required filter", () => {
    const values = readFilterValues(new URLSearchParams("site=%3Dcmd&feedback=maybe"), filters);
    expect(values).toEqual({ quarter: "2025-Q1", site: null, patientType: null, feedback: null });
  });

  it("clears all of its filters but keeps other parameters", () => {
    const router = renderAt("/overview?quarter=2025-Q2&site=NORTH-1&feedback=live&tab=errors");
    fireEvent.click(screen.getByRole("button", { name: "Clear filters" }));
    expect(router.state.location.search).toBe("?tab=errors");
  });
});
