// Groups compression rows by attempt in bounded memory. Rows arrive in any order (an attempt's rows may be
// spread through the whole file), so they are collected column-wise in typed arrays (16 bytes a row); when
// the buffer is full it is sorted by attempt with a counting sort and written to a temporary table as one
// packed BLOB per attempt and buffer. At the end each attempt's pieces are read back, put in time order and
// handed out as typed arrays, ready for the analysis core. See docs/decisions/002-stream-storage.md.
import type Database from "better-sqlite3";

/** One attempt's compressions in time order. The arrays are reused: valid until the next attempt. */
export interface GroupedAttempt {
  idx: number;
  n: number;
  /** File row of each compression (row 1 = first data row). */
  rows: Int32Array;
  tMs: Int32Array;
  depthTenths: Uint16Array;
  releaseTenths: Uint16Array;
}

const RECORD_BYTES = 12; // row i32, t i32, depth u16, release u16
export const DEFAULT_BUFFER_ROWS = 1 << 20;

let spillTables = 0;

export class StreamGrouper {
  private len = 0;
  private attemptCount = 0;
  private readonly att: Int32Array;
  private readonly row: Int32Array;
  private readonly t: Int32Array;
  private readonly depth: Uint16Array;
  private readonly release: Uint16Array;
  private spillTable: string | null = null;
  private spillInsert: Database.Statement | null = null;
  private spillSelect: Database.Statement | null = null;
  /** How many times the buffer was written out (0 = the whole file fitted in memory). */
  spills = 0;

  constructor(
    private readonly sqlite: Database.Database,
    private readonly capacity = DEFAULT_BUFFER_ROWS,
  ) {
    this.att = new Int32Array(capacity);
    this.row = new Int32Array(capacity);
    this.t = new Int32Array(capacity);
    this.depth = new Uint16Array(capacity);
    this.release = new Uint16Array(capacity);
  }

  add(attempt: number, row: number, tMs: number, depthTenths: number, releaseTenths: number) {
    if (this.len === this.capacity) this.spill();
    const i = this.len++;
    this.att[i] = attempt;
    this.row[i] = row;
    this.t[i] = tMs;
    this.depth[i] = depthTenths;
    this.release[i] = releaseTenths;
    if (attempt >= this.attemptCount) this.attemptCount = attempt + 1;
  }

  /** Positions of the buffered rows sorted by attempt (stable), and where each attempt starts. */
  private groupBuffer(): { order: Int32Array; start: Int32Array } {
    const start = new Int32Array(this.attemptCount + 1);
    for (let i = 0; i < this.len; i++) start[this.att[i] + 1]++;
    for (let a = 0; a < this.attemptCount; a++) start[a + 1] += start[a];
    const next = start.slice(0, this.attemptCount);
    const order = new Int32Array(this.len);
    for (let i = 0; i < this.len; i++) order[next[this.att[i]]++] = i;
    return { order, start };
  }

  private spill() {
    if (this.spillTable === null) {
      this.spillTable = `qb_spill_${++spillTables}`;
      this.sqlite.exec(
        `CREATE TEMP TABLE ${this.spillTable} (attempt INTEGER NOT NULL, data BLOB NOT NULL);` +
          `CREATE INDEX temp.${this.spillTable}_attempt ON ${this.spillTable} (attempt);`,
      );
      this.spillInsert = this.sqlite.prepare(`INSERT INTO temp.${this.spillTable} (attempt, data) VALUES (?, ?)`);
      this.spillSelect = this.sqlite.prepare(`SELECT data FROM temp.${this.spillTable} WHERE attempt = ? ORDER BY rowid`).pluck();
    }
    const { order, start } = this.groupBuffer();
    const packed = Buffer.allocUnsafe(this.len * RECORD_BYTES);
    const view = new DataView(packed.buffer, packed.byteOffset, packed.byteLength);
    for (let k = 0; k < this.len; k++) {
      const i = order[k];
      const offset = k * RECORD_BYTES;
      view.setInt32(offset, this.row[i], true);
      view.setInt32(offset + 4, this.t[i], true);
      view.setUint16(offset + 8, this.depth[i], true);
      view.setUint16(offset + 10, this.release[i], true);
    }
    for (let a = 0; a < this.attemptCount; a++) {
      if (start[a + 1] > start[a]) this.spillInsert!.run(a, packed.subarray(start[a] * RECORD_BYTES, start[a + 1] * RECORD_BYTES));
    }
    this.len = 0;
    this.spills++;
  }

