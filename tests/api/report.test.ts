// Funder report routes on the real app: who may read, generate, write notes and release; stored versions
// download byte for byte; funders see released versions only and none of the drill-down.
import { eq } from "drizzle-orm";
import { PDFParse } from "pdf-parse";
import type { Test } from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Db } from "../../server/db/client";
import { reports } from "../../server/db/schema";
import { insertReportFixture } from "../unit/report/fixture";
import { makeTestApp, makeTestDb, seedPeople, signIn, type Agent, type TestApp } from "../helpers/testApp";

let db: Db;
let app: TestApp;
let coordinator: Agent;
let funder: Agent;
let instructor: Agent;
let quality: Agent;

/** Supertest collects binary bodies only when given a parser; the response is a Node stream underneath. */
const binary: Parameters<Test["parse"]>[0] = (res, done) => {
  const stream = res as unknown as NodeJS.ReadableStream;
  const chunks: Buffer[] = [];
  stream.on("data", (chunk: Buffer) => chunks.push(chunk));
  stream.on("end", () => done(null, Buffer.concat(chunks)));
};

beforeAll(async () => {
  db = makeTestDb();
  const people = await seedPeople(db);
  insertReportFixture(db, people);
  app = makeTestApp(db);
  coordinator = await signIn(app, "coord@test.example");
  funder = await signIn(app, "funder@test.example");
  instructor = await signIn(app, "a1@test.example");
  quality = await signIn(app, "quality@test.example");
});
afterAll(() => db.$client.close());

describe("report preview", () => {
  it("gives the coordinator the data and narrative, computed from the fixture", async () => {
    for (const agent of [coordinator]) {
      const res = await agent.get("/api/reports/2026-Q3/preview").expect(200);
      const report = res.body.report;
      // 26 of 40 attempts passed; Wilson 95 % interval 0.49506–0.77865 (Newcombe 1998 method 3, computed by hand)
      expect(report.passRate).toMatchObject({ value: 0.65, text: "65.0 %", intervalText: "49.5–77.9 %" });
      expect(report.reach.learners.value).toBe(48);
      expect(report.reach.instructors.text).toBe("fewer than 5");
      expect(report.narrative[1]).toContain("65.0 %");
    }
  });

  it("accepts a lower-case period and refuses one it cannot read", async () => {
    await coordinator.get("/api/reports/2026-q3/preview").expect(200);
    const bad = await coordinator.get("/api/reports/2026-Q9/preview").expect(400);
    expect(bad.body.error.message).toMatch(/2026-Q3 or a year such as 2026/);
  });

  it("is closed to funders (they read released versions), instructors and people who are not signed in", async () => {
    await funder.get("/api/reports/2026-Q3/preview").expect(403);
    await instructor.get("/api/reports/2026-Q3/preview").expect(403);
    const { default: request } = await import("supertest");
    await request(app).get("/api/reports/2026-Q3/preview").expect(401);
  });
});

describe("coordinator's note on the errors", () => {
  it("is written by the coordinator, read by funders and shown in the report", async () => {
    const text = "Every class now opens with a depth drill on the adult manikins.";
    const put = await coordinator.put("/api/reports/2026-Q3/notes", { actions: text }).expect(200);
    expect(put.body).toEqual({ period: "2026-Q3", actions: text });
    const read = await funder.get("/api/reports/2026-Q3/notes").expect(200);
    expect(read.body.actions).toBe(text);
    const preview = await coordinator.get("/api/reports/2026-Q3/preview").expect(200);
    expect(preview.body.report.errors.actions).toBe(text);
  });

  it("cannot be written by a funder, and refuses an over-long text with a field message", async () => {
    await funder.put("/api/reports/2026-Q3/notes", { actions: "mine" }).expect(403);
    const long = await coordinator.put("/api/reports/2026-Q3/notes", { actions: "x".repeat(4001) }).expect(422);
    expect(long.body.error.details[0].path).toBe("actions");
  });
});

