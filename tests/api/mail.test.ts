// Sending reports through SMTP to the local mail service, failed sends and their retry, the outbox, and the
// welcome message. The mail service listens on 127.0.0.1 port 0, started by the test.
import nodemailer from "nodemailer";
import type { Test } from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createApp } from "../../server/app";
import { loadConfig } from "../../server/config";
import type { Db } from "../../server/db/client";
import { mailbox } from "../../server/db/schema";
import { startLocalMailService, storeReceivedMail, type LocalMailService } from "../../server/mail/localService";
import { createMailer } from "../../server/mail/mailer";
import { findReport } from "../../server/reports/store";
import { insertReportFixture } from "../unit/report/fixture";
import { freePort } from "../helpers/freePort";
import { makeTestDb, seedPeople, signIn, type Agent } from "../helpers/testApp";

let db: Db;
let mail: LocalMailService;
let closedPortUrl: string;
let reportId: number;

function appWithSmtp(smtpUrl?: string) {
  const env: NodeJS.ProcessEnv = { NODE_ENV: "test", SESSION_SECRET: "test-secret-at-least-16-chars" };
  if (smtpUrl) env.SMTP_URL = smtpUrl;
  return createApp(db, loadConfig(env), { clientDir: null });
}

/** Supertest collects binary bodies only when given a parser; the response is a Node stream underneath. */
const binary: Parameters<Test["parse"]>[0] = (res, done) => {
  const stream = res as unknown as NodeJS.ReadableStream;
  const chunks: Buffer[] = [];
  stream.on("data", (chunk: Buffer) => chunks.push(chunk));
  stream.on("end", () => done(null, Buffer.concat(chunks)));
};

beforeAll(async () => {
  db = makeTestDb();
  insertReportFixture(db, await seedPeople(db));
  mail = await startLocalMailService(db, { port: 0 });
  closedPortUrl = `smtp://127.0.0.1:${await freePort()}`;
  const coordinator = await signIn(appWithSmtp(mail.url), "coord@test.example");
  reportId = (await coordinator.post("/api/reports/2026-Q3").expect(201)).body.report.id;
});
afterAll(async () => {
  await mail.close();
  db.$client.close();
});

