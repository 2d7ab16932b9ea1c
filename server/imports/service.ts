// The import service: one call per file, the same for the CLI, the web upload (in a worker thread) and the
// demo seeder. A file is one transaction: any refused row refuses the whole file and nothing is written,
// unless skipInvalid, which writes the valid rows and keeps the refused ones with the batch. A dry run reads
// inside a read transaction and writes nothing at all (so it never holds the write lock).
import path from "node:path";
import type Database from "better-sqlite3";
import { importKinds, type ImportKind } from "../../shared/domain";
import { can } from "../../shared/permissions";
import type { ImportSummary } from "../../shared/import/api";
import { resolveHeader } from "../../shared/import/header";
import { identityMapping, unknownMappingColumns, type ImportMapping } from "../../shared/import/mapping";
import { RowReader } from "../../shared/import/rows";
import type { Db } from "../db/client";
import { forbidden } from "../errors";
import { addPendingAttempts, deferSummaries } from "../metrics/deferredSummaries";
import { currentPolicy } from "../policy/service";
import { attemptsImporter } from "./attempts";
import { classesImporter } from "./classes";
import { compressionsImporter } from "./compressions";
import { CsvSyntaxError, inputName, readCsv, type CsvProgress, type ImportInput } from "./csvInput";
import { equipmentImporter } from "./equipment";
import type { KindImporter } from "./kind";
import { CLI_ACTOR, ImportRun, type ClassInfo, type ImportActor } from "./run";

export type { ImportInput } from "./csvInput";
export type { ImportActor, ClassInfo } from "./run";

export interface ImportProgress extends CsvProgress {
  file: string;
}

export interface ImportFileOptions {
  kind: ImportKind;
  input: ImportInput;
  mapping?: ImportMapping;
  /** Validate and count what would change; write nothing. */
  dryRun?: boolean;
  /** Write the valid rows; keep the refused ones in rejected_rows with the batch. */
  skipInvalid?: boolean;
  actor?: ImportActor;
  source: "cli" | "web" | "seed";
  /** Shared by the files of one command, so attempts may name classes from an earlier dry-run file. */
  pendingClasses?: Map<string, ClassInfo>;
  onProgress?: (progress: ImportProgress) => void | Promise<void>;
  /** Also write every refused row (row, column, reason, then the file's columns) to this CSV file. */
  rejectedCsvPath?: string;
  /** The clock for "in the future" checks (tests). */
  now?: Date;
  /** Compression rows held in memory before spilling to a temporary table (tests use a small number). */
  streamBufferRows?: number;
}

/** Page cache while importing, in KiB (SQLite's default is 2 MB). */
const IMPORT_CACHE_KIB = 64 * 1024;

/** Only the last part of a name, so a file name can never act as a path. */
export function safeFileName(name: string): string {
  const base = path
    .basename(name.replace(/\\/g, "/"))
    .replace(/[^\w.\- ()]/g, "_")
    .slice(0, 200);
  return base === "" || base === "." || base === ".." ? "upload.csv" : base;
}

/** How long an import waits for another writer (an import from the CLI or the web) before it gives up. */
const WRITE_LOCK_WAIT_MS = 30 * 60 * 1000;

/**
 * BEGIN IMMEDIATE, tried again while another connection holds the write lock: one try waits the connection's
 * busy timeout (15 s), and a big import beside this one can write for longer than that.
 */
async function beginWriting(sqlite: Database.Database): Promise<void> {
  const giveUpAt = Date.now() + WRITE_LOCK_WAIT_MS;
  for (;;) {
    try {
      sqlite.exec("BEGIN IMMEDIATE");
      return;
    } catch (err) {
      if ((err as { code?: string }).code !== "SQLITE_BUSY" || Date.now() > giveUpAt) throw err;
    }
    await new Promise((resolve) => setTimeout(resolve, 100));
  }
}