describe("stored versions", () => {
  let firstId: number;

  it("generates numbered versions and lists them newest first", async () => {
    const first = await coordinator.post("/api/reports/2026-Q3").expect(201);
    const second = await coordinator.post("/api/reports/2026-Q3").expect(201);
    expect(first.body.report).toMatchObject({ period: "2026-Q3", version: 1, createdBy: "coord", lastSend: null, releasedAt: null });
    expect(second.body.report.version).toBe(2);
    expect(first.body.report.pdfBytes).toBeGreaterThan(5000);
    firstId = first.body.report.id;
    const list = await coordinator.get("/api/reports").expect(200);
    expect(list.body.reports.map((r: { version: number }) => r.version)).toEqual([2, 1]);
    const filtered = await coordinator.get("/api/reports?period=2025-Q1").expect(200);
    expect(filtered.body.reports).toEqual([]);
  });

  it("shows funders no version until the coordinator releases one, and then only that one", async () => {
    expect((await funder.get("/api/reports").expect(200)).body.reports).toEqual([]);
    for (const part of ["pdf", "csv", "data"]) await funder.get(`/api/reports/${firstId}/${part}`).expect(404);

    await funder.post(`/api/reports/${firstId}/release`).expect(403);
    const released = await coordinator.post(`/api/reports/${firstId}/release`).expect(200);
    expect(released.body).toMatchObject({ released: true, report: { id: firstId, version: 1 } });
    expect(Date.parse(released.body.report.releasedAt)).not.toBeNaN();
    // no mail server in this app: the release stands, the notice is recorded as not delivered
    expect(released.body.failed).toEqual([{ address: "funder@test.example", error: expect.stringMatching(/No mail server is configured/) }]);

    const seen = await funder.get("/api/reports?period=2026-Q3").expect(200);
    expect(seen.body.reports.map((r: { version: number }) => r.version)).toEqual([1]);
    await funder.get(`/api/reports/${firstId}/data`).expect(200);
    const again = await coordinator.post(`/api/reports/${firstId}/release`).expect(200);
    expect(again.body).toMatchObject({ released: false, notified: [], failed: [] });
  });

  it("lets a funder download a stored PDF byte for byte, as an attachment with a safe name", async () => {
    const res = await funder.get(`/api/reports/${firstId}/pdf`).buffer(true).parse(binary).expect(200);
    const stored = db.select({ pdf: reports.pdf }).from(reports).where(eq(reports.id, firstId)).get()!;
    expect(res.headers["content-type"]).toBe("application/pdf");
    expect(res.headers["content-disposition"]).toBe("attachment; filename=quarterbeat-funder-report-2026-Q3-v1.pdf");
    expect(Buffer.compare(res.body as Buffer, Buffer.from(stored.pdf))).toBe(0);
    // the preview before sending shows the very same bytes inside the page
    const inline = await coordinator.get(`/api/reports/${firstId}/pdf?inline=1`).buffer(true).parse(binary).expect(200);
    expect(inline.headers["content-disposition"]).toMatch(/^inline; filename="?quarterbeat-funder-report-2026-Q3-v1\.pdf"?$/);
    expect(Buffer.compare(inline.body as Buffer, Buffer.from(stored.pdf))).toBe(0);
    const parser = new PDFParse({ data: new Uint8Array(res.body as Buffer) });
    const { text } = await parser.getText();
    await parser.destroy();
    expect(text).toContain("95 % interval 49.5–77.9 %");
    expect(text).toContain("Every class now opens with a depth drill");
  });

  it("keeps a stored version unchanged when the data changes later", async () => {
    const before = await funder.get(`/api/reports/${firstId}/pdf`).buffer(true).parse(binary).expect(200);
    await coordinator.put("/api/reports/2026-Q3/notes", { actions: "A different note." }).expect(200);
    const after = await funder.get(`/api/reports/${firstId}/pdf`).buffer(true).parse(binary).expect(200);
    expect(Buffer.compare(before.body as Buffer, after.body as Buffer)).toBe(0);
    const data = await funder.get(`/api/reports/${firstId}/data`).expect(200);
    expect(data.body.data.errors.actions).toBe("Every class now opens with a depth drill on the adult manikins.");
  });

  it("exports the stored figures as CSV with hidden cells left empty", async () => {
    const res = await funder.get(`/api/reports/${firstId}/csv`).expect(200);
    expect(res.headers["content-type"]).toMatch(/^text\/csv/);
    expect(res.text).toContain("pass rate,measured pass rate 2026-Q3,0.65,0.4951,0.7787,65.0 % (49.5–77.9 %)");
    expect(res.text).toContain("reach,instructors,,,,fewer than 5");
  });

  it("refuses to generate a report for a period without data, with a hint", async () => {
    const res = await coordinator.post("/api/reports/2027-Q1").expect(422);
    expect(res.body.error).toMatchObject({ code: "no_data" });
    expect(res.body.error.message).toMatch(/no classes or measured attempts for 2027-Q1/);
  });

  it("lists the improvement actions in a version only when the coordinator asks for them", async () => {
    const action = await quality.post("/api/actions", {
      title: "Rate metronome in every class",
      aim: "passRate",
      target: 70,
      siteId: null,
      instructorId: null,
      profile: null,
      startDate: "2026-07-06",
      owner: "Robin Owner",
      status: "under_way",
    });
    expect(action.status).toBe(201);
    const plain = await coordinator.post("/api/reports/2026-Q3").expect(201);
    expect((await coordinator.get(`/api/reports/${plain.body.report.id}/data`).expect(200)).body.data.improvementActions).toBeUndefined();
    const withActions = await coordinator.post("/api/reports/2026-Q3", { includeActions: true }).expect(201);
    const data = (await coordinator.get(`/api/reports/${withActions.body.report.id}/data`).expect(200)).body.data;
    expect(data.improvementActions).toEqual([
      { title: "Rate metronome in every class", aim: "Measured pass rate", scope: "Whole network", startDate: "2026-07-06", status: "Under way" },
    ]);
    const refused = await coordinator.post("/api/reports/2026-Q3", { includeActions: "yes" }).expect(422);
    expect(refused.body.error.details[0].path).toBe("includeActions");
  });

  it("answers 404 for a report that does not exist", async () => {
    await funder.get("/api/reports/9999/pdf").expect(404);
  });
});

describe("what a funder may not do", () => {
  it("cannot generate or send a report, nor see sends or the outbox", async () => {
    await funder.post("/api/reports/2026-Q3").expect(403);
    await funder.post("/api/reports/1/send", { coverNote: "Hello" }).expect(403);
    await funder.get("/api/report-sends").expect(403);
    await funder.post("/api/report-sends/1/retry").expect(403);
    await funder.get("/api/outbox").expect(403);
    await funder.get("/api/outbox/1/attachment/0").expect(403);
  });

  it("gets 403 on the statistics drill-down routes", async () => {
    for (const url of ["/api/insight/instructors", "/api/insight/instructors/1", "/api/insight/errors", "/api/insight/overview"]) {
      const res = await funder.get(url);
      expect(res.status, url).toBe(403);
    }
  });
});
