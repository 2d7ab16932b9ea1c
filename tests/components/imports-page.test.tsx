// The imports page: messages about an earlier choice clear when a new one is made, and an undone batch
// stays readable in the history with its time and a note.
import { cleanup, configure, fireEvent, screen, within } from "@testing-library/react";
import { afterEach, describe, expect, it, vi } from "vitest";
import { batchListResponseSchema, presetListResponseSchema, type ImportBatch } from "../../shared/import/api";
import { dataVersionAnswerSchema } from "../../shared/schemas/dataVersion";
import { appliedBatch } from "./importBatch";
import { formatsWithoutColumns } from "./importFormats";
import { renderApp } from "./renderApp";
import { answer, fakeServer, sessionFor } from "./testServer";

vi.setConfig({ testTimeout: 30_000 });
configure({ asyncUtilTimeout: 15_000 });
afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

const historyPath = "GET /api/imports/batches?limit=25&offset=0";

const undone: ImportBatch = { ...appliedBatch, status: "undone", undoneAt: "2026-10-02T09:00:00.000Z" };

function page(batches: ImportBatch[] = []) {
  fakeServer({
    "GET /api/me": sessionFor("coordinator"),
    [historyPath]: answer(batchListResponseSchema, { batches, total: batches.length }),
    "GET /api/imports/formats": formatsWithoutColumns,
    "GET /api/imports/presets?kind=classes": answer(presetListResponseSchema, { presets: [] }),
    "GET /api/data-version": answer(dataVersionAnswerSchema, { version: "run:1:0" }),
  });
  renderApp("/imports");
}

describe("choosing what to import", () => {
  it("clears the message about what the file holds once a kind is chosen", async () => {
    page();
    await screen.findByRole("heading", { name: /Step 1 of 4/ });
    fireEvent.click(screen.getByRole("button", { name: "Upload and preview" }));
    expect(screen.getByText("Choose what the file holds.")).toBeTruthy();
    expect(screen.getByText("Choose a CSV file.")).toBeTruthy();
    fireEvent.click(screen.getByRole("radio", { name: /Class logs/ }));
    expect(screen.queryByText("Choose what the file holds.")).toBeNull();
    // the file's own message stays until a file is chosen
    expect(screen.getByText("Choose a CSV file.")).toBeTruthy();
  });

  it("clears the message about the previous file when another file is chosen", async () => {
    page();
    await screen.findByRole("heading", { name: /Step 1 of 4/ });
    fireEvent.click(screen.getByRole("radio", { name: /Class logs/ }));
    const input = screen.getByLabelText("CSV file");
    fireEvent.change(input, { target: { files: [new File(["x"], "classes.xlsx")] } });
    fireEvent.click(screen.getByRole("button", { name: "Upload and preview" }));
    expect(screen.getByText(/classes\.xlsx is not a \.csv file/)).toBeTruthy();
    fireEvent.change(input, { target: { files: [new File(["class_id;date"], "classes.csv", { type: "text/csv" })] } });
    expect(screen.queryByText(/classes\.xlsx is not a \.csv file/)).toBeNull();
    expect(screen.getByText(/Chosen: classes\.csv/)).toBeTruthy();
  });
});

describe("import history", () => {
  it("keeps an undone batch readable: a whole badge, the time of the undo and a note in the actions column", async () => {
    page([undone]);
    const table = await screen.findByRole("table");
    const row = within(table).getByText("wrenmoor-q3.csv").closest("tr")!;
    expect(within(row).getByText("Undone")).toBeTruthy();
    expect(within(row).getByText("Already undone")).toBeTruthy();
    expect(within(row).queryByRole("button", { name: /Undo batch/ })).toBeNull();
  });
});
