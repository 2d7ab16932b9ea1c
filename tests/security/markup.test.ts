// Markup and spreadsheet formulas in free text: stored and answered as text. The API answers JSON (never
// HTML), the report PDF prints the text as it was typed, and CSV downloads neutralise cells a spreadsheet
// would run as a formula (OWASP "CSV Injection": a leading ' before = + - @).
import { parse } from "csv-parse/sync";
import { PDFParse } from "pdf-parse";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { SPREADSHEET_CSV, toCsv } from "../../shared/csv";
import type { Db } from "../../server/db/client";
import { makeTestApp, makeTestDb, seedPeople, signIn, type Agent, type TestApp } from "../helpers/testApp";

const MARKUP = "<img src=x onerror=alert(1)>";
const SCRIPT = "<script>alert('qb')</script>";
const FORMULA = '=HYPERLINK("http://evil.example","open")';

let db: Db;
let app: TestApp;
let coordinator: Agent;

beforeAll(async () => {
  db = makeTestDb();
  await seedPeople(db);
  app = makeTestApp(db);
  coordinator = await signIn(app, "coord@test.example");
});
afterAll(() => db.$client.close());

function uploadText(kind: string, text: string, filename = "file.csv") {
  return coordinator.agent
    .post("/api/imports/uploads")
    .set("x-csrf-token", coordinator.csrfToken)
    .field("kind", kind)
    .attach("file", Buffer.from(text), { filename, contentType: "text/csv" });
}

async function runJob(uploadId: string, mode: "validate" | "import", body: object = {}) {
  const start = await coordinator.post(`/api/imports/uploads/${uploadId}/${mode}`, body).expect(202);
  for (let i = 0; i < 600; i++) {
    const res = await coordinator.get(`/api/imports/jobs/${start.body.job.id}`).expect(200);
    if (res.body.job.status === "done" || res.body.job.status === "failed") return res.body.job;
    await new Promise((resolve) => setTimeout(resolve, 50));
  }
  throw new Error("the job did not finish");
}

/** Parses CSV text (RFC 4180 quoting) into rows of cells. */
function parseCsv(text: string): string[][] {
  // relax_column_count: the report CSV holds sections of different widths
  return parse(text, { relax_column_count: true });
}

/** No cell a spreadsheet would run as a formula. */
function expectNoFormulaCells(rows: string[][]) {
  for (const cell of rows.flat()) {
    if (/^[=+\-@\t\r]/.test(cell)) expect(Number.isFinite(Number(cell)), `cell ${cell}`).toBe(true);
  }
}

describe("markup typed into the directory", () => {
  it("stores a site name as text and answers it in JSON, never as HTML", async () => {
    const created = await coordinator.post("/api/sites", { code: "MARKUP", name: MARKUP }).expect(201);
    expect(created.headers["content-type"]).toMatch(/^application\/json/);
    expect(created.body.site.name).toBe(MARKUP);
    const list = await coordinator.get("/api/sites").expect(200);
    expect(list.headers["content-type"]).toMatch(/^application\/json/);
    expect(list.headers["x-content-type-options"]).toBe("nosniff");
    expect(list.body.sites.find((s: { code: string }) => s.code === "MARKUP").name).toBe(MARKUP);
    const options = await coordinator.get("/api/insight/options").expect(200);
    expect(options.headers["content-type"]).toMatch(/^application\/json/);
    expect(() => JSON.parse(options.text)).not.toThrow();
  });
});

describe("markup in imported files", () => {
  it("keeps an equipment note as the text it was", async () => {
    const text = `date,manikin,site,event,quantity,patient_type,note\n2026-05-01,MK-X1,NORTH,fault,1,,"${MARKUP} ${SCRIPT.replaceAll('"', '""')}"\n`;
    const up = await uploadText("equipment", text);
    expect(up.status).toBe(201);
    expect(up.headers["content-type"]).toMatch(/^application\/json/);
    const job = await runJob(up.body.upload.id, "import");
    expect(job.summary.status).toBe("imported");
    const note = db.$client.prepare("SELECT note FROM equipment_events WHERE note LIKE '%onerror%'").pluck().get();
    expect(note).toBe(`${MARKUP} ${SCRIPT}`);
    const equipment = await coordinator.get("/api/equipment").expect(200);
    expect(equipment.headers["content-type"]).toMatch(/^application\/json/);
  });

  it("refuses a class id with markup, names it as text in the JSON report and in the refused-rows CSV", async () => {
    const text = `class_id,date,site,instructor,course,learners,passed,manikins\n"${MARKUP}",2026-05-04,NORTH,A1,adult,6,5,\n`;
    const up = await uploadText("classes", text);
    expect(up.status).toBe(201);
    // the preview shows the cell as it is, in JSON
    expect(up.body.preview.rows[0][0]).toBe(MARKUP);
    const job = await runJob(up.body.upload.id, "validate");
    expect(job.summary.status).toBe("refused");
    expect(job.summary.issues).toContainEqual(expect.objectContaining({ row: 1, column: "class_id", reason: expect.stringContaining(MARKUP) }));

    const csv = await coordinator.get(job.rejectedCsvUrl).expect(200);
    expect(csv.headers["content-type"]).toMatch(/^text\/csv/);
    expect(csv.headers["content-disposition"]).toMatch(/^attachment/);
    const rows = parseCsv(csv.text);
    expect(rows[1][3]).toBe(MARKUP);
  });
});