describe("sending a report", () => {
  let coordinator: Agent;
  beforeAll(async () => {
    coordinator = await signIn(appWithSmtp(mail.url), "coord@test.example");
  });

  it("delivers the stored PDF with the cover note to every active funder and the extra addresses, one message each", async () => {
    const coverNote = "Dear funders,\nhere is our third-quarter report; depth has improved since spring.";
    const res = await coordinator.post(`/api/reports/${reportId}/send`, { coverNote, extraRecipients: ["Board@Foundation.example"] }).expect(201);
    expect(res.body.send).toMatchObject({
      reportId,
      period: "2026-Q3",
      version: 1,
      status: "sent",
      error: null,
      sentBy: "coord",
      coverNote,
      recipients: ["funder@test.example", "board@foundation.example"],
      delivered: ["funder@test.example", "board@foundation.example"],
    });

    const received = db.select().from(mailbox).all();
    // one message per recipient: nobody's message carries another recipient's address
    expect(received.map((m) => m.recipients)).toEqual([["funder@test.example"], ["board@foundation.example"]]);
    expect(received[0].raw.toString("latin1")).not.toContain("board@foundation.example");
    expect(received[1].raw.toString("latin1")).not.toContain("funder@test.example");
    for (const message of received) {
      expect(message.subject).toBe("Quarterbeat training network: training quality report for July–September 2026 (2026-Q3)");
      expect(message.text.replace(/\r\n/g, "\n").startsWith(coverNote)).toBe(true);
      expect(message.text).toContain("65.0 % of measured attempts met the network's pass rule (95 % interval 49.5–77.9 %).");
      expect(message.text).toContain("not a medical device");
      const pdf = findReport(db, reportId).pdf;
      expect(message.attachments).toEqual([{ filename: "quarterbeat-funder-report-2026-Q3-v1.pdf", contentType: "application/pdf", size: pdf.length }]);
    }
    // the funders hold the PDF now: the version counts as released to them
    expect(findReport(db, reportId).releasedAt).not.toBeNull();
  });

  it("refuses a send without a cover note, or with a blank one, and sends nothing", async () => {
    const before = db.select().from(mailbox).all().length;
    const missing = await coordinator.post(`/api/reports/${reportId}/send`, {}).expect(422);
    expect(missing.body.error.details).toEqual([{ path: "coverNote", message: "Write a cover note for the funders" }]);
    const blank = await coordinator.post(`/api/reports/${reportId}/send`, { coverNote: "  \n " }).expect(422);
    expect(blank.body.error.details[0]).toEqual({ path: "coverNote", message: "Write a cover note for the funders" });
    expect(db.select().from(mailbox).all()).toHaveLength(before);
  });

  it("lists the message in the outbox and downloads its attachment as the same bytes", async () => {
    const outbox = await coordinator.get("/api/outbox").expect(200);
    const [message] = outbox.body.messages;
    expect(message).toMatchObject({
      recipients: ["board@foundation.example"],
      attachments: [{ index: 0, filename: "quarterbeat-funder-report-2026-Q3-v1.pdf", contentType: "application/pdf" }],
    });
    expect(message.text).toContain("Dear funders,");
    const file = await coordinator.get(`/api/outbox/${message.id}/attachment/0`).buffer(true).parse(binary).expect(200);
    expect(file.headers["content-type"]).toBe("application/pdf");
    expect(Buffer.compare(file.body as Buffer, findReport(db, reportId).pdf)).toBe(0);
    await coordinator.get(`/api/outbox/${message.id}/attachment/5`).expect(404);
  });

  it("downloads an attachment whatever its name holds, with a safe header and type", async () => {
    const raw = Buffer.from(
      [
        "From: someone@example.org",
        "To: coord@test.example",
        "Subject: names",
        "MIME-Version: 1.0",
        'Content-Type: multipart/mixed; boundary="b1"',
        "",
        "--b1",
        "Content-Type: text/plain; charset=utf-8",
        "",
        "See the file.",
        "--b1",
        "Content-Type: text/html",
        "Content-Transfer-Encoding: base64",
        // RFC 2231: the name is Bericht "März".html, with quotes and a non-ASCII letter
        "Content-Disposition: attachment; filename*=UTF-8''Bericht%20%22M%C3%A4rz%22.html",
        "",
        Buffer.from("<script>alert(1)</script>").toString("base64"),
        "--b1--",
        "",
      ].join("\r\n"),
    );
    const id = await storeReceivedMail(db, raw, { from: "someone@example.org", to: ["coord@test.example"] });
    const file = await coordinator.get(`/api/outbox/${id}/attachment/0`).buffer(true).parse(binary).expect(200);
    expect(file.headers["content-type"]).toBe("application/octet-stream");
    expect(file.headers["content-disposition"]).toBe(`attachment; filename="Bericht \\"M?rz\\".html"; filename*=UTF-8''Bericht%20%22M%C3%A4rz%22.html`);
    expect((file.body as Buffer).toString()).toBe("<script>alert(1)</script>");
  });

  it("lists a non-ASCII subject and a long file name split over parameters (RFC 2231), and downloads the file", async () => {
    const filename = `Bericht-Ärztekammer-${"Qualität-".repeat(8)}2026.csv`;
    const subject = "Ünïcödé ".repeat(12).trim();
    const transport = nodemailer.createTransport({ streamTransport: true, buffer: true, newline: "windows" });
    const built = await transport.sendMail({
      from: "a@example.org",
      to: "coord@test.example",
      subject,
      text: "line one\nline two",
      attachments: [{ filename, content: "a,b\r\n1,2\r\n", contentType: "text/csv" }],
    });
    const raw = built.message as Buffer;
    // nodemailer splits the name as RFC 2231 asks, so the reader has to join it again
    expect(raw.toString("latin1")).toContain("filename*0*=");
    const id = await storeReceivedMail(db, raw, { from: "a@example.org", to: ["coord@test.example"] });
    const listed = (await coordinator.get("/api/outbox").expect(200)).body.messages.find((m: { id: number }) => m.id === id);
    expect(listed).toMatchObject({ subject, text: "line one\r\nline two", attachments: [{ index: 0, filename, contentType: "text/csv", size: 10 }] });
    const file = await coordinator.get(`/api/outbox/${id}/attachment/0`).buffer(true).parse(binary).expect(200);
    expect((file.body as Buffer).toString()).toBe("a,b\r\n1,2\r\n");
  });

  it("keeps a message that is not MIME at all, with an empty subject and no attachments", async () => {
    const id = await storeReceivedMail(db, Buffer.from("just some bytes"), { from: "a@example.org", to: ["coord@test.example"] });
    const listed = (await coordinator.get("/api/outbox").expect(200)).body.messages.find((m: { id: number }) => m.id === id);
    expect(listed).toMatchObject({ subject: "", attachments: [] });
    await coordinator.get(`/api/outbox/${id}/attachment/0`).expect(404);
  });

  it("refuses an extra address that is not an e-mail address", async () => {
    const res = await coordinator.post(`/api/reports/${reportId}/send`, { coverNote: "Hello", extraRecipients: ["not an address"] }).expect(422);
    expect(res.body.error.details[0].path).toBe("extraRecipients.0");
  });
});

