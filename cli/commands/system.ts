import type { Command } from "commander";
import { systemReport } from "../../server/ops/systemReport";
import { context } from "../context";

const megabytes = (bytes: number) => `${(bytes / 1024 / 1024).toFixed(1)} MB`;

export function registerSystem(program: Command) {
  program
    .command("system")
    .description("The installation's state: version, schema level, database size and growth per quarter, backups, imports, mail")
    .option("--json", "print JSON (the answer of GET /api/system)")
    .action((options: { json?: boolean }, command: Command) => {
      const { db, config } = context(command);
      const report = systemReport(db, { backupDir: config.backups.dir, mail: { smtpUrl: config.smtpUrl, localMail: false } });
      if (options.json) return console.log(JSON.stringify(report, null, 2));

      const { migration, database, backups, mail } = report;
      console.log(
        `Quarterbeat ${report.version}; schema ${migration.applied ?? "none"} (${migration.appliedCount} migrations${migration.current ? ", up to date" : `, ${migration.latest} pending`})`,
      );
      console.log(
        `Database ${database.file}: ${megabytes(database.fileBytes)} (+ ${megabytes(database.walBytes)} write-ahead log), ${database.pageCount} pages of ${database.pageSize} bytes, ${database.freePages} free`,
      );
      console.log("\nGrowth per quarter:");
      console.table(report.growth.map((q) => ({ quarter: q.quarter, classes: q.classes, attempts: q.attempts, "compression streams": q.compressionStreams })));
      console.log(
        `\nBackups: ${backups.dir ? `${backups.filesInDir} in ${backups.dir} (${megabytes(backups.bytesInDir)})` : "scheduled backups are off (BACKUP_DIR=off)"}`,
      );
      console.log(`Last verified backup: ${backups.lastVerified ? `${backups.lastVerified.takenAt} ${backups.lastVerified.file}` : "none recorded"}`);
      console.table(
        backups.recent.map((b) => ({
          taken: b.takenAt,
          source: b.source,
          file: b.file,
          size: megabytes(b.sizeBytes),
          verified: b.verified ? "ok" : "FAILED",
          message: b.message,
        })),
      );
      console.log("\nLast imports:");
      console.table(
        report.imports.map((i) => ({
          batch: i.id,
          at: i.createdAt,
          kind: i.kind,
          file: i.fileName,
          by: i.userEmail ?? i.source,
          status: i.status,
          read: i.rowsRead,
          inserted: i.inserted,
          updated: i.updated,
          rejected: i.rejected,
        })),
      );
      const delivery = mail.delivery === "smtp" ? `through ${mail.server}` : "kept in the Outbox by the local mail service (no SMTP_URL)";
      console.log(
        `\nMail ${delivery}: report sends ${mail.reportSends.sent} sent, ${mail.reportSends.failed} failed (waiting for a retry); ${mail.outboxMessages} messages in the Outbox`,
      );
      if (mail.lastFailure) console.log(`Last failed send ${mail.lastFailure.at}: ${mail.lastFailure.error ?? "no reason recorded"}`);
    });
}
