// The Methods page: open to every signed-in role (a funder here), one section per method with its sources.
import { cleanup, configure, screen, within } from "@testing-library/react";
import { afterEach, describe, expect, it, vi } from "vitest";
import { methodNotes } from "../../shared/methods";
import { renderApp } from "./renderApp";
import { fakeServer, sessionFor } from "./testServer";

vi.setConfig({ testTimeout: 30_000 });
configure({ asyncUtilTimeout: 10_000 });

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

describe("methods page", () => {
  it("states each method with its source, for a funder too, with the training-tool caution", async () => {
    fakeServer({ "GET /api/me": sessionFor("funder") });
    renderApp("/methods");
    await screen.findByRole("heading", { name: "Methods", level: 1 });
    const funnel = screen.getByRole("heading", { name: "Funnel plots and overdispersion", level: 2 }).closest("section")!;
    expect(funnel.textContent).toContain("widened by the square root of φ");
    expect(within(funnel).getByText(/Handling over-dispersion of performance indicators/)).toBeTruthy();
    const main = screen.getByRole("main");
    expect(
      within(main)
        .getAllByRole("heading", { level: 2 })
        .map((h) => h.textContent),
    ).toEqual(methodNotes.map((note) => note.title));
    expect(screen.getByRole("link", { name: "Control chart of the pass rate by quarter" }).getAttribute("href")).toBe("#control-chart");
    expect(within(main).getByRole("complementary", { name: "About these targets" }).textContent).toContain("training-quality tool, not a medical device");
    // in the navigation of a funder
    expect(screen.getByRole("link", { name: "Methods" })).toBeTruthy();
  });
});