  /** Every attempt with rows, in order of attempt index, each in time order (ties by file row). */
  *attempts(): Generator<GroupedAttempt> {
    const { order, start } = this.groupBuffer();
    let capacity = 1024;
    let work = makeWork(capacity);
    for (let a = 0; a < this.attemptCount; a++) {
      const pieces: Buffer[] = this.spillSelect ? (this.spillSelect.all(a) as Buffer[]) : [];
      let n = start[a + 1] - start[a];
      for (const piece of pieces) n += piece.length / RECORD_BYTES;
      if (n === 0) continue;
      if (n > capacity) {
        while (capacity < n) capacity *= 2;
        work = makeWork(capacity);
      }
      let k = 0;
      for (const piece of pieces) {
        const view = new DataView(piece.buffer, piece.byteOffset, piece.byteLength);
        for (let offset = 0; offset < piece.length; offset += RECORD_BYTES, k++) {
          work.rows[k] = view.getInt32(offset, true);
          work.tMs[k] = view.getInt32(offset + 4, true);
          work.depthTenths[k] = view.getUint16(offset + 8, true);
          work.releaseTenths[k] = view.getUint16(offset + 10, true);
        }
      }
      for (let j = start[a]; j < start[a + 1]; j++, k++) {
        const i = order[j];
        work.rows[k] = this.row[i];
        work.tMs[k] = this.t[i];
        work.depthTenths[k] = this.depth[i];
        work.releaseTenths[k] = this.release[i];
      }
      sortByTime(work, n);
      yield {
        idx: a,
        n,
        rows: work.rows.subarray(0, n),
        tMs: work.tMs.subarray(0, n),
        depthTenths: work.depthTenths.subarray(0, n),
        releaseTenths: work.releaseTenths.subarray(0, n),
      };
    }
  }

  dispose() {
    if (this.spillTable !== null) this.sqlite.exec(`DROP TABLE IF EXISTS temp.${this.spillTable}`);
    this.spillTable = null;
  }
}

interface Work {
  rows: Int32Array;
  tMs: Int32Array;
  depthTenths: Uint16Array;
  releaseTenths: Uint16Array;
}

function makeWork(n: number): Work {
  return { rows: new Int32Array(n), tMs: new Int32Array(n), depthTenths: new Uint16Array(n), releaseTenths: new Uint16Array(n) };
}

/** Sorts the first n entries by time, then file row; a no-op pass for the usual, already sorted stream. */
function sortByTime(w: Work, n: number) {
  let sorted = true;
  for (let i = 1; i < n; i++) {
    if (w.tMs[i] < w.tMs[i - 1] || (w.tMs[i] === w.tMs[i - 1] && w.rows[i] < w.rows[i - 1])) {
      sorted = false;
      break;
    }
  }
  if (sorted) return;
  const order = Array.from({ length: n }, (_, i) => i).sort((x, y) => w.tMs[x] - w.tMs[y] || w.rows[x] - w.rows[y]);
  const copy = { rows: w.rows.slice(0, n), tMs: w.tMs.slice(0, n), depthTenths: w.depthTenths.slice(0, n), releaseTenths: w.releaseTenths.slice(0, n) };
  for (let k = 0; k < n; k++) {
    const i = order[k];
    w.rows[k] = copy.rows[i];
    w.tMs[k] = copy.tMs[i];
    w.depthTenths[k] = copy.depthTenths[i];
    w.releaseTenths[k] = copy.releaseTenths[i];
  }
}