export async function importFile(db: Db, options: ImportFileOptions): Promise<ImportSummary> {
  const sqlite: Database.Database = db.$client;
  const { kind, input } = options;
  const actor = options.actor ?? CLI_ACTOR;
  const mapping = options.mapping ?? identityMapping;
  const dryRun = options.dryRun ?? false;
  const skipInvalid = options.skipInvalid ?? false;
  if (kind === "equipment" && actor.role !== null && !can(actor.role, "importEquipment")) {
    throw forbidden("Equipment logs are imported by coordinators only.");
  }
  const fileName = safeFileName(inputName(input));
  const started = performance.now();
  const policy = currentPolicy(db); // may write version 1 on first use: before the transaction

  // A bigger page cache while importing: a big file's inserts touch index pages all over the B-trees.
  const cacheSize = sqlite.pragma("cache_size", { simple: true }) as number;
  sqlite.pragma(`cache_size = ${IMPORT_CACHE_KIB > Math.abs(cacheSize) ? -IMPORT_CACHE_KIB : cacheSize}`);
  if (dryRun) sqlite.exec("BEGIN");
  else await beginWriting(sqlite);
  let run: ImportRun | undefined;
  try {
    const batchId = dryRun
      ? 0
      : (sqlite
          .prepare("INSERT INTO import_batches (kind, file_name, sha256, user_id, source) VALUES (?, ?, '', ?, ?) RETURNING id")
          .pluck()
          .get(kind, fileName, actor.userId, options.source) as number);
    // attempts go into the summaries set-wise just before the commit, not row by row
    deferSummaries(sqlite);
    run = new ImportRun(sqlite, kind, batchId, !dryRun, skipInvalid, actor, policy, options.pendingClasses ?? new Map(), options.rejectedCsvPath);
    const current = run;
    let importer: KindImporter | undefined;
    let headerLength = 0;
    let headerRefused = false;
    for (const unknown of unknownMappingColumns(kind, mapping)) {
      current.headerIssue(unknown, `the mapping names "${unknown}", which is not a column of ${kind} files`);
      headerRefused = true;
    }

    let syntaxError: CsvSyntaxError | undefined;
    let csv: Awaited<ReturnType<typeof readCsv>> | undefined;
    try {
      csv = await readCsv(input, {
        header(fields) {
          const blank = headerBlankness(fields);
          if (blank) {
            current.headerIssue(null, blank);
            headerRefused = true;
            return false;
          }
          const resolved = resolveHeader(fields, kind, mapping);
          for (const problem of resolved.problems) current.headerIssue(problem.column, problem.reason);
          if (resolved.problems.length > 0 || headerRefused) {
            // A file given as the wrong kind misses most columns: say which kind it looks like.
            const fits = importKinds.filter((other) => other !== kind && resolveHeader(fields, other, identityMapping).problems.length === 0);
            if (resolved.problems.length > 0 && fits.length > 0) current.headerIssue(null, `the header fits the ${fits[0]} format; import it as ${fits[0]}`);
            headerRefused = true;
            return false;
          }
          headerLength = fields.length;
          current.setHeader(fields);
          if (resolved.extra.length > 0)
            current.warnings.push(`Ignored column${resolved.extra.length > 1 ? "s" : ""} not used by ${kind} files: ${resolved.extra.join(", ")}`);
          const reader = new RowReader(kind, resolved, mapping, options.now);
          importer = makeImporter(current, reader, options.streamBufferRows);
          return true;
        },
        record(fields, row) {
          if (fields.length !== headerLength) {
            current.rejectRow(fields, [{ row, column: null, reason: `the row has ${fields.length} values; the header has ${headerLength} columns` }]);
            return;
          }
          importer!.row(fields, row);
        },
        chunk: options.onProgress ? (progress) => options.onProgress!({ ...progress, file: fileName }) : undefined,
      });
    } catch (err) {
      if (!(err instanceof CsvSyntaxError)) throw err;
      syntaxError = err;
      current.addIssue({ row: err.row, column: null, reason: err.message });
    }
    if (importer && !syntaxError) importer.finish();
    // A header and nothing else would record an empty batch: most likely the export went wrong.
    const noRows = importer !== undefined && !syntaxError && csv !== undefined && csv.rows === 0;
    if (noRows) current.addIssue({ row: null, column: null, reason: "the file has a header but no rows" });

    // Batched writes report duplicates a few rows late: list reasons in file order (header first).
    current.issues.sort((a, b) => (a.row ?? 0) - (b.row ?? 0));
    const refused = headerRefused || syntaxError !== undefined || noRows || (current.rejectedRows > 0 && !skipInvalid);
    // Every row already stored as the file has it: no batch is recorded, so history lists only real changes.
    const changedNothing = !refused && !dryRun && current.inserted === 0 && current.updated === 0 && current.rejectedRows === 0 && !createdCodes(current);
    const stream = importer && "attemptsRead" in importer ? (importer as ReturnType<typeof compressionsImporter>) : undefined;
    const summary: ImportSummary = {
      file: fileName,
      kind,
      dryRun,
      status: refused ? "refused" : dryRun ? "validated" : changedNothing ? "unchanged" : "imported",
      batchId: refused || dryRun || changedNothing ? null : batchId,
      sha256: csv?.sha256 ?? null,
      unit: importer?.unit ?? (kind === "compressions" ? "attempts" : "rows"),
      delimiter: csv?.delimiter ?? null,
      rowsRead: csv?.rows ?? 0,
      inserted: current.inserted,
      updated: current.updated,
      unchanged: current.unchanged,
      rejected: current.rejectedRows,
      attemptsRead: stream ? stream.attemptsRead() : null,
      attemptsRejected: stream ? stream.attemptsRejected() : null,
      newCodes: current.codes.created,
      warnings: current.warnings,
      issues: current.issues,
      issuesTotal: current.issuesTotal,
      durationMs: Math.round(performance.now() - started),
    };
    if (refused || dryRun || changedNothing) {
      sqlite.exec("ROLLBACK");
      if (refused && !dryRun) {
        summary.inserted = summary.updated = summary.unchanged = 0;
      }
      return summary;
    }
    sqlite
      .prepare(
        "UPDATE import_batches SET sha256 = ?, rows_read = ?, inserted = ?, updated = ?, unchanged = ?, rejected = ?, new_codes = ?, warnings = ? WHERE id = ?",
      )
      .run(
        summary.sha256,
        summary.rowsRead,
        summary.inserted,
        summary.updated,
        summary.unchanged,
        summary.rejected,
        JSON.stringify(summary.newCodes),
        JSON.stringify(summary.warnings),
        batchId,
      );
    importer?.beforeCommit?.();
    addPendingAttempts(sqlite);
    sqlite.exec("COMMIT");
    return summary;
  } catch (err) {
    if (sqlite.inTransaction) sqlite.exec("ROLLBACK");
    throw err;
  } finally {
    run?.close();
    sqlite.pragma(`cache_size = ${cacheSize}`);
  }
}

