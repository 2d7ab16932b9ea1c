import { cleanup, render, screen, within } from "@testing-library/react";
import { afterEach, describe, expect, it, vi } from "vitest";
import type { ImportSummary } from "../../shared/import/api";
import { ValidationReport, summarySentence } from "../../src/features/imports/ValidationReport";

vi.setConfig({ testTimeout: 20_000 });
afterEach(cleanup);

/** A dry run's summary as the server answers it for a class log with three refused rows and a header warning. */
function refusedSummary(): ImportSummary {
  return {
    file: "classes.csv",
    kind: "classes",
    dryRun: true,
    status: "refused",
    delimiter: "comma",
    batchId: null,
    sha256: "d6fc2f95c925a01efde7ca8997eb7c122fe831fb11e6173491df6b912e2b6501",
    unit: "rows",
    rowsRead: 11,
    inserted: 7,
    updated: 1,
    unchanged: 0,
    rejected: 3,
    attemptsRead: null,
    attemptsRejected: null,
    newCodes: { sites: ["NORTH"], instructors: [], manikins: ["MK-1"] },
    warnings: ['column "room" is not a column of classes files and is ignored'],
    issues: [
      { row: null, column: "room", reason: 'the header names the column "room" twice' },
      { row: 2, column: "class_id", reason: "\"C 102\" may contain only letters, digits, '.', '_' and '-'" },
      { row: 5, column: "course", reason: '"adults" is not allowed; use one of infant, child, adult, all-ages' },
      { row: 9, column: null, reason: "the row has 7 fields; the header has 8" },
    ],
    issuesTotal: 4,
    durationMs: 12,
  };
}

describe("validation report", () => {
  it("lists every issue of the answer with its row, column and reason", () => {
    const summary = refusedSummary();
    render(<ValidationReport summary={summary} rejectedCsvUrl="/api/imports/jobs/abc/rejected.csv" />);

    const table = screen.getByRole("table");
    const rows = within(table).getAllByRole("row").slice(1); // skip the header row
    expect(rows).toHaveLength(summary.issues.length);
    const cells = rows.map((row) =>
      within(row)
        .getAllByRole("cell")
        .map((cell) => cell.textContent),
    );
    expect(cells).toEqual([
      ["Header", "room", 'the header names the column "room" twice'],
      ["2", "class_id", "\"C 102\" may contain only letters, digits, '.', '_' and '-'"],
      ["5", "course", '"adults" is not allowed; use one of infant, child, adult, all-ages'],
      ["9", "whole row", "the row has 7 fields; the header has 8"],
    ]);
    // The numbering is explained next to the table.
    expect(screen.getByText(/Row 1 is the first data row after the header/)).toBeTruthy();
  });

  it("shows the counts, the codes that would be created and the download of refused rows", () => {
    render(<ValidationReport summary={refusedSummary()} rejectedCsvUrl="/api/imports/jobs/abc/rejected.csv" />);
    const count = (label: string) => screen.getByText(label, { selector: "dt" }).parentElement!.querySelector("dd")!.textContent;
    expect(count("Rows read")).toBe("11");
    expect(count("Would be added")).toBe("7");
    expect(count("Would be updated")).toBe("1");
    expect(count("Unchanged")).toBe("0");
    expect(count("Refused")).toBe("3");
    expect(count("New codes")).toBe("2");
    expect(screen.getByText(/would be created: site NORTH, manikin MK-1/)).toBeTruthy();
    const link = screen.getByRole("link", { name: /Download the refused rows/ });
    expect(link.getAttribute("href")).toBe("/api/imports/jobs/abc/rejected.csv");
    expect(screen.getByText(/is not a column of classes files/)).toBeTruthy();
  });

  it("names the separator the file was read with", () => {
    render(<ValidationReport summary={{ ...refusedSummary(), delimiter: "semicolon" }} rejectedCsvUrl={null} />);
    expect(screen.getByText("Columns separated by semicolons.")).toBeTruthy();
  });

  it("says when the list is cut short and the download holds the rest", () => {
    const summary = { ...refusedSummary(), issuesTotal: 1500 };
    render(<ValidationReport summary={summary} rejectedCsvUrl="/x.csv" />);
    expect(screen.getByText(/Showing the first 4 of 1,500 problems/)).toBeTruthy();
  });

  it("words the headline after the outcome", () => {
    const refused = refusedSummary();
    expect(summarySentence(refused)).toBe("3 rows of 11 have problems. Nothing has been written yet.");
    expect(summarySentence({ ...refused, status: "validated", rejected: 0, issues: [], issuesTotal: 0 })).toBe(
      "All 8 rows can be imported. Nothing has been written yet.",
    );
    expect(summarySentence({ ...refused, inserted: 0, updated: 0 })).toBe("No rows can be imported as the file stands. Nothing has been written.");
    expect(summarySentence({ ...refused, dryRun: false, status: "imported", batchId: 9 })).toBe(
      "Imported 8 rows; 3 refused rows kept in the import history to fix.",
    );
    const same = { ...refused, inserted: 0, updated: 0, unchanged: 8, rejected: 0, issues: [], issuesTotal: 0 };
    expect(summarySentence({ ...same, status: "validated" })).toBe("Nothing would change: all 8 rows are already stored as in this file.");
    expect(summarySentence({ ...same, dryRun: false, status: "unchanged" })).toBe(
      "Nothing changed: all 8 rows are already stored as in this file. No batch was recorded.",
    );
  });
});
