// The state of the installation for coordinators (GET /api/system, `quarterbeat system`): program version and
// schema level, the database's size and how it grows per quarter, the last backups with their verification,
// the last imports and the mail the program has sent.
import fs from "node:fs";
import path from "node:path";
import { count, desc, eq } from "drizzle-orm";
import type { QuarterGrowth, SystemReport } from "../../shared/schemas/system";
import type { Db } from "../db/client";
import { attempts, classes, compressionStreams, mailbox, reportSends } from "../db/schema";
import { listBatches } from "../imports/history";
import { readSmtpUrl } from "../mail/mailer";
import { lastVerifiedBackup, recentBackups } from "./backupLog";
import { migrationLevel } from "./migrations";
import { listBackups } from "./scheduledBackup";
import { APP_VERSION } from "./version";

export interface SystemReportOptions {
  /** The scheduled backups' folder; null when they are off. */
  backupDir: string | null;
  /** SMTP_URL as configured; `localMail` when the server's local mail service stands in for it. */
  mail: { smtpUrl?: string; localMail: boolean };
}

const RECENT = 10;

const fileSize = (file: string) => (fs.existsSync(file) ? fs.statSync(file).size : 0);

/** Sizes of the file this connection opened (which the configuration may not name, e.g. under --db). */
function databaseSize(db: Db): SystemReport["database"] {
  const dbFile = db.$client.name;
  const pragma = (name: string) => db.$client.pragma(name, { simple: true }) as number;
  return {
    file: path.resolve(dbFile),
    fileBytes: fileSize(dbFile),
    walBytes: fileSize(`${dbFile}-wal`),
    pageSize: pragma("page_size"),
    pageCount: pragma("page_count"),
    freePages: pragma("freelist_count"),
  };
}

/** Classes, attempts and stored compression streams per quarter, oldest first; each count reads an index. */
function growthByQuarter(db: Db): QuarterGrowth[] {
  const byQuarter = new Map<string, QuarterGrowth>();
  const row = (quarter: string) => {
    let found = byQuarter.get(quarter);
    if (!found) byQuarter.set(quarter, (found = { quarter, classes: 0, attempts: 0, compressionStreams: 0 }));
    return found;
  };
  for (const { quarter, n } of db.select({ quarter: classes.quarter, n: count() }).from(classes).groupBy(classes.quarter).all()) row(quarter).classes = n;
  for (const { quarter, n } of db.select({ quarter: attempts.quarter, n: count() }).from(attempts).groupBy(attempts.quarter).all()) row(quarter).attempts = n;
  const streams = db
    .select({ quarter: attempts.quarter, n: count() })
    .from(compressionStreams)
    .innerJoin(attempts, eq(attempts.id, compressionStreams.attemptId))
    .groupBy(attempts.quarter)
    .all();
  for (const { quarter, n } of streams) row(quarter).compressionStreams = n;
  return [...byQuarter.values()].sort((a, b) => a.quarter.localeCompare(b.quarter));
}

function backupState(db: Db, dir: string | null): SystemReport["backups"] {
  const files = dir ? listBackups(dir) : [];
  return {
    dir: dir ? path.resolve(dir) : null,
    filesInDir: files.length,
    bytesInDir: files.reduce((sum, backup) => sum + fileSize(backup.file), 0),
    lastVerified: lastVerifiedBackup(db),
    recent: recentBackups(db, RECENT),
  };
}

/** Mail is sent at once, never queued: a failed report send waits for a coordinator to retry it. */
function mailState(db: Db, mail: SystemReportOptions["mail"]): SystemReport["mail"] {
  const smtp = mail.smtpUrl && !mail.localMail ? readSmtpUrl(mail.smtpUrl) : null;
  const sends = { sent: 0, failed: 0 };
  for (const { status, n } of db.select({ status: reportSends.status, n: count() }).from(reportSends).groupBy(reportSends.status).all()) sends[status] = n;
  const lastFailure = db
    .select({ at: reportSends.createdAt, error: reportSends.error })
    .from(reportSends)
    .where(eq(reportSends.status, "failed"))
    .orderBy(desc(reportSends.createdAt))
    .limit(1)
    .get();
  const [{ n: outboxMessages }] = db.select({ n: count() }).from(mailbox).all();
  return { delivery: smtp ? "smtp" : "outbox", server: smtp?.target ?? null, reportSends: sends, lastFailure: lastFailure ?? null, outboxMessages };
}

export function systemReport(db: Db, options: SystemReportOptions): SystemReport {
  return {
    version: APP_VERSION,
    migration: migrationLevel(db.$client),
    database: databaseSize(db),
    growth: growthByQuarter(db),
    backups: backupState(db, options.backupDir),
    imports: listBatches(db, { limit: RECENT, offset: 0, userId: null }).batches,
    mail: mailState(db, options.mail),
  };
}
