import { PDFParse } from "pdf-parse";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Db } from "../../../server/db/client";
import { buildReportData, saveQuarterNotes } from "../../../server/reports/data";
import { renderReportPdf } from "../../../server/reports/pdf";
import type { ReportData } from "../../../shared/schemas/report";
import { makeTestDb, seedPeople } from "../../helpers/testApp";
import { insertReportFixture } from "./fixture";

const createdAt = new Date("2026-10-02T09:30:00Z");
let db: Db;
let data: ReportData;
let pdf: Buffer;
let text: string;
let pages: number;

async function pdfText(bytes: Buffer) {
  const parser = new PDFParse({ data: new Uint8Array(bytes) });
  try {
    const result = await parser.getText();
    return { text: result.text, pages: result.total };
  } finally {
    await parser.destroy();
  }
}

beforeAll(async () => {
  db = makeTestDb();
  insertReportFixture(db, await seedPeople(db));
  saveQuarterNotes(db, "2026-Q3", "Depth drill at the start of every class; Δ and Ж checks for the font subsets.", null);
  data = buildReportData(db, "2026-Q3", { now: createdAt });
  pdf = await renderReportPdf(data, { version: 3, createdAt });
  ({ text, pages } = await pdfText(pdf));
});
afterAll(() => db.$client.close());

describe("report PDF", () => {
  it("is a PDF that a reader can open", () => {
    expect(pdf.subarray(0, 5).toString("latin1")).toBe("%PDF-");
    expect(pdf.subarray(-6).toString("latin1")).toContain("%%EOF");
    expect(pages).toBeGreaterThanOrEqual(2);
  });

  it("prints the pass rate and interval exactly as the data service formats them (26/40)", () => {
    expect(data.passRate.text).toBe("65.0 %");
    expect(data.passRate.intervalText).toBe("49.5–77.9 %");
    expect(text).toContain("65.0 %");
    expect(text).toContain("95 % interval 49.5–77.9 %");
  });

  it("prints the retention table under its own heading", () => {
    expect(text).toContain("Learners returning for recertification");
    // in this fixture nobody returns: 40 first courses, and no returns read "no data" (tests/unit/report/data.test.ts)
    expect(text).toMatch(/First course in the data\s+40\s+65\.0 %/);
    expect(text).toMatch(/Back after 6–12 months\s+no data\s+no data/);
  });

  it("holds the period, the version, page numbers, the coordinator's note and the methods with the safety caution", () => {
    expect(text).toContain("2026-Q3");
    expect(text).toContain("Training quality, July–September 2026");
    expect(text).toContain("version 3");
    expect(text).toContain(`Page 1 of ${pages}`);
    expect(text).toContain(`Page ${pages} of ${pages}`);
    expect(text).toContain("Depth drill at the start of every class");
    expect(text).toContain("How these figures are made");
    expect(text).toMatch(/not a medical device/);
    expect(text).toMatch(/European Resuscitation Council Guidelines 2021/);
    expect(text).toContain("fewer than 5");
  });

  it("embeds Roboto Flex instead of relying on a viewer's fonts", () => {
    const raw = pdf.toString("latin1");
    expect(raw).toMatch(/\/BaseFont \/[A-Z]{6}\+RobotoFlex/);
    expect(raw).toContain("/FontFile2");
    expect(raw).not.toMatch(/\/BaseFont \/Helvetica/);
  });

  it("gives the same bytes for the same data and creation time", async () => {
    const again = await renderReportPdf(data, { version: 3, createdAt });
    expect(again.equals(pdf)).toBe(true);
    const later = await renderReportPdf(data, { version: 3, createdAt: new Date("2026-10-03T09:30:00Z") });
    expect(later.equals(pdf)).toBe(false);
  });

  it("shows no instructor, site, learner or manikin identifiers", () => {
    for (const identifier of ["Instructor A1", "Northfield", "Southmoor", "NORTH", "RF-M1", "L0001"]) expect(text).not.toContain(identifier);
  });

  it("draws a report for a period without data without failing", async () => {
    const empty = buildReportData(db, "2027-Q1", { now: createdAt });
    const bytes = await renderReportPdf(empty, { version: 1, createdAt });
    const { text: emptyText } = await pdfText(bytes);
    expect(emptyText).toContain("No classes or measured attempts were recorded for January–March 2027.");
  });
});
