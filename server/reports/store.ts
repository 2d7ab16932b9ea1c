// Stored report versions: each generation keeps its data and its PDF bytes, so what was sent can be
// downloaded again exactly as it was.
import { and, desc, eq, isNotNull, isNull, max, sql } from "drizzle-orm";
import type { ReportData, ReportVersion } from "../../shared/schemas/report";
import type { Db } from "../db/client";
import { reports, reportSends, users } from "../db/schema";
import { AppError, notFound } from "../errors";
import { buildReportData, reportPeriod } from "./data";
import { renderReportPdf } from "./pdf";

export interface StoredReport extends ReportVersion {
  data: ReportData;
  pdf: Buffer;
}

export function noDataError(period: string): AppError {
  return new AppError(
    "no_data",
    422,
    `There are no classes or measured attempts for ${period}, so there is nothing to report.`,
    undefined,
    "Import the class logs and attempts for that period first, or choose another period.",
  );
}

const lastSend = sql<string | null>`(select json_object('status', ${reportSends.status}, 'createdAt', ${reportSends.createdAt})
  from ${reportSends} where ${reportSends.reportId} = ${reports.id} order by ${reportSends.id} desc limit 1)`;

const versionColumns = {
  id: reports.id,
  period: reports.period,
  version: reports.version,
  createdAt: reports.createdAt,
  createdBy: users.displayName,
  pdfBytes: sql<number>`length(${reports.pdf})`,
  lastSend,
  releasedAt: reports.releasedAt,
};

/** Funders read released versions only; whoever prepares the report also sees the ones not yet released. */
export interface VersionReach {
  releasedOnly: boolean;
}

type VersionRow = Omit<ReportVersion, "lastSend"> & { lastSend: string | null };

function toVersion(row: VersionRow): ReportVersion {
  return { ...row, lastSend: row.lastSend ? (JSON.parse(row.lastSend) as ReportVersion["lastSend"]) : null };
}

/** Builds the report for a period, renders its PDF and stores both as the period's next version. */
export async function generateReport(
  db: Db,
  periodText: string,
  options: { userId?: number | null; now?: Date; includeActions?: boolean } = {},
): Promise<StoredReport> {
  const period = reportPeriod(periodText);
  const createdAt = options.now ?? new Date();
  // Milliseconds are dropped: the PDF's creation date has whole seconds, and the stored time should match it.
  createdAt.setUTCMilliseconds(0);
  const data = buildReportData(db, period.id, { now: createdAt, includeActions: options.includeActions });
  if (!data.hasData) throw noDataError(period.id);

  for (let tries = 0; ; tries++) {
    const latest = db
      .select({ version: max(reports.version) })
      .from(reports)
      .where(eq(reports.period, period.id))
      .get();
    const version = (latest?.version ?? 0) + 1;
    const pdf = await renderReportPdf(data, { version, createdAt });
    try {
      const row = db
        .insert(reports)
        .values({ period: period.id, version, data, pdf, createdBy: options.userId ?? null, createdAt: createdAt.toISOString() })
        .returning({ id: reports.id })
        .get();
      return findReport(db, row.id);
    } catch (err) {
      // another generation of the same period took this version number while the PDF was being drawn
      if (tries < 3 && String((err as Error)?.message).includes("UNIQUE")) continue;
      throw err;
    }
  }
}

export function listReports(db: Db, period?: string, reach: VersionReach = { releasedOnly: false }): ReportVersion[] {
  const rows = db
    .select(versionColumns)
    .from(reports)
    .leftJoin(users, eq(reports.createdBy, users.id))
    .where(and(period ? eq(reports.period, reportPeriod(period).id) : undefined, reach.releasedOnly ? isNotNull(reports.releasedAt) : undefined))
    .orderBy(desc(reports.id))
    .all();
  return rows.map(toVersion);
}

/** A stored version; one not yet released is answered as missing to a reader who may see released ones only. */
export function findReport(db: Db, id: number, reach: VersionReach = { releasedOnly: false }): StoredReport {
  const row = db
    .select({ ...versionColumns, data: reports.data, pdf: reports.pdf })
    .from(reports)
    .leftJoin(users, eq(reports.createdBy, users.id))
    .where(eq(reports.id, id))
    .get();
  if (!row || (reach.releasedOnly && row.releasedAt === null)) throw notFound("The report");
  const { data, pdf, ...version } = row;
  return { ...toVersion(version), data: data as ReportData, pdf: Buffer.from(pdf) };
}

/** Marks a version released unless it already is; true when this call released it. */
export function markReleased(db: Db, reportId: number, userId: number | null, at = new Date()): boolean {
  const changed = db
    .update(reports)
    .set({ releasedAt: at.toISOString(), releasedBy: userId })
    .where(and(eq(reports.id, reportId), isNull(reports.releasedAt)))
    .returning({ releasedAt: reports.releasedAt })
    .all();
  return changed.length > 0;
}

/** A file name that is safe in a Content-Disposition header and on every file system. */
export function reportFileName(period: string, version: number): string {
  return `quarterbeat-funder-report-${period.replace(/[^0-9A-Za-z-]/g, "")}-v${version}.pdf`;
}
