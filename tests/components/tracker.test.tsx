// The quarter tracker page: missing files are said in words, not only shown in colour.
import { cleanup, screen } from "@testing-library/react";
import { afterEach, describe, expect, it, vi } from "vitest";
import { trackerAnswerSchema, type TrackerAnswer } from "../../shared/schemas/tracker";
import { renderApp } from "./renderApp";
import { answer, fakeServer, sessionFor } from "./testServer";
import { formatDay } from "../../src/lib/formatting";

vi.setConfig({ testTimeout: 20_000 });

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

const trackerBody: TrackerAnswer = {
  quarter: "2026-Q2",
  unassignedRejectedRows: 2,
  instructors: [
    {
      instructorId: 1,
      code: "A1",
      name: "Instructor A1",
      siteCode: "NORTH",
      active: true,
      classes: 2,
      attempts: 18,
      lastImportAt: "2026-05-03T10:00:00.000Z",
      rejectedRows: 0,
    },
    {
      instructorId: 2,
      code: "B1",
      name: "Instructor B1",
      siteCode: "SOUTH",
      active: true,
      classes: 1,
      attempts: 0,
      lastImportAt: "2026-04-20T10:00:00.000Z",
      rejectedRows: 3,
    },
  ],
};

describe("quarter tracker page", () => {
  it("says which files are missing and how many refused rows wait", async () => {
    fakeServer({ "GET /api/me": sessionFor("coordinator"), "GET /api/tracker?quarter=2026-Q2": answer(trackerAnswerSchema, trackerBody) });
    renderApp("/tracker?quarter=2026-Q2");
    expect(await screen.findByText("1 active instructor has files missing for 2026 Q2.")).toBeTruthy();
    const b1 = screen.getAllByRole("row").find((row) => row.textContent?.includes("B1"))!;
    expect(b1.textContent).toContain("Arrived (1 class)");
    expect(b1.textContent).toContain("Missing");
    expect(b1.textContent).toContain(formatDay("2026-04-20"));
    expect(screen.getByText(/2 refused rows name no known instructor or class/)).toBeTruthy();
  });
});
