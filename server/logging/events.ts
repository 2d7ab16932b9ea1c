// Events beside the request lines, for the work a request only starts or waits on: imports and report sends,
// with their counts and durations. File names, addresses and mail server answers stay out (they may be personal).
import type { ImportSummary } from "../../shared/import/api";
import type { ReportSendRow } from "../../shared/schemas/report";
import type { Logger } from "./logger";

export interface ImportEvent {
  jobId: string;
  userId: number;
  mode: "validate" | "import";
  kind: string;
  summary: ImportSummary | null;
  failed: boolean;
  durationMs: number;
}

export function logImport(logger: Logger, event: ImportEvent) {
  const { summary } = event;
  const fields = {
    event: "import",
    jobId: event.jobId,
    userId: event.userId,
    mode: event.mode,
    kind: event.kind,
    status: event.failed ? "failed" : (summary?.status ?? "failed"),
    batchId: summary?.batchId ?? null,
    rowsRead: summary?.rowsRead ?? 0,
    inserted: summary?.inserted ?? 0,
    updated: summary?.updated ?? 0,
    unchanged: summary?.unchanged ?? 0,
    rejected: summary?.rejected ?? 0,
    durationMs: event.durationMs,
  };
  if (event.failed) logger.error(fields, "import failed");
  else logger.info(fields, "import finished");
}

/** The digest after an import: how many signals and recipients, never who or what. */
export function logImportAlerts(logger: Logger, outcome: { status: string; recipients?: number; signals?: number }) {
  const fields = { event: "import_alerts", status: outcome.status, recipients: outcome.recipients ?? 0, signals: outcome.signals ?? 0 };
  if (outcome.status === "failed") logger.warn(fields, "import alerts not sent");
  else logger.info(fields, "import alerts checked");
}

export function logReportSend(logger: Logger, send: ReportSendRow, userId: number, durationMs: number) {
  const fields = {
    event: "report_send",
    sendId: send.id,
    reportId: send.reportId,
    period: send.period,
    version: send.version,
    recipients: send.recipients.length,
    status: send.status,
    userId,
    durationMs,
  };
  if (send.status === "failed") logger.warn(fields, "report send failed");
  else logger.info(fields, "report sent");
}
