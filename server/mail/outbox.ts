// The local mail service's messages, as the outbox page lists them.
import { desc, eq } from "drizzle-orm";
import type { OutboxMessage } from "../../shared/schemas/report";
import type { Db } from "../db/client";
import { mailbox } from "../db/schema";
import { notFound } from "../errors";
import { readMail, type MailAttachment } from "./readMail";

export function listOutbox(db: Db, limit = 200): OutboxMessage[] {
  return db
    .select({
      id: mailbox.id,
      receivedAt: mailbox.receivedAt,
      from: mailbox.mailFrom,
      recipients: mailbox.recipients,
      subject: mailbox.subject,
      text: mailbox.text,
      attachments: mailbox.attachments,
    })
    .from(mailbox)
    .orderBy(desc(mailbox.id))
    .limit(limit)
    .all()
    .map((row) => ({ ...row, attachments: row.attachments.map((a, index) => ({ index, ...a })) }));
}

/** One attachment's bytes, read back from the stored raw message. */
export async function outboxAttachment(db: Db, messageId: number, index: number): Promise<MailAttachment> {
  const row = db.select({ raw: mailbox.raw }).from(mailbox).where(eq(mailbox.id, messageId)).get();
  if (!row) throw notFound("The message");
  const attachment = (await readMail(Buffer.from(row.raw))).attachments[index];
  if (!attachment) throw notFound("The attachment");
  return attachment;
}
