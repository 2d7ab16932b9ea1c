// The local mail service's MIME reader, fed with messages built by nodemailer itself (the library that sends
// Quarterbeat's mail), including encodings a hosted service would also see.
import nodemailer from "nodemailer";
import type { SendMailOptions } from "nodemailer";
import { describe, expect, it } from "vitest";
import { decodeWords, parseHeaderValue, parseMail } from "../../../server/mail/mime";

async function build(message: SendMailOptions): Promise<Buffer> {
  const transport = nodemailer.createTransport({ streamTransport: true, buffer: true, newline: "windows" });
  const info = await transport.sendMail(message);
  return info.message as Buffer;
}

describe("parseMail", () => {
  it("reads subject, text and a binary attachment back exactly", async () => {
    const pdf = Buffer.from([0x25, 0x50, 0x44, 0x46, 0x2d, 0x00, 0xff, 0x10, ...Array(3000).fill(7)]);
    const raw = await build({
      from: "Quarterbeat <reports@network.example>",
      to: "funder@example.org",
      subject: "Training quality report for July–September 2026 (2026-Q3)",
      text: "Dear funder,\n\nThe pass rate rose from 61.0 % to 68.2 % — see the attached PDF.",
      attachments: [{ filename: "quarterbeat-funder-report-2026-Q3-v1.pdf", content: pdf, contentType: "application/pdf" }],
    });
    const mail = parseMail(raw);
    expect(mail.subject).toBe("Training quality report for July–September 2026 (2026-Q3)");
    expect(mail.from).toContain("reports@network.example");
    expect(mail.text).toContain("The pass rate rose from 61.0 % to 68.2 % — see the attached PDF.");
    expect(mail.attachments).toHaveLength(1);
    expect(mail.attachments[0].filename).toBe("quarterbeat-funder-report-2026-Q3-v1.pdf");
    expect(mail.attachments[0].contentType).toBe("application/pdf");
    expect(mail.attachments[0].content.equals(pdf)).toBe(true);
  });

  it("reads a long non-ASCII file name split over several parameters (RFC 2231)", async () => {
    const filename = `Bericht-Ärztekammer-${"Qualität-".repeat(8)}2026.csv`;
    const raw = await build({
      from: "a@example.org",
      to: "b@example.org",
      subject: "Ünïcödé ".repeat(12).trim(),
      text: "x",
      attachments: [{ filename, content: "a,b\r\n1,2\r\n", contentType: "text/csv" }],
    });
    const mail = parseMail(raw);
    expect(mail.subject).toBe("Ünïcödé ".repeat(12).trim());
    expect(mail.attachments[0].filename).toBe(filename);
    expect(mail.attachments[0].content.toString()).toBe("a,b\r\n1,2\r\n");
  });

  it("takes the plain text from a text + HTML message and keeps no HTML as an attachment", async () => {
    const raw = await build({ from: "a@example.org", to: "b@example.org", subject: "s", text: "plain words", html: "<p>rich words</p>" });
    const mail = parseMail(raw);
    expect(mail.text).toBe("plain words");
    expect(mail.attachments).toEqual([]);
  });

  it("never throws on a message that is not MIME at all", () => {
    expect(parseMail(Buffer.from("just some bytes"))).toMatchObject({ subject: "", attachments: [] });
  });
});

describe("header helpers", () => {
  it("decodes encoded words in B and Q form (RFC 2047 examples)", () => {
    // RFC 2047 section 8: "=?ISO-8859-1?Q?Andr=E9?= Pirard" → "André Pirard"
    expect(decodeWords("=?ISO-8859-1?Q?Andr=E9?= Pirard")).toBe("André Pirard");
    // RFC 2047 section 8: adjacent encoded words join without the space between them
    expect(decodeWords("(=?ISO-8859-1?Q?a?= =?ISO-8859-1?Q?b?=)")).toBe("(ab)");
    expect(decodeWords("=?UTF-8?B?UmVwb3J0IOKAkyAyMDI2?=")).toBe("Report – 2026");
  });

  it("reads quoted and RFC 2231 encoded parameters", () => {
    // RFC 2231 section 4 example: title*=us-ascii'en-us'This%20is%20%2A%2A%2Afun%2A%2A%2A
    expect(parseHeaderValue("application/x-stuff; title*=us-ascii'en-us'This%20is%20%2A%2A%2Afun%2A%2A%2A").params.title).toBe(
      "This is ***fun***",
    );
    expect(parseHeaderValue('attachment; filename="a;b.pdf"')).toEqual({ type: "attachment", params: { filename: "a;b.pdf" } });
  });
});