/** Why a header row is no header at all, or null: one message instead of one per missing column. */
function headerBlankness(fields: readonly string[]): string | null {
  if (fields.length === 0) return "the file is empty";
  if (fields.every((name) => name.trim() === "")) return "the first row has no column names; the file must start with its header row";
  return null;
}

function createdCodes(run: ImportRun): boolean {
  const { sites, instructors, manikins } = run.codes.created;
  return sites.length + instructors.length + manikins.length > 0;
}

function makeImporter(run: ImportRun, reader: RowReader, streamBufferRows?: number): KindImporter {
  switch (run.kind) {
    case "classes":
      return classesImporter(run, reader);
    case "attempts":
      return attemptsImporter(run, reader);
    case "compressions":
      return compressionsImporter(run, reader, streamBufferRows);
    case "equipment":
      return equipmentImporter(run, reader);
  }
}

export interface ImportFilesOptions extends Omit<ImportFileOptions, "input" | "pendingClasses"> {
  inputs: ImportInput[];
}

/**
 * Imports files in order, each in its own transaction; a later file may name classes from an earlier one.
 * Stops at the first refused file, because later files may depend on it.
 */
export async function importFiles(db: Db, options: ImportFilesOptions): Promise<{ summaries: ImportSummary[]; notImported: string[] }> {
  const pendingClasses = new Map<string, ClassInfo>();
  const summaries: ImportSummary[] = [];
  for (let i = 0; i < options.inputs.length; i++) {
    const summary = await importFile(db, { ...options, input: options.inputs[i], pendingClasses });
    summaries.push(summary);
    if (summary.status === "refused") {
      return { summaries, notImported: options.inputs.slice(i + 1).map((input) => safeFileName(inputName(input))) };
    }
  }
  return { summaries, notImported: [] };
}
