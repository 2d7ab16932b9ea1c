// The state of one file's import: counts, refused rows, warnings, the batch and its change log. Each kind's
// importer (classes.ts, attempts.ts, compressions.ts, equipment.ts) reads rows through it.
import fs from "node:fs";
import type Database from "better-sqlite3";
import type { ImportKind, UserRole } from "../../shared/domain";
import { reachOf } from "../../shared/permissions";
import type { RowIssue } from "../../shared/import/rows";
import type { NetworkPolicy } from "../../shared/scoring/policy";
import { csvLine, SPREADSHEET_CSV } from "../../shared/csv";
import { CodeRegistry } from "./codes";
import { InstructorScope } from "./instructorScope";

/** Who imports. role null = the command line, which may import anything. */
export interface ImportActor {
  userId: number | null;
  role: UserRole | null;
  instructorId: number | null;
}

export const CLI_ACTOR: ImportActor = { userId: null, role: null, instructorId: null };

/** What an attempt copies from its class. */
export interface ClassInfo {
  date: string;
  quarter: string;
  siteId: number;
  instructorId: number;
}

/** Why a row is refused, found after the row itself was read: the column and the reason. */
export interface RowProblem {
  column: string;
  reason: string;
}

/** Most refused rows listed in a summary; all of them are counted (and kept with --skip-invalid). */
export const ISSUE_LIST_CAP = 1000;

export class ImportRun {
  inserted = 0;
  updated = 0;
  unchanged = 0;
  rejectedRows = 0;
  issuesTotal = 0;
  readonly issues: RowIssue[] = [];
  readonly warnings: string[] = [];
  readonly codes: CodeRegistry;
  /** Set for an instructor's import: what their file may name (see instructorScope.ts). */
  readonly instructorScope: InstructorScope | null;
  header: string[] = [];
  private readonly insertRejected;
  private readonly insertChange;
  private readonly classLookup;
  private readonly classCache = new Map<string, ClassInfo | null>();
  private rejectedCsv: number | null = null;

  constructor(
    readonly sqlite: Database.Database,
    readonly kind: ImportKind,
    readonly batchId: number,
    readonly write: boolean,
    readonly skipInvalid: boolean,
    readonly actor: ImportActor,
    readonly policy: { version: number; policy: NetworkPolicy },
    /** Classes named by earlier files of the same command (needed when those were only dry-run). */
    readonly pendingClasses: Map<string, ClassInfo>,
    rejectedCsvPath?: string,
  ) {
    this.codes = new CodeRegistry(sqlite, write);
    const own = this.restrictedToInstructor;
    this.instructorScope = own === null ? null : new InstructorScope(this.codes, own, (classId) => this.classInfo(classId));
    this.insertRejected = sqlite.prepare("INSERT INTO rejected_rows (batch_id, row_number, column, reason, raw) VALUES (?, ?, ?, ?, ?)");
    this.insertChange = sqlite.prepare("INSERT INTO batch_changes (batch_id, table_name, row_key, previous) VALUES (?, ?, ?, ?)");
    this.classLookup = sqlite.prepare("SELECT date, quarter, site_id, instructor_id FROM classes WHERE id = ?").raw();
    if (rejectedCsvPath) this.rejectedCsv = fs.openSync(rejectedCsvPath, "w");
  }

  /** Rows are written when importing for real and kept when refused rows go to rejected_rows. */
  get keepsRejected(): boolean {
    return this.write && this.skipInvalid;
  }

  /** The instructor whose classes this actor may import ("own" reach), or null for any instructor's. */
  get restrictedToInstructor(): number | null {
    if (this.actor.role === null || reachOf(this.actor.role, "importData") === "any") return null;
    return this.actor.instructorId ?? -1;
  }

  setHeader(header: string[]) {
    this.header = header.map((h) => h.trim());
    if (this.rejectedCsv !== null) fs.writeSync(this.rejectedCsv, csvLine(["row", "column", "reason", ...this.header], SPREADSHEET_CSV));
  }

  /** A header fault: refuses the file before any row is read. */
  headerIssue(column: string | null, reason: string) {
    this.addIssue({ row: null, column, reason });
  }

  addIssue(issue: RowIssue) {
    this.issuesTotal++;
    if (this.issues.length < ISSUE_LIST_CAP) this.issues.push(issue);
  }

  /** Refuses one file row with its reasons (one or more issues of that row). */
  rejectRow(fields: readonly string[], issues: readonly RowIssue[]) {
    this.rejectedRows++;
    for (const issue of issues) {
      this.addIssue(issue);
      if (this.keepsRejected) this.insertRejected.run(this.batchId, issue.row, issue.column, issue.reason, this.rawJson(fields));
      if (this.rejectedCsv !== null)
        fs.writeSync(this.rejectedCsv, csvLine([String(issue.row ?? ""), issue.column ?? "", issue.reason, ...fields], SPREADSHEET_CSV));
    }
  }

  rawJson(fields: readonly string[]): string {
    const raw: Record<string, string> = {};
    this.header.forEach((name, i) => {
      if (name !== "" && fields[i] !== undefined) raw[name] = fields[i];
    });
    return JSON.stringify(raw);
  }

  recordChange = (table: string, key: string, previous: Record<string, unknown>) => {
    // Blobs (compression streams) as base64 so the JSON stays small and restorable.
    const clean: Record<string, unknown> = {};
    for (const [column, value] of Object.entries(previous)) {
      clean[column] = Buffer.isBuffer(value) ? { $base64: value.toString("base64") } : value;
    }
    const json = JSON.stringify(clean);
    this.insertChange.run(this.batchId, table, key, json);
  };

  count(outcome: "inserted" | "updated" | "unchanged") {
    this[outcome]++;
  }

  /** A class from the database or from an earlier file of the same command; null when unknown. */
  classInfo(classId: string): ClassInfo | null {
    const pending = this.pendingClasses.get(classId);
    if (pending) return pending;
    let info = this.classCache.get(classId);
    if (info === undefined) {
      const row = this.classLookup.get(classId) as [string, string, number, number] | undefined;
      info = row ? { date: row[0], quarter: row[1], siteId: row[2], instructorId: row[3] } : null;
      this.classCache.set(classId, info);
    }
    return info;
  }

  close() {
    if (this.rejectedCsv !== null) fs.closeSync(this.rejectedCsv);
    this.rejectedCsv = null;
  }
}
