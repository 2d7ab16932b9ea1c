// `quarterbeat import <kind> <files…>`: imports CSV files through the same service as the web upload, each
// file in its own transaction, in the order given (a class log before the attempts that name its classes).
import fs from "node:fs";
import cliProgress from "cli-progress";
import type { Command } from "commander";
import { z } from "zod";
import { importKinds } from "../../shared/domain";
import type { ImportSummary } from "../../shared/import/api";
import { importMappingSchema, type ImportMapping } from "../../shared/import/mapping";
import { AppError } from "../../server/errors";
import { sendImportAlerts } from "../../server/alerts/importAlerts";
import type { Config } from "../../server/config";
import type { Db } from "../../server/db/client";
import { importFiles, type ImportProgress } from "../../server/imports/service";
import { startLocalMailService } from "../../server/mail/localService";
import { createMailer } from "../../server/mail/mailer";
import { CLI_ACTOR } from "../../server/imports/run";
import { findUserByEmail } from "../../server/users/service";
import { delimiterLabels } from "../../shared/import/delimiter";
import { context } from "../context";
import { UsageError } from "../errors";

const optionsSchema = z.object({
  map: z.string().optional(),
  dryRun: z.boolean().optional(),
  skipInvalid: z.boolean().optional(),
  json: z.boolean().optional(),
  as: z.string().optional(),
});

export function readMappingFile(file: string): ImportMapping {
  let text: string;
  try {
    text = fs.readFileSync(file, "utf8");
  } catch {
    throw new UsageError(`Cannot read the mapping file ${file}.`, "Give the path of a JSON mapping (see docs/import-formats.md).");
  }
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (err) {
    throw new UsageError(`The mapping file ${file} is not valid JSON: ${(err as Error).message}`);
  }
  const parsed = importMappingSchema.safeParse(json);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((issue) => `${issue.path.join(".") || "mapping"}: ${issue.message}`);
    throw new UsageError(`The mapping file ${file} is not a valid mapping:\n  ${lines.join("\n  ")}`, "See docs/import-formats.md for the mapping format.");
  }
  return parsed.data;
}

export function registerImport(program: Command) {
  program
    .command("import <kind> <files...>")
    .description(`Import CSV files of one kind (${importKinds.join(", ")}); each file is all-or-nothing`)
    .option("--map <file>", "JSON column mapping: renames, units, value translations")
    .option("--dry-run", "validate and report what would change, write nothing")
    .option("--skip-invalid", "import the valid rows; keep the refused rows with the batch")
    .option("--json", "print one JSON object instead of the readable summary")
    .option("--as <email>", "the user recorded on the batch (default: none, recorded as a CLI import)")
    .action(async (kind: string, files: string[], raw: unknown, command: Command) => {
      const options = optionsSchema.parse(raw);
      const kindParsed = z.enum(importKinds).safeParse(kind);
      if (!kindParsed.success) throw new UsageError(`Unknown kind "${kind}".`, `Use one of ${importKinds.join(", ")}.`);
      for (const file of files) {
        if (!fs.existsSync(file) || !fs.statSync(file).isFile()) throw new UsageError(`No file ${file}.`);
      }
      const mapping = options.map ? readMappingFile(options.map) : undefined;
      const { config, db } = context(command);
      let userId: number | null = null;
      if (options.as) {
        const user = findUserByEmail(db, options.as);
        if (!user) throw new UsageError(`No user with the e-mail ${options.as}.`, "Run `quarterbeat users list` to see who exists.");
        userId = user.id;
      }

      const showProgress = !options.json && process.stdout.isTTY === true;
      const bar = showProgress ? new ProgressBar() : undefined;
      let result: Awaited<ReturnType<typeof importFiles>>;
      try {
        result = await importFiles(db, {
          kind: kindParsed.data,
          inputs: files.map((path) => ({ path })),
          mapping,
          dryRun: options.dryRun,
          skipInvalid: options.skipInvalid,
          actor: { ...CLI_ACTOR, userId },
          source: "cli",
          onProgress: bar ? (progress) => bar.update(progress) : undefined,
        });
      } finally {
        bar?.stop();
      }

      if (options.json) console.log(JSON.stringify({ files: result.summaries, notImported: result.notImported }, null, 2));
      else {
        for (const summary of result.summaries) printSummary(summary);
        if (result.notImported.length > 0) console.log(`Not imported (an earlier file was refused): ${result.notImported.join(", ")}`);
      }
      if (result.summaries.some((s) => s.status === "imported")) await mailAlerts(config, db, options.json ?? false);
      const refused = result.summaries.filter((s) => s.status === "refused");
      if (refused.length > 0) {
        throw new AppError(
          "refused",
          422,
          `${refused.map((s) => s.file).join(", ")} ${refused.length > 1 ? "were" : "was"} refused; nothing was written from ${refused.length > 1 ? "them" : "it"}.`,
          undefined,
          options.skipInvalid ? undefined : "Correct the rows listed above, or run again with --skip-invalid to import the valid rows.",
        );
      }
    });
}

