import { cleanup, configure, screen, within } from "@testing-library/react";
import { afterEach, describe, expect, it, vi } from "vitest";
import { systemReportSchema, type SystemReport } from "../../shared/schemas/system";
import { renderApp } from "./renderApp";
import { answer, fakeServer, sessionFor } from "./testServer";

vi.setConfig({ testTimeout: 30_000 });
configure({ asyncUtilTimeout: 15_000 });
afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

const report: SystemReport = systemReportSchema.parse({
  version: "1.4.0",
  migration: { applied: "0004_backup_log", appliedCount: 5, latest: "0004_backup_log", current: true },
  database: { file: "/srv/quarterbeat/quarterbeat.sqlite", fileBytes: 3_460_000, walBytes: 0, pageSize: 4096, pageCount: 845, freePages: 2 },
  growth: [
    { quarter: "2026-Q2", classes: 40, attempts: 859, compressionStreams: 52 },
    { quarter: "2026-Q3", classes: 41, attempts: 855, compressionStreams: 35 },
  ],
  backups: {
    dir: "/srv/quarterbeat/backups",
    filesInDir: 9,
    bytesInDir: 31_000_000,
    lastVerified: {
      takenAt: "2026-11-29T03:00:00.000Z",
      file: "/srv/quarterbeat/backups/quarterbeat-2026-11-29T030000Z.sqlite",
      sizeBytes: 3_400_000,
      source: "scheduled",
      verified: true,
      message: "Integrity check passed; 8464 rows in 22 tables, each table's count equal to the database's.",
    },
    recent: [
      {
        takenAt: "2026-11-30T03:00:00.000Z",
        file: "/srv/quarterbeat/backups",
        sizeBytes: 0,
        source: "scheduled",
        verified: false,
        message: "ENOSPC: no space left on device",
      },
      {
        takenAt: "2026-11-29T03:00:00.000Z",
        file: "/srv/quarterbeat/backups/quarterbeat-2026-11-29T030000Z.sqlite",
        sizeBytes: 3_400_000,
        source: "scheduled",
        verified: true,
        message: "Integrity check passed; 8464 rows in 22 tables, each table's count equal to the database's.",
      },
    ],
  },
  imports: [
    {
      id: 12,
      kind: "attempts",
      fileName: "wrenmoor-2026-q3-attempts.csv",
      sha256: "ab",
      source: "web",
      status: "applied",
      userId: 3,
      userEmail: "coordinator@network.example",
      rowsRead: 412,
      inserted: 410,
      updated: 0,
      unchanged: 0,
      rejected: 2,
      newCodes: null,
      warnings: null,
      createdAt: "2026-10-04T10:00:00.000Z",
      undoneAt: null,
    },
  ],
  mail: {
    delivery: "smtp",
    server: "smtp://mail.network.example:587",
    reportSends: { sent: 7, failed: 1 },
    lastFailure: { at: "2026-10-03T09:00:00.000Z", error: "ECONNREFUSED: connection refused" },
    outboxMessages: 0,
  },
});

describe("system page", () => {
  it("shows version, size, growth per quarter, backups with a failed newest one, imports and mail", async () => {
    fakeServer({ "GET /api/me": sessionFor("coordinator"), "GET /api/system": answer(systemReportSchema, report) });
    renderApp("/system");
    expect(await screen.findByRole("heading", { level: 1, name: "System" })).toBeTruthy();
    expect(await screen.findByText("1.4.0")).toBeTruthy();
    expect(screen.getByText("Up to date: 0004_backup_log")).toBeTruthy();
    expect(screen.getByText("3.3 MB")).toBeTruthy();

    const growth = screen.getByRole("table", { name: "Stored data per quarter" });
    const rows = within(growth)
      .getAllByRole("row")
      .slice(1)
      .map((row) =>
        within(row)
          .getAllByRole("cell")
          .map((cell) => cell.textContent),
      );
    expect(rows).toEqual([
      ["2026 Q3", "41", "855", "35"],
      ["2026 Q2", "40", "859", "52"],
    ]);

    expect(screen.getByRole("alert").textContent).toContain("failed its verification: ENOSPC: no space left on device");
    const backups = screen.getByRole("table", { name: "Last backups" });
    expect(within(backups).getAllByRole("row")).toHaveLength(3);
    expect(within(backups).getByText("Failed")).toBeTruthy();
    expect(screen.getByText(/9 copies \(29\.6 MB\) in \/srv\/quarterbeat\/backups/)).toBeTruthy();

    const imports = screen.getByRole("table", { name: "Last import batches" });
    expect(within(imports).getByText("wrenmoor-2026-q3-attempts.csv")).toBeTruthy();
    expect(within(imports).getByText("Attempt summaries")).toBeTruthy();

    const mail = screen.getByRole("heading", { name: "Mail" }).closest("section")!;
    expect(within(mail).getByText("Mail is sent through smtp://mail.network.example:587.")).toBeTruthy();
    expect(within(mail).getByText("Report sends failed, waiting for a retry").nextElementSibling?.textContent).toBe("1");
  });

  it("is linked from the coordinator's navigation only, and says so when the answer cannot be read", async () => {
    fakeServer({ "GET /api/me": sessionFor("quality_lead") });
    renderApp("/settings");
    await screen.findByRole("link", { name: "Settings" });
    expect(screen.queryByRole("link", { name: "System" })).toBeNull();
    cleanup();

    fakeServer({ "GET /api/me": sessionFor("coordinator"), "GET /api/system": { status: 200, body: { ...report, database: { file: 3 } } } });
    renderApp("/system");
    expect(await screen.findByRole("link", { name: "System" })).toBeTruthy();
    expect(await screen.findByText("The system state could not be loaded")).toBeTruthy();
  });
});
