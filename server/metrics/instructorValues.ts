// Builds instructor_values — each instructor's packed distributions per quarter (./packedValues.ts) — from the
// attempts. Triggers on attempts note every instructor-quarter whose attempts change in instructor_values_stale;
// every service that writes attempts calls refreshInstructorValues() before it commits, so readers normally
// find nothing noted. A pair still noted (a hand edit, a write from outside the services) is read from its
// attempts by the reader, so an answer is never built on an outdated distribution.
import type Database from "better-sqlite3";
import { summaryMetrics } from "../db/schema";
import { pack, pairsOf, stratumIndexOf, type Pairs, type StratumIndex } from "./packedValues";

/** The attempt columns an instructor-quarter's distributions are built from, in this order. */
export const DISTRIBUTION_COLUMNS = ["quarter", "instructor_id", "profile", "feedback", ...summaryMetrics] as const;

export type DistributionRow = [quarter: string, instructorId: number, profile: string, feedback: string, ...values: number[]];

/** Values of each metric per stratum, gathered from attempt rows of one instructor-quarter. */
export class StrataValues {
  private readonly strata = new Map<StratumIndex, number[][]>();
  attempts = 0;

  add(row: DistributionRow): void {
    const stratum = stratumIndexOf(row[2], row[3]);
    let values = this.strata.get(stratum);
    if (!values) this.strata.set(stratum, (values = summaryMetrics.map(() => [])));
    for (let m = 0; m < summaryMetrics.length; m++) values[m].push(row[4 + m] as number);
    this.attempts += 1;
  }

  /** Each stratum's pairs per metric index. */
  pairs(): Map<StratumIndex, Pairs[]> {
    return new Map([...this.strata].map(([stratum, values]) => [stratum, values.map(pairsOf)]));
  }
}

/** Rebuilds every noted instructor-quarter from its attempts and clears the notes; returns how many were rebuilt. */
export function refreshInstructorValues(sqlite: Database.Database): number {
  const noted = sqlite.prepare("SELECT quarter, instructor_id FROM instructor_values_stale").raw(true).all() as [string, number][];
  if (noted.length === 0) return 0;
  const rowsOf = sqlite.prepare(`SELECT ${DISTRIBUTION_COLUMNS.join(", ")} FROM attempts WHERE instructor_id = ? AND quarter = ?`).raw(true);
  const save = sqlite.prepare(
    `INSERT INTO instructor_values (quarter, instructor_id, attempts, packed) VALUES (?, ?, ?, ?)
     ON CONFLICT (quarter, instructor_id) DO UPDATE SET attempts = excluded.attempts, packed = excluded.packed`,
  );
  const remove = sqlite.prepare("DELETE FROM instructor_values WHERE quarter = ? AND instructor_id = ?");
  const rebuild = () => {
    for (const [quarter, instructorId] of noted) {
      const values = new StrataValues();
      for (const row of rowsOf.iterate(instructorId, quarter) as Iterable<DistributionRow>) values.add(row);
      if (values.attempts === 0) remove.run(quarter, instructorId);
      else save.run(quarter, instructorId, values.attempts, pack(values.pairs()));
    }
    sqlite.prepare("DELETE FROM instructor_values_stale").run();
  };
  if (sqlite.inTransaction) rebuild();
  else sqlite.transaction(rebuild).immediate();
  return noted.length;
}
