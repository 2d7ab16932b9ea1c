// Collects a compressions file row by row: checks each attempt's shared columns once (on its first row) and
// that every later row repeats them, checks each compression's values, and hands the values to the grouper.
import type { AttemptIdentity, CompressionValues, RowIssue, RowReader } from "../../shared/import/rows";
import type { GroupedAttempt, StreamGrouper } from "./grouper";

export const IDENTITY_COLUMNS = ["attempt_id", "class_id", "learner", "manikin", "profile", "feedback", "started_at", "instructor_result"] as const;

export interface StreamAttempt {
  idx: number;
  id: string;
  firstRow: number;
  /** The shared columns' text on the attempt's first row. */
  raw: string[];
  /** The same fields exactly as in the file (untrimmed, untranslated): the cheap comparison for later rows. */
  verbatim: (string | undefined)[];
  identity: AttemptIdentity | null;
  rows: number;
  /** Rows of this attempt refused with a reason of their own. */
  issueRows: number;
  bad: boolean;
}

export interface CollectorHooks {
  /** A reason to refuse a new, well-formed attempt as a whole (e.g. unknown class), or null. */
  accept(attempt: StreamAttempt): { column: string; reason: string } | null;
  /** A file row refused with its reasons. */
  reject(fields: readonly string[], issues: readonly RowIssue[]): void;
}

export class StreamCollector {
  readonly attempts: StreamAttempt[] = [];
  private readonly byId = new Map<string, StreamAttempt>();
  private last: StreamAttempt | null = null;
  private readonly values: CompressionValues = { tMs: 0, depthTenths: 0, releaseTenths: 0 };
  private readonly positions: number[];

  constructor(
    private readonly reader: RowReader,
    readonly grouper: StreamGrouper,
    private readonly hooks: CollectorHooks,
  ) {
    this.positions = IDENTITY_COLUMNS.map((c) => reader.position(c));
  }

  row(fields: readonly string[], row: number) {
    const reader = this.reader;
    reader.issues.length = 0;
    reader.at(fields, row);
    const positions = this.positions;
    const last = this.last;
    // Fast path: the same attempt as the previous row, its fields byte-for-byte the same.
    let attempt: StreamAttempt | undefined = last !== null && fields[positions[0]] === last.verbatim[0] ? last : undefined;
    if (attempt === undefined) attempt = this.byId.get(reader.text("attempt_id"));
    if (attempt === undefined) {
      const id = reader.text("attempt_id");
      attempt = {
        idx: this.attempts.length,
        id,
        firstRow: row,
        raw: IDENTITY_COLUMNS.map((c) => reader.text(c)),
        verbatim: positions.map((p) => (p >= 0 ? fields[p] : undefined)),
        identity: reader.attemptIdentity(),
        rows: 0,
        issueRows: 0,
        bad: false,
      };
      this.attempts.push(attempt);
      this.byId.set(id, attempt);
      if (attempt.identity === null) attempt.bad = true;
      else {
        const refusal = this.hooks.accept(attempt);
        if (refusal) {
          reader.fail(refusal.column, refusal.reason);
          attempt.bad = true;
        }
      }
    } else {
      const raw = attempt.raw;
      const verbatim = attempt.verbatim;
      for (let k = 1; k < IDENTITY_COLUMNS.length; k++) {
        const p = positions[k];
        if (p < 0 || fields[p] === verbatim[k]) continue;
        const column = IDENTITY_COLUMNS[k];
        const value = reader.text(column);
        if (value !== raw[k]) {
          reader.fail(
            column,
            `${JSON.stringify(value)} differs from ${JSON.stringify(raw[k])} on row ${attempt.firstRow}, the attempt's first row; every row of attempt ${attempt.id} must give the same ${column}`,
          );
          attempt.bad = true;
          break;
        }
      }
    }
    this.last = attempt;
    attempt.rows++;
    const values = this.values;
    if (reader.compressionValues(values) && !attempt.bad) {
      this.grouper.add(attempt.idx, row, values.tMs, values.depthTenths, values.releaseTenths);
    } else {
      attempt.bad = true;
    }
    if (reader.issues.length > 0) {
      attempt.issueRows++;
      this.hooks.reject(fields, reader.issues);
    }
  }

  /** Each well-formed attempt with its compressions in time order; two compressions at one time refuse it. */
  *complete(): Generator<{ attempt: StreamAttempt; stream: GroupedAttempt }> {
    for (const stream of this.grouper.attempts()) {
      const attempt = this.attempts[stream.idx];
      if (attempt.bad) continue;
      const t = stream.tMs;
      let duplicateAt = -1;
      for (let i = 1; i < stream.n; i++) {
        if (t[i] === t[i - 1]) {
          duplicateAt = i;
          break;
        }
      }
      if (duplicateAt > 0) {
        attempt.bad = true;
        attempt.issueRows++;
        const first = stream.rows[duplicateAt - 1];
        const second = stream.rows[duplicateAt];
        this.hooks.reject(
          [],
          [
            {
              row: second,
              column: "t_ms",
              reason: `t_ms ${t[duplicateAt]} appears on rows ${first} and ${second} of attempt ${attempt.id}; each compression needs its own time`,
            },
          ],
        );
        continue;
      }
      yield { attempt, stream };
    }
  }

  /** Rows refused only because another row of their attempt was. */
  get rowsRefusedWithAttempt(): number {
    let count = 0;
    for (const attempt of this.attempts) if (attempt.bad) count += attempt.rows - attempt.issueRows;
    return count;
  }

  get badAttempts(): number {
    let count = 0;
    for (const attempt of this.attempts) if (attempt.bad) count++;
    return count;
  }
}
