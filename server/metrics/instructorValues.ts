// Builds instructor_values — each instructor's tallies, release-grid cells and packed distributions per quarter
// and stratum (./packedValues.ts) — from the attempts. Triggers on attempts note every instructor-quarter whose attempts
// change in instructor_values_stale; every service that writes attempts calls refreshInstructorValues() before
// it commits, so readers normally find nothing noted. A pair still noted (a hand edit, a write from outside the
// services) is read from its attempts by the reader, so an answer is never built on an outdated row.
import type Database from "better-sqlite3";
import { attemptErrorNames } from "../../shared/scoring/scoreAttempt";
import { summaryMetrics } from "../db/schema";
import { refreshRunningValues } from "./runningValues";
import {
  pack,
  packCells,
  PACKED_COLUMNS,
  packTallies,
  pairsOf,
  stratumIndexOf,
  TALLY_FIELDS,
  type GridCount,
  type Pairs,
  type StratumIndex,
} from "./packedValues";

/** The attempt columns an instructor-quarter's row is built from, in this order. */
export const INSTRUCTOR_ROW_COLUMNS = [
  "quarter",
  "instructor_id",
  "profile",
  "feedback",
  "passed",
  "instructor_result",
  "error_mask",
  "compressions",
  "site_id",
  "coalesce(manikin_id, 0)",
  ...summaryMetrics,
] as const;

export type InstructorRow = [
  quarter: string,
  instructorId: number,
  profile: string,
  feedback: string,
  passed: number,
  instructorResult: string | null,
  errorMask: number,
  compressions: number,
  siteId: number,
  manikinId: number,
  ...values: number[],
];

const FIRST_VALUE = 10;

/** Tallies and values of each metric per stratum, gathered from the attempt rows of one instructor-quarter. */
export class StrataValues {
  private readonly values = new Map<StratumIndex, number[][]>();
  private readonly counts = new Map<StratumIndex, Float64Array>();
  /** Attempts and judged attempts by `${site}|${stratum}|${manikin}`. */
  private readonly gridCells = new Map<string, GridCount>();
  attempts = 0;

  add(row: InstructorRow): void {
    const stratum = stratumIndexOf(row[2], row[3]);
    let values = this.values.get(stratum);
    let tally = this.counts.get(stratum);
    if (!values || !tally) {
      this.values.set(stratum, (values = summaryMetrics.map(() => [])));
      this.counts.set(stratum, (tally = new Float64Array(TALLY_FIELDS)));
    }
    for (let m = 0; m < summaryMetrics.length; m++) values[m].push(row[FIRST_VALUE + m] as number);
    const [, , , , passed, judged, errorMask, compressions, siteId, manikinId] = row;
    // the fields of TALLY_FIELDS, counted as the tally triggers count them
    tally[0] += 1;
    tally[1] += passed;
    if (judged === "pass") tally[passed ? 2 : 3] += 1;
    if (judged === "fail") tally[passed ? 4 : 5] += 1;
    if (errorMask !== 0) tally[6] += 1;
    tally[7] += compressions;
    for (let bit = 0; bit < attemptErrorNames.length; bit++) tally[8 + bit] += (errorMask >> bit) & 1;
    const cellKey = `${siteId}|${stratum}|${manikinId}`;
    let cell = this.gridCells.get(cellKey);
    if (!cell) this.gridCells.set(cellKey, (cell = { siteId, stratum, manikinId, n: 0, judged: 0 }));
    cell.n += 1;
    if (judged === "pass" || judged === "fail") cell.judged += 1;
    this.attempts += 1;
  }

  /** Each stratum's pairs per metric index; only the metrics at `indices` are built (the others are left empty). */
  pairs(indices: readonly number[] = summaryMetrics.map((_, m) => m)): Map<StratumIndex, Pairs[]> {
    const empty = new Float64Array(0);
    return new Map([...this.values].map(([stratum, values]) => [stratum, values.map((list, m) => (indices.includes(m) ? pairsOf(list) : empty))]));
  }

  /** Each stratum's tally fields. */
  tallies(): ReadonlyMap<StratumIndex, Float64Array> {
    return this.counts;
  }

  /** The instructor's cells of the release grid. */
  cells(): Iterable<GridCount> {
    return this.gridCells.values();
  }
}

/** Rebuilds every noted instructor-quarter from its attempts and clears the notes; returns how many were rebuilt. */
export function refreshInstructorValues(sqlite: Database.Database): number {
  const noted = sqlite.prepare("SELECT quarter, instructor_id FROM instructor_values_stale").raw(true).all() as [string, number][];
  if (noted.length === 0) return 0;
  const rowsOf = sqlite.prepare(`SELECT ${INSTRUCTOR_ROW_COLUMNS.join(", ")} FROM attempts WHERE instructor_id = ? AND quarter = ?`).raw(true);
  const save = sqlite.prepare(
    `INSERT INTO instructor_values (quarter, instructor_id, attempts, tallies, cells, ${PACKED_COLUMNS.join(", ")})
     VALUES (?, ?, ?, ?, ?, ${PACKED_COLUMNS.map(() => "?").join(", ")})
     ON CONFLICT (quarter, instructor_id) DO UPDATE SET attempts = excluded.attempts, tallies = excluded.tallies, cells = excluded.cells,
       ${PACKED_COLUMNS.map((column) => `${column} = excluded.${column}`).join(", ")}`,
  );
  const remove = sqlite.prepare("DELETE FROM instructor_values WHERE quarter = ? AND instructor_id = ?");
  const rebuild = () => {
    for (const [quarter, instructorId] of noted) {
      const values = new StrataValues();
      for (const row of rowsOf.iterate(instructorId, quarter) as Iterable<InstructorRow>) values.add(row);
      if (values.attempts === 0) remove.run(quarter, instructorId);
      else {
        const pairs = values.pairs();
        save.run(
          quarter,
          instructorId,
          values.attempts,
          packTallies(values.tallies()),
          packCells(values.cells()),
          ...PACKED_COLUMNS.map((_, m) => pack(pairs, m)),
        );
      }
    }
    sqlite.prepare("DELETE FROM instructor_values_stale").run();
    // each instructor's running totals from their earliest rebuilt quarter on
    const changedFrom = new Map<number, string>();
    for (const [quarter, instructorId] of noted) {
      const earliest = changedFrom.get(instructorId);
      if (earliest === undefined || quarter < earliest) changedFrom.set(instructorId, quarter);
    }
    refreshRunningValues(sqlite, changedFrom);
  };
  if (sqlite.inTransaction) rebuild();
  else sqlite.transaction(rebuild).immediate();
  return noted.length;
}
