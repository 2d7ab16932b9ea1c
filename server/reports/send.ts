// E-mailing a stored report version to the funders. Every send is recorded, sent or failed, with the exact
// recipients, the version and the cover note; a failed one can be retried later without generating a new
// version. Each recipient gets a message of their own, and a version that reached anyone counts as released.
import { desc, eq } from "drizzle-orm";
import type { ReportSendRow } from "../../shared/schemas/report";
import type { Db } from "../db/client";
import { reports, reportSends, users } from "../db/schema";
import { AppError, conflict, notFound } from "../errors";
import type { Mailer, OutgoingMail } from "../mail/mailer";
import { activeAddresses } from "../users/service";
import { describeMailFailure } from "./mailFailure";
import { findReport, markReleased, reportFileName, type StoredReport } from "./store";

/** E-mail addresses of every active funder account. */
export const funderAddresses = (db: Db): string[] => activeAddresses(db, "funder");

/** One recipient's message: the coordinator's cover note, then what the attachment is. */
export function reportMessage(report: StoredReport, to: string, coverNote: string): OutgoingMail {
  const { data } = report;
  const lines = [
    coverNote.trim(),
    "",
    "—",
    "",
    `Attached is the training quality report of ${data.networkName} for ${data.periodLabel} (${data.period}, version ${report.version}).`,
    "",
    ...data.narrative,
    "",
    "The PDF holds the figures, charts and a description of how they are made. Figures from fewer than " +
      `${data.suppressionMinCount} learners or attempts are not shown, to protect the people behind them.`,
    "",
    data.methods.safetyNote,
    "",
    "Sent by Quarterbeat on behalf of the network's coordinator.",
  ];
  return {
    to: [to],
    subject: `${data.networkName}: training quality report for ${data.periodLabel} (${data.period})`,
    text: lines.join("\n"),
    attachments: [{ filename: reportFileName(report.period, report.version), content: report.pdf, contentType: "application/pdf" }],
  };
}

interface Delivery {
  status: "sent" | "failed";
  delivered: string[];
  error: string | null;
  messageId: string | null;
}

/** One message per recipient, so nobody sees the other addresses; those already reached are skipped. */
async function deliver(mailer: Mailer, report: StoredReport, recipients: string[], coverNote: string, alreadyDelivered: string[] = []): Promise<Delivery> {
  const delivered = [...alreadyDelivered];
  const failures: string[] = [];
  const messageIds: string[] = [];
  for (const address of recipients.filter((r) => !alreadyDelivered.includes(r))) {
    try {
      const receipt = await mailer.send(reportMessage(report, address, coverNote));
      if (receipt.rejected.length > 0) failures.push(`The mail server refused ${address}`);
      else delivered.push(address);
      if (receipt.messageId) messageIds.push(receipt.messageId);
    } catch (err) {
      failures.push(`${address}: ${describeMailFailure(err)}`);
    }
  }
  return {
    status: failures.length === 0 ? "sent" : "failed",
    delivered,
    error: failures.length === 0 ? null : failures.join("; ").slice(0, 1000),
    messageId: messageIds.length > 0 ? messageIds.join(" ").slice(0, 1000) : null,
  };
}

/** Funders who received the PDF hold it: a version that reached anyone counts as released. */
function releaseIfDelivered(db: Db, reportId: number, outcome: Delivery, userId: number | null) {
  if (outcome.delivered.length > 0) markReleased(db, reportId, userId);
}

/** Sends a stored version to every active funder plus any extra addresses, and records the outcome. */
export async function sendReport(
  db: Db,
  mailer: Mailer,
  reportId: number,
  options: { userId?: number | null; extraRecipients?: string[]; coverNote: string },
): Promise<ReportSendRow> {
  const report = findReport(db, reportId);
  const coverNote = options.coverNote.trim();
  if (!coverNote)
    throw new AppError("invalid", 422, "Write a cover note for the funders.", [{ path: "coverNote", message: "Write a cover note for the funders" }]);
  const recipients = [...new Set([...funderAddresses(db), ...(options.extraRecipients ?? []).map((a) => a.trim().toLowerCase())])];
  if (recipients.length === 0) {
    throw new AppError(
      "no_recipients",
      422,
      "There is nobody to send the report to: no funder account is active and no extra address was given.",
      undefined,
      "Add a funder under Users, or give extra recipients.",
    );
  }
  const outcome = await deliver(mailer, report, recipients, coverNote);
  const { id } = db
    .insert(reportSends)
    .values({ reportId, sentBy: options.userId ?? null, recipients, coverNote, ...outcome, createdAt: new Date().toISOString() })
    .returning({ id: reportSends.id })
    .get();
  releaseIfDelivered(db, reportId, outcome, options.userId ?? null);
  return withoutUserId(findSend(db, id));
}

/** Tries a failed send again with the same stored PDF and cover note, to the recipients not yet reached. */
export async function retrySend(db: Db, mailer: Mailer, sendId: number, userId: number | null): Promise<ReportSendRow> {
  const send = findSend(db, sendId);
  if (send.status === "sent") throw conflict("This report was already sent; it is not sent twice.");
  const report = findReport(db, send.reportId);
  const outcome = await deliver(mailer, report, send.recipients, send.coverNote, send.delivered);
  db.update(reportSends)
    .set({ ...outcome, sentBy: userId ?? send.sentById, createdAt: new Date().toISOString() })
    .where(eq(reportSends.id, sendId))
    .run();
  releaseIfDelivered(db, send.reportId, outcome, userId ?? send.sentById);
  return withoutUserId(findSend(db, sendId));
}

const sendColumns = {
  id: reportSends.id,
  reportId: reportSends.reportId,
  period: reports.period,
  version: reports.version,
  sentBy: users.displayName,
  sentById: reportSends.sentBy,
  recipients: reportSends.recipients,
  delivered: reportSends.delivered,
  coverNote: reportSends.coverNote,
  status: reportSends.status,
  error: reportSends.error,
  messageId: reportSends.messageId,
  createdAt: reportSends.createdAt,
};

function withoutUserId({ sentById: _, ...row }: ReportSendRow & { sentById: number | null }): ReportSendRow {
  return row;
}

function findSend(db: Db, id: number): ReportSendRow & { sentById: number | null } {
  const row = db
    .select(sendColumns)
    .from(reportSends)
    .innerJoin(reports, eq(reportSends.reportId, reports.id))
    .leftJoin(users, eq(reportSends.sentBy, users.id))
    .where(eq(reportSends.id, id))
    .get();
  if (!row) throw notFound("The send");
  return row;
}

export function listSends(db: Db): ReportSendRow[] {
  return db
    .select(sendColumns)
    .from(reportSends)
    .innerJoin(reports, eq(reportSends.reportId, reports.id))
    .leftJoin(users, eq(reportSends.sentBy, users.id))
    .orderBy(desc(reportSends.id))
    .all()
    .map(withoutUserId);
}