/**
 * The same digest as after a web import. Without SMTP_URL the local mail service runs for the length of this
 * step, as for `quarterbeat report --send`; its mailbox is the database's Outbox.
 */
async function mailAlerts(config: Config, db: Db, quiet: boolean) {
  let local: Awaited<ReturnType<typeof startLocalMailService>> | null = null;
  try {
    if (!config.smtpUrl) local = await startLocalMailService(db);
    const outcome = await sendImportAlerts(db, createMailer(config.smtpUrl ?? local!.url));
    if (quiet) return;
    if (outcome.status === "sent")
      console.log(
        `Mailed ${outcome.signals} new signal${outcome.signals === 1 ? "" : "s"} to ${outcome.recipients} account${outcome.recipients === 1 ? "" : "s"}, each by its own alert choice.`,
      );
    if (outcome.status === "failed") console.log(`The alert digest could not be sent (${outcome.error}); it is tried again after the next import.`);
  } catch (err) {
    // the import itself is done: a digest that cannot be prepared must not turn it into a failure
    if (!quiet) console.log(`The alert digest could not be prepared: ${(err as Error).message}`);
  } finally {
    await local?.close();
  }
}

/** Rows, rows per second and a time left estimated from the bytes read. Only on a terminal. */
class ProgressBar {
  private bar: cliProgress.SingleBar | undefined;
  private file = "";
  private started = 0;

  update(progress: ImportProgress) {
    if (progress.file !== this.file) {
      this.bar?.stop();
      this.file = progress.file;
      this.started = performance.now();
      this.bar = new cliProgress.SingleBar(
        { format: "{file} [{bar}] {percentage}% | {rows} rows | {rate} rows/s | ETA {eta_formatted}", hideCursor: true, etaBuffer: 20 },
        cliProgress.Presets.shades_classic,
      );
      this.bar.start(progress.totalBytes ?? progress.bytesRead, 0, { file: progress.file, rows: 0, rate: 0 });
    }
    const seconds = (performance.now() - this.started) / 1000;
    this.bar!.update(progress.bytesRead, { rows: progress.rows, rate: seconds > 0 ? Math.round(progress.rows / seconds) : 0 });
  }

  stop() {
    this.bar?.stop();
  }
}

function printSummary(s: ImportSummary) {
  const verdicts: Record<ImportSummary["status"], string> = {
    imported: `imported as batch ${s.batchId}`,
    validated: "valid (dry run, nothing written)",
    unchanged: "nothing changed: every row is already stored as in this file; no batch recorded",
    refused: s.dryRun ? "would be refused (dry run)" : "REFUSED, nothing written",
  };
  const verdict = verdicts[s.status];
  console.log(`\n${s.file} (${s.kind}): ${verdict}`);
  if (s.delimiter) console.log(`  columns separated by ${delimiterLabels[s.delimiter]}`);
  const unit = s.unit === "attempts" ? " attempts" : "";
  const attempts = s.attemptsRead !== null ? ` · attempts ${s.attemptsRead}` : "";
  console.log(
    `  rows read ${s.rowsRead}${attempts} · inserted ${s.inserted}${unit} · updated ${s.updated} · unchanged ${s.unchanged} · rejected rows ${s.rejected}`,
  );
  const codes = (Object.entries(s.newCodes) as [string, string[]][]).filter(([, list]) => list.length > 0);
  if (codes.length > 0) console.log(`  new codes: ${codes.map(([what, list]) => `${what} ${list.join(", ")}`).join("; ")}`);
  for (const warning of s.warnings.slice(0, 20)) console.log(`  warning: ${warning}`);
  if (s.warnings.length > 20) console.log(`  … and ${s.warnings.length - 20} more warnings`);
  if (s.issuesTotal > 0) {
    const shown = Math.min(s.issues.length, 50);
    console.log(
      `  problems (${s.issuesTotal}; row 1 = first data row after the header${shown < s.issuesTotal ? `; first ${shown} shown, --json lists up to 1000` : ""}):`,
    );
    for (const issue of s.issues.slice(0, shown)) {
      const where = issue.row === null ? "header" : `row ${issue.row}`;
      console.log(`    ${s.file}, ${where}${issue.column ? `, ${issue.column}` : ""}: ${issue.reason}`);
    }
  }
  console.log(`  took ${(s.durationMs / 1000).toFixed(1)} s`);
}