describe("a send that fails", () => {
  it("is recorded as failed against a closed port and becomes sent when retried against a working server", async () => {
    const before = db.select().from(mailbox).all().length;
    const broken = await signIn(appWithSmtp(closedPortUrl), "coord@test.example");
    const failed = await broken.post(`/api/reports/${reportId}/send`, { coverNote: "Our report." }).expect(201);
    expect(failed.body.send.status).toBe("failed");
    expect(failed.body.send.error).toMatch(/ECONNREFUSED|connect/i);

    const listed = await broken.get("/api/report-sends").expect(200);
    expect(listed.body.sends[0]).toMatchObject({ id: failed.body.send.id, status: "failed", recipients: ["funder@test.example"] });
    const versions = await broken.get("/api/reports").expect(200);
    expect(versions.body.reports.find((r: { id: number }) => r.id === reportId).lastSend.status).toBe("failed");

    // still broken: the retry fails again and stays on record
    const again = await broken.post(`/api/report-sends/${failed.body.send.id}/retry`).expect(200);
    expect(again.body.send.status).toBe("failed");

    const working = await signIn(appWithSmtp(mail.url), "coord@test.example");
    const retried = await working.post(`/api/report-sends/${failed.body.send.id}/retry`).expect(200);
    expect(retried.body.send).toMatchObject({ id: failed.body.send.id, status: "sent", error: null });
    expect(db.select().from(mailbox).all()).toHaveLength(before + 1);

    // a sent report is not sent twice by a retry
    await working.post(`/api/report-sends/${failed.body.send.id}/retry`).expect(409);
  });

  it("is recorded as failed with a clear message when no mail server is configured", async () => {
    const unconfigured = await signIn(appWithSmtp(undefined), "coord@test.example");
    const res = await unconfigured.post(`/api/reports/${reportId}/send`, { coverNote: "Our report." }).expect(201);
    expect(res.body.send.status).toBe("failed");
    expect(res.body.send.error).toMatch(/No mail server is configured/);
  });
});

describe("releasing a version", () => {
  it("lets funders see it and sends each active funder a notice of their own, once", async () => {
    const coordinator = await signIn(appWithSmtp(mail.url), "coord@test.example");
    const funder = await signIn(appWithSmtp(mail.url), "funder@test.example");
    const created = (await coordinator.post("/api/reports/2026-Q3").expect(201)).body.report;
    expect((await funder.get("/api/reports?period=2026-Q3").expect(200)).body.reports.map((r: { id: number }) => r.id)).not.toContain(created.id);
    await funder.get(`/api/reports/${created.id}/pdf`).expect(404);

    const before = db.select().from(mailbox).all().length;
    const res = await coordinator.post(`/api/reports/${created.id}/release`).expect(200);
    expect(res.body).toMatchObject({ released: true, notified: ["funder@test.example"], failed: [] });
    const notices = db.select().from(mailbox).all().slice(before);
    expect(notices).toHaveLength(1);
    expect(notices[0]).toMatchObject({
      recipients: ["funder@test.example"],
      subject: "Quarterbeat training network: training quality report for July–September 2026 released",
      attachments: [],
    });
    expect(notices[0].text).toContain(`Version ${created.version} of the training quality report`);
    expect(notices[0].text).toMatch(/\/report\?period=2026-Q3/);

    expect((await funder.get("/api/reports?period=2026-Q3").expect(200)).body.reports[0].id).toBe(created.id);
    await funder.get(`/api/reports/${created.id}/pdf`).expect(200);
    // releasing again changes nothing and sends no second notice
    await coordinator.post(`/api/reports/${created.id}/release`).expect(200);
    expect(db.select().from(mailbox).all()).toHaveLength(before + 1);
  });
});

describe("welcome e-mail", () => {
  it("goes out through the same SMTP path and carries no password", async () => {
    const mailer = createMailer(`${mail.url}?from=welcome@network.example`);
    await mailer.sendWelcomeEmail({ email: "new.funder@example.org", displayName: "New Funder", role: "funder" }, "http://localhost:3000/sign-in");
    const message = db.select().from(mailbox).all().at(-1)!;
    expect(message.mailFrom).toBe("welcome@network.example");
    expect(message.recipients).toEqual(["new.funder@example.org"]);
    expect(message.subject).toBe("Your Quarterbeat account");
    expect(message.text).toContain("http://localhost:3000/sign-in");
    expect(message.text).toContain('role "Funder"');
    expect(message.text).not.toMatch(/correct-horse/);
  });
});
