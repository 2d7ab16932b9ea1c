// `quarterbeat report --quarter 2026-Q3 --out report.pdf [--include-actions] [--send --note "…"] [--to a@example.org]` (or --year
// 2026): generates and stores the next version of the funder report, writes its PDF and, with --send, e-mails
// it with the cover note to every active funder, one message each (which releases the version to them). Without SMTP_URL the message goes to the local mail service (the web app's Outbox).
import fs from "node:fs";
import path from "node:path";
import type { Command } from "commander";
import { z } from "zod";
import { emailSchema } from "../../shared/schemas/auth";
import { AppError } from "../../server/errors";
import { startLocalMailService } from "../../server/mail/localService";
import { createMailer } from "../../server/mail/mailer";
import { sendReport } from "../../server/reports/send";
import { generateReport, reportFileName } from "../../server/reports/store";
import { context } from "../context";
import { UsageError } from "../errors";

const optionsSchema = z.object({
  quarter: z.string().optional(),
  year: z.string().optional(),
  out: z.string().optional(),
  send: z.boolean().optional(),
  note: z.string().optional(),
  to: z.array(z.string()).default([]),
  includeActions: z.boolean().optional(),
});

const collect = (value: string, previous: string[] = []) => [
  ...previous,
  ...value
    .split(",")
    .map((v) => v.trim())
    .filter(Boolean),
];

export function registerReport(program: Command) {
  program
    .command("report")
    .description("Generate the funder report for a quarter or a year, store it as a new version and write its PDF")
    .option("--quarter <quarter>", "the quarter, e.g. 2026-Q3")
    .option("--year <year>", "a whole year, e.g. 2026")
    .option("--out <file>", "where to write the PDF (default: quarterbeat-funder-report-<period>-v<version>.pdf)")
    .option("--send", "also e-mail the report to every active funder")
    .option("--note <text>", "the cover note above the report in each message (required with --send)")
    .option("--to <addresses>", "extra recipients for --send (repeat or separate with commas)", collect)
    .option("--include-actions", "list the improvement actions started by the period's end (never their owners)")
    .action(async (raw: unknown, command: Command) => {
      const options = optionsSchema.parse(raw);
      if (Boolean(options.quarter) === Boolean(options.year)) {
        throw new UsageError("Give either --quarter or --year.", "For example: quarterbeat report --quarter 2026-Q3 --out report.pdf");
      }
      if (options.to.length > 0 && !options.send) throw new UsageError("--to only makes sense with --send.");
      if (options.note !== undefined && !options.send) throw new UsageError("--note only makes sense with --send.");
      const coverNote = options.note?.trim() ?? "";
      if (options.send && !coverNote) {
        throw new UsageError("--send needs a cover note for the funders.", 'For example: --note "Dear funders, here is our report for the third quarter."');
      }
      const extraRecipients = options.to.map((address) => {
        const parsed = emailSchema.safeParse(address);
        if (!parsed.success) throw new UsageError(`"${address}" is not an e-mail address.`, "Use --to name@example.org.");
        return parsed.data;
      });

      const { config, db } = context(command);
      const period = (options.quarter ?? options.year)!;
      const report = await generateReport(db, period, { includeActions: options.includeActions ?? false });
      const out = path.resolve(options.out ?? reportFileName(report.period, report.version));
      try {
        fs.writeFileSync(out, report.pdf);
      } catch (err) {
        throw new AppError(
          "write_failed",
          500,
          `Version ${report.version} of the ${report.period} report is stored, but ${out} could not be written: ${(err as Error).message}`,
          undefined,
          "Choose another --out path; the stored version can also be downloaded in the web app.",
        );
      }
      console.log(`Stored version ${report.version} of the ${report.period} report and wrote ${out} (${Math.ceil(report.pdf.length / 1024)} kB).`);
      if (report.data.narrative.length) console.log(`  ${report.data.narrative[1] ?? report.data.narrative[0]}`);
      if (!options.send) return;

      // Without SMTP_URL the local mail service runs for the length of this command; its mailbox is the database.
      const local = config.smtpUrl ? null : await startLocalMailService(db);
      try {
        const send = await sendReport(db, createMailer(config.smtpUrl ?? local!.url), report.id, { extraRecipients, coverNote });
        if (send.status === "failed") {
          throw new AppError(
            "send_failed",
            502,
            `The report could not be sent to ${send.recipients.join(", ")}: ${send.error}`,
            undefined,
            `The failed send is recorded; retry it from the web app's report page once the mail server (${config.smtpUrl ? "SMTP_URL" : "local mail service"}) works.`,
          );
        }
        console.log(`Sent to ${send.recipients.join(", ")}.`);
        if (local) console.log("  No SMTP_URL is set: the message went to the local mail service; see the Outbox in the web app.");
      } finally {
        await local?.close();
      }
    });
}
