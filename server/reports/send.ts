// E-mailing a stored report version to the funders. Every send is recorded, sent or failed, with the exact
// recipients and the version; a failed one can be retried later without generating a new version.
import { desc, eq } from "drizzle-orm";
import type { ReportSendRow } from "../../shared/schemas/report";
import type { Db } from "../db/client";
import { reports, reportSends, users } from "../db/schema";
import { AppError, conflict, notFound } from "../errors";
import type { Mailer, OutgoingMail } from "../mail/mailer";
import { activeAddresses } from "../users/service";
import { findReport, reportFileName, type StoredReport } from "./store";

/** E-mail addresses of every active funder account. */
export const funderAddresses = (db: Db): string[] => activeAddresses(db, "funder");

export function reportMessage(report: StoredReport, to: string[]): OutgoingMail {
  const { data } = report;
  const lines = [
    `Dear funder,`,
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
    to,
    subject: `${data.networkName}: training quality report for ${data.periodLabel} (${data.period})`,
    text: lines.join("\n"),
    attachments: [{ filename: reportFileName(report.period, report.version), content: report.pdf, contentType: "application/pdf" }],
  };
}

function describeFailure(err: unknown): string {
  const error = err as { message?: string; code?: string; response?: string };
  const detail = error?.response ?? error?.message ?? String(err);
  return `${error?.code ? `${error.code}: ` : ""}${detail}`.slice(0, 500);
}

async function deliver(mailer: Mailer, report: StoredReport, recipients: string[]) {
  try {
    const receipt = await mailer.send(reportMessage(report, recipients));
    if (receipt.rejected.length > 0) {
      return { status: "failed" as const, error: `The mail server refused: ${receipt.rejected.join(", ")}`, messageId: receipt.messageId || null };
    }
    return { status: "sent" as const, error: null, messageId: receipt.messageId || null };
  } catch (err) {
    return { status: "failed" as const, error: describeFailure(err), messageId: null };
  }
}

/** Sends a stored version to every active funder plus any extra addresses, and records the outcome. */
export async function sendReport(
  db: Db,
  mailer: Mailer,
  reportId: number,
  options: { userId?: number | null; extraRecipients?: string[] } = {},
): Promise<ReportSendRow> {
  const report = findReport(db, reportId);
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
  const outcome = await deliver(mailer, report, recipients);
  const { id } = db
    .insert(reportSends)
    .values({ reportId, sentBy: options.userId ?? null, recipients, ...outcome, createdAt: new Date().toISOString() })
    .returning({ id: reportSends.id })
    .get();
  return withoutUserId(findSend(db, id));
}

/** Tries a failed send again, to the same recipients with the same stored PDF; the record becomes sent on success. */
export async function retrySend(db: Db, mailer: Mailer, sendId: number, userId: number | null): Promise<ReportSendRow> {
  const send = findSend(db, sendId);
  if (send.status === "sent") throw conflict("This report was already sent; it is not sent twice.");
  const report = findReport(db, send.reportId);
  const outcome = await deliver(mailer, report, send.recipients);
  db.update(reportSends)
    .set({ ...outcome, sentBy: userId ?? send.sentById, createdAt: new Date().toISOString() })
    .where(eq(reportSends.id, sendId))
    .run();
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
