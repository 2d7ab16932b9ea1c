// Import history: every batch with who, when, which file and what it changed. Instructors see their own.
import type Database from "better-sqlite3";
import { csvLine, SPREADSHEET_CSV } from "../../shared/csv";
import type { ImportBatch } from "../../shared/import/api";
import type { ImportKind } from "../../shared/domain";
import type { Db } from "../db/client";
import { notFound } from "../errors";

interface BatchRow {
  id: number;
  kind: ImportKind;
  file_name: string;
  sha256: string;
  source: "cli" | "web" | "seed";
  status: "applied" | "undone";
  user_id: number | null;
  user_email: string | null;
  rows_read: number;
  inserted: number;
  updated: number;
  unchanged: number;
  rejected: number;
  new_codes: string | null;
  warnings: string | null;
  created_at: string;
  undone_at: string | null;
}

const SELECT = `SELECT b.id, b.kind, b.file_name, b.sha256, b.source, b.status, b.user_id, u.email AS user_email, b.rows_read,
  b.inserted, b.updated, b.unchanged, b.rejected, b.new_codes, b.warnings, b.created_at, b.undone_at
  FROM import_batches b LEFT JOIN users u ON u.id = b.user_id`;

function toBatch(row: BatchRow): ImportBatch {
  return {
    id: row.id,
    kind: row.kind,
    fileName: row.file_name,
    sha256: row.sha256,
    source: row.source,
    status: row.status,
    userId: row.user_id,
    userEmail: row.user_email,
    rowsRead: row.rows_read,
    inserted: row.inserted,
    updated: row.updated,
    unchanged: row.unchanged,
    rejected: row.rejected,
    newCodes: row.new_codes ? JSON.parse(row.new_codes) : null,
    warnings: row.warnings ? JSON.parse(row.warnings) : null,
    createdAt: row.created_at,
    undoneAt: row.undone_at,
  };
}

export interface BatchQuery {
  limit: number;
  offset: number;
  kind?: ImportKind;
  /** Only this user's batches (instructors); null = everyone's. */
  userId: number | null;
}

export function listBatches(db: Db, query: BatchQuery): { batches: ImportBatch[]; total: number } {
  const sqlite: Database.Database = db.$client;
  const where: string[] = [];
  const params: (string | number)[] = [];
  if (query.userId !== null) {
    where.push("b.user_id = ?");
    params.push(query.userId);
  }
  if (query.kind) {
    where.push("b.kind = ?");
    params.push(query.kind);
  }
  const clause = where.length ? ` WHERE ${where.join(" AND ")}` : "";
  const total = sqlite
    .prepare(`SELECT count(*) FROM import_batches b${clause}`)
    .pluck()
    .get(...params) as number;
  const rows = sqlite.prepare(`${SELECT}${clause} ORDER BY b.id DESC LIMIT ? OFFSET ?`).all(...params, query.limit, query.offset) as BatchRow[];
  return { batches: rows.map(toBatch), total };
}

export function getBatch(db: Db, id: number, userId: number | null): ImportBatch {
  const row = db.$client.prepare(`${SELECT} WHERE b.id = ?`).get(id) as BatchRow | undefined;
  if (!row || (userId !== null && row.user_id !== userId)) throw notFound(`Import batch ${id}`);
  return toBatch(row);
}

export interface RejectedRow {
  rowNumber: number | null;
  column: string | null;
  reason: string;
  raw: Record<string, string> | null;
}

export function rejectedRows(db: Db, batchId: number, limit = 1000): { rows: RejectedRow[]; total: number } {
  const sqlite = db.$client;
  const total = sqlite.prepare("SELECT count(*) FROM rejected_rows WHERE batch_id = ?").pluck().get(batchId) as number;
  const rows = sqlite
    .prepare("SELECT row_number, column, reason, raw FROM rejected_rows WHERE batch_id = ? ORDER BY row_number, id LIMIT ?")
    .all(batchId, limit) as { row_number: number | null; column: string | null; reason: string; raw: string | null }[];
  return {
    total,
    rows: rows.map((r) => ({ rowNumber: r.row_number, column: r.column, reason: r.reason, raw: r.raw ? JSON.parse(r.raw) : null })),
  };
}

/** Every rejected row of a batch as CSV lines: row, column, reason, then the file's own columns. */
export function* rejectedRowsCsv(db: Db, batchId: number): Generator<string> {
  const sqlite = db.$client;
  const rows = sqlite
    .prepare("SELECT row_number, column, reason, raw FROM rejected_rows WHERE batch_id = ? ORDER BY row_number, id")
    .iterate(batchId) as IterableIterator<{
    row_number: number | null;
    column: string | null;
    reason: string;
    raw: string | null;
  }>;
  let header: string[] | null = null;
  for (const row of rows) {
    const raw = row.raw ? (JSON.parse(row.raw) as Record<string, string>) : {};
    if (header === null) {
      header = Object.keys(raw);
      yield csvLine(["row", "column", "reason", ...header], SPREADSHEET_CSV);
    }
    yield csvLine([String(row.row_number ?? ""), row.column ?? "", row.reason, ...header.map((h) => raw[h] ?? "")], SPREADSHEET_CSV);
  }
  if (header === null) yield csvLine(["row", "column", "reason"], SPREADSHEET_CSV);
}
