// Writes imported rows by their natural id: insert when new, leave alone when identical, update (keeping the
// previous values in batch_changes for undo) when corrected. Insert first and look at the existing row only
// on a conflict, so a first import of a big file costs one statement per row and no SELECT.
import type Database from "better-sqlite3";

export type WriteOutcome = "inserted" | "updated" | "unchanged" | "duplicate" | "refused";

export interface RowStoreOptions {
  table: string;
  key: string;
  /** Columns in the order `values` are given; the key first, batch_id last. */
  columns: readonly string[];
  /** True = write; false = dry run: only decide what would happen. */
  write: boolean;
  batchId: number;
  /** Rows per multi-row INSERT when writing (1 = one statement per row). Outcomes then arrive at flush. */
  batchRows?: number;
  /** Called with the previous row (column → value) before an update. */
  recordChange(table: string, key: string, previous: Record<string, unknown>): void;
  /** A reason the stored row may not be replaced by this one (read from `refusal` after "refused"). */
  refuse?(existing: readonly unknown[], values: readonly unknown[]): string | null;
}

/**
 * Rows already met in this file are remembered in a temporary table (bounded memory for any file size):
 * a second row with the same id is a duplicate. A first insert needs no entry, because the row then carries
 * this batch's id.
 */
export class SeenKeys {
  private readonly insert;
  constructor(sqlite: Database.Database, name: string) {
    sqlite.exec(`CREATE TEMP TABLE IF NOT EXISTS ${name} (k TEXT PRIMARY KEY) WITHOUT ROWID; DELETE FROM temp.${name};`);
    this.insert = sqlite.prepare(`INSERT OR IGNORE INTO temp.${name} (k) VALUES (?)`);
  }
  /** True the first time a key is seen. */
  add(key: string): boolean {
    return this.insert.run(key).changes === 1;
  }
}

type Done = (outcome: WriteOutcome, refusal: string) => void;

export class RowStore {
  private readonly insert;
  private readonly select;
  private readonly update;
  private readonly seen: SeenKeys;
  private readonly batchIndex: number;
  /** Why the last write was refused. */
  refusal = "";
  private readonly batchInsert: Database.Statement | null = null;
  private readonly batchRows: number;
  private readonly pending: { values: unknown[]; done: Done }[] = [];
  private readonly flat: unknown[] = [];

  constructor(
    sqlite: Database.Database,
    private readonly options: RowStoreOptions,
  ) {
    const { table, key, columns } = options;
    const marks = columns.map(() => "?").join(", ");
    this.insert = sqlite.prepare(`INSERT INTO ${table} (${columns.join(", ")}) VALUES (${marks}) ON CONFLICT(${key}) DO NOTHING`);
    this.select = sqlite.prepare(`SELECT ${columns.join(", ")} FROM ${table} WHERE ${key} = ?`).raw();
    const sets = columns
      .slice(1)
      .map((c) => `${c} = ?`)
      .join(", ");
    this.update = sqlite.prepare(`UPDATE ${table} SET ${sets} WHERE ${key} = ?`);
    this.seen = new SeenKeys(sqlite, `qb_seen_${table}`);
    this.batchIndex = columns.indexOf("batch_id");
    this.batchRows = options.write ? Math.max(1, options.batchRows ?? 1) : 1;
    if (this.batchRows > 1) {
      // RETURNING names the rows actually inserted; the others met an existing id.
      const rows = Array.from({ length: this.batchRows }, () => `(${marks})`).join(", ");
      this.batchInsert = sqlite.prepare(`INSERT INTO ${table} (${columns.join(", ")}) VALUES ${rows} ON CONFLICT(${key}) DO NOTHING RETURNING ${key}`).pluck();
    }
  }

  /**
   * Writes a row now or, when inserts are batched, at the latest at the next flush(); `done` receives the
   * outcome (and the reason, for "refused") in file order. Multi-row inserts save a third of the cost of a
   * big first import, where nearly every row is new.
   */
  queue(values: unknown[], done: Done) {
    if (this.batchInsert === null) {
      const outcome = this.write(values);
      done(outcome, outcome === "refused" ? this.refusal : "");
      return;
    }
    this.pending.push({ values, done });
    for (let i = 0; i < values.length; i++) this.flat.push(values[i]);
    if (this.pending.length === this.batchRows) this.flush();
  }

  flush() {
    const pending = this.pending;
    if (pending.length === 0) return;
    if (pending.length < this.batchRows || this.batchInsert === null) {
      for (const { values, done } of pending) {
        const outcome = this.write(values);
        done(outcome, outcome === "refused" ? this.refusal : "");
      }
    } else {
      const inserted = new Set(this.batchInsert.all(this.flat) as string[]);
      for (const { values, done } of pending) {
        const key = values[0] as string;
        if (inserted.delete(key)) {
          done("inserted", "");
          continue;
        }
        const existing = this.select.get(key) as unknown[];
        const outcome = existing[this.batchIndex] === this.options.batchId || !this.seen.add(key) ? "duplicate" : this.compareAndUpdate(key, existing, values);
        done(outcome, outcome === "refused" ? this.refusal : "");
      }
    }
    pending.length = 0;
    this.flat.length = 0;
  }

  write(values: unknown[]): WriteOutcome {
    const key = values[0] as string;
    const { write, batchId } = this.options;
    if (write) {
      if (this.insert.run(values).changes === 1) return "inserted";
      const existing = this.select.get(key) as unknown[];
      if (existing[this.batchIndex] === batchId || !this.seen.add(key)) return "duplicate";
      return this.compareAndUpdate(key, existing, values);
    }
    if (!this.seen.add(key)) return "duplicate";
    const existing = this.select.get(key) as unknown[] | undefined;
    if (existing === undefined) return "inserted";
    return this.compareAndUpdate(key, existing, values);
  }

  private compareAndUpdate(key: string, existing: unknown[], values: unknown[]): WriteOutcome {
    const refusal = this.options.refuse?.(existing, values);
    if (refusal) {
      this.refusal = refusal;
      return "refused";
    }
    if (sameValues(existing, values, this.batchIndex)) return "unchanged";
    if (this.options.write) {
      const previous: Record<string, unknown> = {};
      this.options.columns.forEach((column, i) => (previous[column] = existing[i]));
      this.options.recordChange(this.options.table, key, previous);
      this.update.run(...values.slice(1), key);
    }
    return "updated";
  }
}

/** Equal column by column, ignoring the batch id. Blobs compare by bytes. */
export function sameValues(a: readonly unknown[], b: readonly unknown[], skip = -1): boolean {
  for (let i = 0; i < a.length; i++) {
    if (i === skip) continue;
    const x = a[i];
    const y = b[i];
    if (x === y) continue;
    if (Buffer.isBuffer(x) && Buffer.isBuffer(y) && x.equals(y)) continue;
    return false;
  }
  return true;
}