describe("formulas in CSV downloads", () => {
  const classLog = (classId: string, course: string, site = "NORTH") =>
    `class_id,date,site,instructor,course,learners,passed,manikins\n${classId},2026-05-04,${site},A1,${course},6,5,\n`;

  it("neutralises formula cells in a job's refused-rows CSV", async () => {
    const text =
      classLog("C-FORM-1", `"${FORMULA.replaceAll('"', '""')}"`) +
      `C-FORM-2,2026-05-04,+NORTH,A1,adult,6,5,\nC-FORM-3,2026-05-04,@SUM(A1),A1,adult,6,5,\nC-FORM-4,2026-05-04,NORTH,A1,adult,-6,5,\n`;
    const up = await uploadText("classes", text);
    const job = await runJob(up.body.upload.id, "validate");
    expect(job.summary.status).toBe("refused");
    const csv = await coordinator.get(job.rejectedCsvUrl).expect(200);
    const rows = parseCsv(csv.text);
    expectNoFormulaCells(rows);
    // the text is kept behind the quote, and a plain negative number stays a number
    expect(rows.flat()).toContain(`'${FORMULA}`);
    expect(rows.flat()).toContain("'+NORTH");
    expect(rows.flat()).toContain("'@SUM(A1)");
    expect(rows.flat()).toContain("-6");
  });

  it("neutralises formula cells in a batch's kept refused rows (import with skip invalid)", async () => {
    const text = classLog("C-KEEP-1", "adult") + `C-KEEP-2,2026-05-04,NORTH,A1,"${FORMULA.replaceAll('"', '""')}",6,5,\n`;
    const up = await uploadText("classes", text);
    const job = await runJob(up.body.upload.id, "import", { skipInvalid: true });
    expect(job.summary.status).toBe("imported");
    expect(job.summary.rejected).toBe(1);
    const csv = await coordinator.get(`/api/imports/batches/${job.summary.batchId}/rejected.csv`).expect(200);
    expect(csv.headers["content-type"]).toMatch(/^text\/csv/);
    const rows = parseCsv(csv.text);
    expectNoFormulaCells(rows);
    expect(rows.flat()).toContain(`'${FORMULA}`);
  });

  it("neutralises formula text in the report CSV writer (shared/csv.ts)", () => {
    const text = toCsv(
      ["section", "item", "value"],
      [
        ["errors", FORMULA, 3],
        ["errors", "+1 call", -2],
        ["errors", "-2 cmd|' /C calc'!A0", null],
        ["errors", "@SUM(A1:A2)", 0],
        ["errors", "\t=1+1", 1],
        ["errors", MARKUP, 1],
      ],
      SPREADSHEET_CSV,
    );
    const rows = parseCsv(text);
    expectNoFormulaCells(rows.map((r) => r.slice(0, 2)));
    expect(rows[1][1]).toBe(`'${FORMULA}`);
    expect(rows[2][2]).toBe("-2"); // a number stays a number
    expect(rows[6][1]).toBe(MARKUP); // markup is plain text in a CSV
  });
});

describe("the report", () => {
  it("prints the coordinator's note with markup as text in the PDF, and answers JSON", async () => {
    const note = `Depth drill first. ${MARKUP} ${SCRIPT} ${FORMULA}`;
    const saved = await coordinator.put("/api/reports/2026-Q2/notes", { actions: note }).expect(200);
    expect(saved.headers["content-type"]).toMatch(/^application\/json/);
    expect(saved.body.actions).toBe(note);
    const preview = await coordinator.get("/api/reports/2026-Q2/preview").expect(200);
    expect(preview.headers["content-type"]).toMatch(/^application\/json/);
    expect(preview.body.report.errors.actions).toBe(note);

    const generated = await coordinator.post("/api/reports/2026-Q2").expect(201);
    const pdf = await coordinator
      .get(`/api/reports/${generated.body.report.id}/pdf`)
      .buffer(true)
      .parse((res, done) => {
        const chunks: Buffer[] = [];
        res.on("data", (c: Buffer) => chunks.push(c));
        res.on("end", () => done(null, Buffer.concat(chunks)));
      });
    expect(pdf.status).toBe(200);
    expect(pdf.headers["content-type"]).toMatch(/^application\/pdf/);
    expect(pdf.headers["content-disposition"]).toMatch(/^attachment/);
    const parser = new PDFParse({ data: new Uint8Array(pdf.body as Buffer) });
    const text = (await parser.getText()).text.replace(/\s+/g, " ");
    await parser.destroy();
    expect(text).toContain(MARKUP);
    expect(text).toContain("<script>alert('qb')</script>");

    const csv = await coordinator.get(`/api/reports/${generated.body.report.id}/csv`).expect(200);
    expect(csv.headers["content-type"]).toMatch(/^text\/csv/);
    expectNoFormulaCells(parseCsv(csv.text));
  });
});
