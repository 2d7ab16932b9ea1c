// The local mail service: an SMTP server on 127.0.0.1 that stands in for a hosted one on developer machines
// and in tests. Every message it receives is kept in the `mailbox` table (raw bytes plus the fields the
// outbox page shows), so nothing ever leaves the machine.
import type { AddressInfo } from "node:net";
import { SMTPServer } from "smtp-server";
import type { Db } from "../db/client";
import { mailbox } from "../db/schema";
import { readMail } from "./readMail";

/** Larger than any report PDF; a message over this is refused rather than stored cut short. */
const MAX_MESSAGE_BYTES = 25 * 1024 * 1024;

export interface LocalMailService {
  port: number;
  /** smtp://127.0.0.1:<port>, ready for SMTP_URL or createMailer. */
  url: string;
  close(): Promise<void>;
}

export async function storeReceivedMail(db: Db, raw: Buffer, envelope: { from: string; to: string[] }): Promise<number> {
  let subject: string;
  let text = "";
  let attachments: { filename: string; contentType: string; size: number }[] = [];
  try {
    const parsed = await readMail(raw);
    subject = parsed.subject;
    text = parsed.text;
    attachments = parsed.attachments.map((a) => ({ filename: a.filename, contentType: a.contentType, size: a.content.length }));
  } catch {
    // unreadable MIME: the raw bytes are still stored and can be downloaded
    subject = "(message could not be read)";
  }
  return db.insert(mailbox).values({ mailFrom: envelope.from, recipients: envelope.to, subject, text, attachments, raw }).returning({ id: mailbox.id }).get()
    .id;
}

export function startLocalMailService(db: Db, options: { port?: number } = {}): Promise<LocalMailService> {
  const server = new SMTPServer({
    name: "quarterbeat-local",
    // Plain SMTP on the loopback address only: no TLS certificate to trust, no passwords to check.
    disabledCommands: ["STARTTLS", "AUTH"],
    authOptional: true,
    size: MAX_MESSAGE_BYTES,
    logger: false,
    onData(stream, session, callback) {
      const chunks: Buffer[] = [];
      stream.on("data", (chunk: Buffer) => chunks.push(chunk));
      stream.on("error", (err) => callback(err));
      stream.on("end", () => {
        if (stream.sizeExceeded) {
          callback(Object.assign(new Error("Message is larger than the local mail service accepts"), { responseCode: 552 }));
          return;
        }
        const from = session.envelope.mailFrom ? session.envelope.mailFrom.address : "";
        storeReceivedMail(db, Buffer.concat(chunks), { from, to: session.envelope.rcptTo.map((r) => r.address) }).then(
          () => callback(),
          (err: Error) => callback(err),
        );
      });
    },
  });

  return new Promise((resolve, reject) => {
    server.once("error", reject);
    server.listen(options.port ?? 0, "127.0.0.1", () => {
      server.off("error", reject);
      // later errors (a client dropping the connection) must not end the process
      server.on("error", () => undefined);
      const port = (server.server.address() as AddressInfo).port;
      resolve({
        port,
        url: `smtp://127.0.0.1:${port}`,
        close: () => new Promise<void>((done) => server.close(() => done())),
      });
    });
  });
}
