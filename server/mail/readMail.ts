// Reads a stored message back with mailparser: the subject, the plain text and the attachments that the
// outbox shows (what Quarterbeat itself sends). A message too broken to read is still kept as raw bytes in
// the mailbox row by the caller, so nothing is lost.
import { simpleParser } from "mailparser";

export interface MailAttachment {
  filename: string;
  contentType: string;
  content: Buffer;
}

export interface ReadMail {
  subject: string;
  text: string;
  attachments: MailAttachment[];
}

export async function readMail(raw: Buffer): Promise<ReadMail> {
  // only the plain text is shown: no HTML is turned into text or text into HTML
  const mail = await simpleParser(raw, { skipHtmlToText: true, skipTextToHtml: true, skipTextLinks: true, skipImageLinks: true });
  return {
    subject: mail.subject ?? "",
    // mailparser ends lines with LF; the outbox keeps the message's own CRLF line ends, as SMTP carries them
    text: (mail.text ?? "").replace(/\r?\n/g, "\r\n"),
    attachments: mail.attachments.map((attachment, index) => ({
      filename: attachment.filename ?? `attachment-${index + 1}`,
      contentType: attachment.contentType,
      content: attachment.content,
    })),
  };
}
