// The one date and number format of the client: every page writes a day the same way, in the user's locale,
// and no other module formats dates or counts on its own.
import fs from "node:fs";
import path from "node:path";
import { QueryClientProvider } from "@tanstack/react-query";
import { cleanup, configure, render, screen, within } from "@testing-library/react";
import { afterEach, describe, expect, it, vi } from "vitest";
import { batchListResponseSchema } from "../../shared/import/api";
import { dataVersionAnswerSchema } from "../../shared/schemas/dataVersion";
import type { ReportVersion } from "../../shared/schemas/report";
import { createQueryClient } from "../../src/app/queryClient";
import { VersionsPanel } from "../../src/features/report/VersionsPanel";
import {
  formatCount,
  formatDateTime,
  formatDay,
  formatDecimal,
  formatLocale,
  formatMonth,
  formatRecordedClock,
  formatRecordedDateTime,
  setFormatLocale,
} from "../../src/lib/formatting";
import { appliedBatch } from "./importBatch";
import { formatsWithoutColumns } from "./importFormats";
import { renderApp } from "./renderApp";
import { answer, fakeServer, sessionFor } from "./testServer";

vi.setConfig({ testTimeout: 30_000 });
configure({ asyncUtilTimeout: 15_000 });
afterEach(() => {
  cleanup();
  setFormatLocale(null);
  vi.unstubAllGlobals();
});

describe("the formatting module", () => {
  it("writes days, times and counts in the chosen locale", () => {
    setFormatLocale("en-GB");
    expect(formatDay("2026-12-02")).toBe("2 Dec 2026");
    expect(formatDay("2026-12-02T23:30:00Z")).toBe("2 Dec 2026"); // the day as written, in any time zone
    expect(formatRecordedDateTime("2026-11-30T09:24:05Z")).toBe("30 Nov 2026, 09:24");
    expect(formatRecordedClock("2026-11-30T09:24:05Z")).toBe("09:24");
    expect(formatCount(12345)).toBe("12,345");
    expect(formatDecimal(36.66, 1)).toBe("36.7");
    expect(formatMonth("2026-01")).toBe("Jan 2026");

    setFormatLocale("en-US");
    expect(formatDay("2026-12-02")).toBe("Dec 2, 2026");
    setFormatLocale("de-DE");
    expect(formatCount(12345)).toBe("12.345");
    expect(formatDecimal(36.66, 1)).toBe("36,7");
  });

  it("writes the same day text in every date format, so no page reads “Sep” beside “Sept”", () => {
    for (const locale of ["en-GB", "en-US"]) {
      setFormatLocale(locale);
      for (const month of ["01", "05", "09", "12"]) {
        const day = formatDay(`2026-${month}-14`);
        expect(formatRecordedDateTime(`2026-${month}-14T12:00:00Z`).startsWith(day), `${locale} ${month}`).toBe(true);
        expect(formatDateTime(`2026-${month}-14T12:00:00Z`).startsWith(day), `${locale} ${month}`).toBe(true);
      }
    }
  });

  it("takes the browser's first language, and English when it has none it knows", () => {
    vi.stubGlobal("navigator", { languages: ["en-US", "en-GB"], language: "en-US" });
    expect(formatLocale()).toBe("en-US");
    setFormatLocale(null); // the browser's language is read once; read it again
    vi.stubGlobal("navigator", { languages: [], language: "not a locale!" });
    expect(formatLocale()).toBe("en-GB");
  });

  it("leaves text it cannot read as it is, and writes a dash for a missing value", () => {
    expect(formatDay("someday")).toBe("someday");
    expect(formatDay(null)).toBe("–");
    expect(formatDateTime("later")).toBe("later");
    expect(formatCount(null)).toBe("–");
  });

  it("is the only client module that formats dates or numbers through Intl or toLocale…", () => {
    const offenders: string[] = [];
    const walk = (dir: string) => {
      for (const entry of fs.readdirSync(dir, { withFileTypes: true })) {
        const file = path.join(dir, entry.name);
        if (entry.isDirectory()) walk(file);
        else if (/\.tsx?$/.test(entry.name) && !file.endsWith(path.join("lib", "formatting.ts"))) {
          if (/toLocale(Date|Time)?String|Intl\.(DateTimeFormat|NumberFormat)/.test(fs.readFileSync(file, "utf8"))) offenders.push(file);
        }
      }
    };
    walk(path.resolve(__dirname, "../../src"));
    expect(offenders).toEqual([]);
  });
});

describe("pages", () => {
  it("write an import's time and a report version's time in the same format", async () => {
    setFormatLocale("en-US");
    fakeServer({
      "GET /api/me": sessionFor("coordinator"),
      "GET /api/imports/batches?limit=25&offset=0": answer(batchListResponseSchema, {
        batches: [{ ...appliedBatch, createdAt: "2026-12-02T12:00:00.000Z" }],
        total: 1,
      }),
      "GET /api/imports/formats": formatsWithoutColumns,
      "GET /api/data-version": answer(dataVersionAnswerSchema, { version: "run:1:0" }),
    });
    renderApp("/imports");
    const table = await screen.findByRole("table");
    const imported = within(table).getByText(/^Dec 2, 2026/);
    cleanup();

    const version: ReportVersion = {
      id: 1,
      period: "2026-Q3",
      version: 1,
      createdAt: "2026-12-02T12:00:00.000Z",
      createdBy: "Robin",
      pdfBytes: 2048,
      lastSend: null,
      releasedAt: null,
    };
    render(
      <QueryClientProvider client={createQueryClient()}>
        <VersionsPanel period="2026-Q3" versions={[version]} onCreated={() => undefined} />
      </QueryClientProvider>,
    );
    expect(screen.getByText(imported.textContent!)).toBeTruthy();
  });
});
