// Writes imported rows by their natural id: insert when new, leave alone when identical, update (keeping the
// previous values in batch_changes for undo) when corrected. Insert first and look at the existing row only
// on a conflict, so a first import of a big file costs one statement per row and no SELECT. With `stage`, new
// rows wait in a temporary table and reach the real one in a single statement once the file is accepted.
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
  /**
   * Hold new rows in a temporary table (without constraints, indexes or triggers) until writeStaged(), and
   * move them with one INSERT … SELECT. Row by row, a table with triggers makes SQLite keep a statement journal
   * of every page each multi-row INSERT touches; one statement journals a page once, and a refused file never
   * touches the table. Only for tables nothing else in the import refers to before writeStaged().
   */
  stage?: boolean;
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
  private readonly staging: Staging | null = null;

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
    if (options.stage && options.write) {
      this.staging = new Staging(sqlite, table, key, columns, this.batchRows);
    } else if (this.batchRows > 1) {
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
    if (this.batchInsert === null && this.staging === null) {
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
    if (this.staging !== null) {
      this.flushStaged(this.staging);
    } else if (pending.length < this.batchRows || this.batchInsert === null) {
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
        const outcome = this.writeOverStored(key, values);
        done(outcome, outcome === "refused" ? this.refusal : "");
      }
    }
    pending.length = 0;
    this.flat.length = 0;
  }

  /** The temporary table the new rows wait in (the table's columns), or null when rows are not staged. */
  get stagedTable(): string | null {
    return this.staging?.name ?? null;
  }

  /** Writes the staged new rows into the table, in file order, with one statement; once the file is accepted. */
  writeStaged() {
    this.flush();
    this.staging?.moveToTable();
  }

  /** Empties the staging table (after writeStaged, once nothing reads it any more). */
  clearStaged() {
    this.staging?.clear();
  }

  /** New rows go to the staging table; rows already stored are compared and updated as usual. */
  private flushStaged(staging: Staging) {
    const pending = this.pending;
    const stored = staging.storedKeys(pending.map(({ values }) => values[0]));
    if (stored.size === 0 && pending.length === this.batchRows) {
      const staged = staging.stageAll(this.flat);
      for (const { values, done } of pending) done(staged.delete(values[0] as string) ? "inserted" : "duplicate", "");
      return;
    }
    for (const { values, done } of pending) {
      const key = values[0] as string;
      if (!stored.has(key)) {
        done(staging.stageOne(values) ? "inserted" : "duplicate", "");
        continue;
      }
      const outcome = this.writeOverStored(key, values);
      done(outcome, outcome === "refused" ? this.refusal : "");
    }
  }

  write(values: unknown[]): WriteOutcome {
    const key = values[0] as string;
    if (this.options.write) {
      if (this.insert.run(values).changes === 1) return "inserted";
      return this.writeOverStored(key, values);
    }
    if (!this.seen.add(key)) return "duplicate";
    const existing = this.select.get(key) as unknown[] | undefined;
    if (existing === undefined) return "inserted";
    return this.compareAndUpdate(key, existing, values);
  }

  /**
   * A row whose key the table holds: a duplicate when this file already wrote or met it (the batch id, or the
   * keys seen), else compared with the stored row and updated when it differs.
   */
  private writeOverStored(key: string, values: unknown[]): WriteOutcome {
    const existing = this.select.get(key) as unknown[];
    if (existing[this.batchIndex] === this.options.batchId || !this.seen.add(key)) return "duplicate";
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

/** The temporary table new rows wait in; a second row with the same key in the file is refused by its key. */
class Staging {
  readonly name: string;
  private readonly storedAmong;
  private readonly storedOne;
  private readonly insertOne;
  private readonly insertMany;
  private readonly move;
  private readonly empty;

  constructor(
    sqlite: Database.Database,
    table: string,
    key: string,
    columns: readonly string[],
    private readonly batchRows: number,
  ) {
    const name = (this.name = `temp.qb_staged_${table}`);
    const list = columns.join(", ");
    // the table's own column types, so staged values are stored (and compare) exactly as the table stores them
    const types = new Map((sqlite.prepare(`PRAGMA table_info(${table})`).all() as { name: string; type: string }[]).map((c) => [c.name, c.type]));
    const definitions = columns.map((c) => `${c} ${types.get(c) ?? ""}${c === key ? " PRIMARY KEY" : ""}`);
    sqlite.exec(`CREATE TEMP TABLE IF NOT EXISTS qb_staged_${table} (${definitions.join(", ")}); DELETE FROM ${name};`);
    const marks = `(${columns.map(() => "?").join(", ")})`;
    const keyMarks = Array.from({ length: batchRows }, () => "?").join(", ");
    this.storedAmong = sqlite.prepare(`SELECT ${key} FROM ${table} WHERE ${key} IN (${keyMarks})`).pluck();
    this.storedOne = sqlite.prepare(`SELECT ${key} FROM ${table} WHERE ${key} = ?`).pluck();
    this.insertOne = sqlite.prepare(`INSERT INTO ${name} (${list}) VALUES ${marks} ON CONFLICT(${key}) DO NOTHING`);
    const rows = Array.from({ length: batchRows }, () => marks).join(", ");
    this.insertMany = sqlite.prepare(`INSERT INTO ${name} (${list}) VALUES ${rows} ON CONFLICT(${key}) DO NOTHING RETURNING ${key}`).pluck();
    this.move = sqlite.prepare(`INSERT INTO ${table} (${list}) SELECT ${list} FROM ${name} ORDER BY rowid`);
    this.empty = sqlite.prepare(`DELETE FROM ${name}`);
  }

  /** Which of these keys the table already holds. */
  storedKeys(keys: unknown[]): Set<unknown> {
    if (keys.length === 0) return new Set();
    return new Set(keys.length === this.batchRows ? this.storedAmong.all(keys) : keys.filter((k) => this.storedOne.get(k) !== undefined));
  }

  /** Stages a full batch of rows (flattened); returns the keys staged (a key met before in the file is not). */
  stageAll(flat: unknown[]): Set<string> {
    return new Set(this.insertMany.all(flat) as string[]);
  }

  /** Stages one row; false when its key is already staged. */
  stageOne(values: unknown[]): boolean {
    return this.insertOne.run(values).changes === 1;
  }

  moveToTable() {
    this.move.run();
  }

  clear() {
    this.empty.run();
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
