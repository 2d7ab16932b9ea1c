// The funder PDF lists the improvement actions only when the coordinator chooses to include them: those
// started by the end of the period, with aim, scope, start and status, without the owner, without a site's
// name and without actions aimed at one instructor.
import { PDFParse } from "pdf-parse";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createAction } from "../../../server/actions/service";
import type { Db } from "../../../server/db/client";
import { buildReportData } from "../../../server/reports/data";
import { renderReportPdf } from "../../../server/reports/pdf";
import { findActiveUser } from "../../../server/users/service";
import { makeTestDb, seedPeople } from "../../helpers/testApp";
import { insertReportFixture } from "./fixture";

const createdAt = new Date("2026-10-02T09:30:00Z");
let db: Db;

async function pdfTextOf(includeActions: boolean): Promise<string> {
  const data = buildReportData(db, "2026-Q3", { now: createdAt, includeActions });
  const parser = new PDFParse({ data: new Uint8Array(await renderReportPdf(data, { version: 1, createdAt })) });
  try {
    return (await parser.getText()).text;
  } finally {
    await parser.destroy();
  }
}

beforeAll(async () => {
  db = makeTestDb();
  const people = await seedPeople(db);
  insertReportFixture(db, people);
  const lead = findActiveUser(db, people.users.quality_lead.id)!;
  const base = { target: 60, instructorId: null, profile: null, owner: "Robin Owner" } as const;
  createAction(db, lead, { ...base, title: "Rate metronome in every class", aim: "passRate", siteId: null, startDate: "2026-07-06", status: "under_way" });
  createAction(db, lead, {
    ...base,
    title: "Depth cards at the hall",
    aim: "too_shallow",
    siteId: people.sites.north.id,
    profile: "adult",
    startDate: "2026-08-03",
    status: "done",
    target: 10,
  });
  createAction(db, lead, {
    ...base,
    title: "One-to-one coaching",
    aim: "passRate",
    siteId: null,
    instructorId: people.instructors.a1.id,
    startDate: "2026-07-20",
    status: "under_way",
  });
  createAction(db, lead, { ...base, title: "Winter recoil drill", aim: "incomplete_recoil", siteId: null, startDate: "2026-11-02", status: "planned" });
});
afterAll(() => db.$client.close());

describe("improvement actions in the funder PDF", () => {
  it("leaves them out unless chosen", async () => {
    const text = await pdfTextOf(false);
    expect(text).not.toContain("Improvement actions");
    expect(text).not.toContain("Rate metronome in every class");
    expect(buildReportData(db, "2026-Q3", { now: createdAt }).improvementActions).toBeUndefined();
  });

  it("lists the actions started by the period's end with aim, scope, start and status when chosen", async () => {
    const text = await pdfTextOf(true);
    expect(text).toContain("Improvement actions");
    expect(text).toMatch(/Rate metronome in every class\s+Measured pass rate\s+Whole network\s+6 July 2026\s+Under way/);
    expect(text).toMatch(/Depth cards at the hall\s+Attempts failing on “Too\s+shallow”\s+One site · Adult\s+3 August 2026\s+Done/);
    expect(text).toMatch(/Actions aimed at\s+a\s+single\s+instructor\s+are\s+not\s+listed\./);
    // started after the period
    expect(text).not.toContain("Winter recoil drill");
  });

  it("names no owner, site or instructor", async () => {
    const text = await pdfTextOf(true);
    for (const identifier of ["Robin Owner", "One-to-one coaching", "NORTH", "Northfield", "Instructor A1"]) expect(text).not.toContain(identifier);
  });
});
