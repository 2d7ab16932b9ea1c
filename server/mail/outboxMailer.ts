// A mailer that writes each message straight into the local outbox (the `mailbox` table) instead of sending
// it: for mail the demo network makes while it is seeded, before or without any mail service running, so
// nothing can leave the machine.
import nodemailer from "nodemailer";
import type { Db } from "../db/client";
import { storeReceivedMail } from "./localService";
import { DEFAULT_FROM, type Mailer } from "./mailer";
import { sendWelcomeEmail } from "./welcome";

export function createOutboxMailer(db: Db): Mailer {
  const transport = nodemailer.createTransport({ streamTransport: true, buffer: true, newline: "windows" });
  const mailer: Mailer = {
    target: "the local outbox",
    async send(mail) {
      const info = await transport.sendMail({ from: DEFAULT_FROM, to: mail.to, subject: mail.subject, text: mail.text, attachments: mail.attachments });
      const raw = Buffer.isBuffer(info.message) ? info.message : Buffer.from(String(info.message));
      await storeReceivedMail(db, raw, { from: info.envelope.from || "", to: info.envelope.to });
      return { messageId: String(info.messageId ?? ""), accepted: info.envelope.to, rejected: [] };
    },
    sendWelcomeEmail(user, signInUrl) {
      return sendWelcomeEmail(mailer, user, signInUrl);
    },
  };
  return mailer;
}
