// Releasing a stored version to the funders: from then on their report page and the API show it, and each
// active funder gets a short notice by e-mail (one message each, so no one sees the others' addresses).
import { periodLabel } from "../../shared/period";
import type { ReleaseOutcome } from "../../shared/schemas/report";
import type { Db } from "../db/client";
import type { Mailer, OutgoingMail } from "../mail/mailer";
import { describeMailFailure } from "./mailFailure";
import { funderAddresses } from "./send";
import { findReport, markReleased, type StoredReport } from "./store";

export function releaseNotice(report: StoredReport, to: string, reportUrl: string): OutgoingMail {
  const { data } = report;
  return {
    to: [to],
    subject: `${data.networkName}: training quality report for ${data.periodLabel} released`,
    text: [
      `Version ${report.version} of the training quality report of ${data.networkName} for ${data.periodLabel} (${periodLabel(report.period)}) has been released.`,
      "",
      `Read it and download its PDF at ${reportUrl}`,
      "",
      "Sent by Quarterbeat on behalf of the network's coordinator.",
    ].join("\n"),
  };
}

export async function releaseReport(
  db: Db,
  mailer: Mailer,
  reportId: number,
  options: { userId: number | null; reportUrl: (period: string) => string; now?: Date },
): Promise<ReleaseOutcome> {
  const report = findReport(db, reportId);
  const { data: _data, pdf: _pdf, ...version } = report;
  if (!markReleased(db, reportId, options.userId, options.now)) return { report: version, released: false, notified: [], failed: [] };
  const notified: string[] = [];
  const failed: ReleaseOutcome["failed"] = [];
  for (const address of funderAddresses(db)) {
    try {
      const receipt = await mailer.send(releaseNotice(report, address, options.reportUrl(report.period)));
      if (receipt.rejected.length > 0) failed.push({ address, error: `The mail server refused ${address}` });
      else notified.push(address);
    } catch (err) {
      failed.push({ address, error: describeMailFailure(err) });
    }
  }
  const { data: _d, pdf: _p, ...released } = findReport(db, reportId);
  return { report: released, released: true, notified, failed };
}
