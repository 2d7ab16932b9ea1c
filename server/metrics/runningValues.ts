// Keeps instructor_running_values — each instructor's distributions summed over every quarter up to each of their
// quarters — in step with instructor_values, and reads an instructor's distributions over a range of quarters
// from them: the running total at the range's end less the one before its start. A range of any length then
// costs two rows per instructor instead of one per quarter, and no merging.
import type Database from "better-sqlite3";
import { forEachSection, mergePairs, PACKED_COLUMNS, packSections, sectionsOf, subtractPairs, type Pairs, type StratumIndex } from "./packedValues";

/**
 * Rebuilds the running totals of each instructor from the given quarter on (instructor → earliest changed
 * quarter), or of every instructor: call after their instructor_values rows changed, in the same transaction.
 */
export function refreshRunningValues(sqlite: Database.Database, changedFrom: ReadonlyMap<number, string> | "all"): void {
  const from =
    changedFrom === "all"
      ? new Map(
          (sqlite.prepare("SELECT instructor_id, min(quarter) FROM instructor_values GROUP BY instructor_id").raw(true).all() as [number, string][]).map(
            ([instructorId, quarter]) => [instructorId, quarter],
          ),
        )
      : changedFrom;
  if (changedFrom === "all") sqlite.prepare("DELETE FROM instructor_running_values").run();
  const before = sqlite
    .prepare(`SELECT ${PACKED_COLUMNS.join(", ")} FROM instructor_running_values WHERE instructor_id = ? AND quarter < ? ORDER BY quarter DESC LIMIT 1`)
    .raw(true);
  const clear = sqlite.prepare("DELETE FROM instructor_running_values WHERE instructor_id = ? AND quarter >= ?");
  const quarters = sqlite
    .prepare(`SELECT quarter, ${PACKED_COLUMNS.join(", ")} FROM instructor_values WHERE instructor_id = ? AND quarter >= ? ORDER BY quarter`)
    .raw(true);
  const save = sqlite.prepare(
    `INSERT INTO instructor_running_values (instructor_id, quarter, ${PACKED_COLUMNS.join(", ")}) VALUES (?, ?, ${PACKED_COLUMNS.map(() => "?").join(", ")})`,
  );
  for (const [instructorId, quarter] of from) {
    let running = ((before.get(instructorId, quarter) as Buffer[] | undefined) ?? PACKED_COLUMNS.map(() => Buffer.alloc(0))).map(sectionsOf);
    clear.run(instructorId, quarter);
    for (const [q, ...packed] of quarters.all(instructorId, quarter) as [string, ...Buffer[]][]) {
      running = running.map((sections, m) => addSections(sections, packed[m]));
      save.run(instructorId, q, ...running.map((sections, m) => packSections(sections, m)));
    }
  }
}

/** A running total's sections plus one quarter's packed row (a fresh map; the running total is not changed). */
function addSections(running: ReadonlyMap<StratumIndex, Pairs>, packed: Uint8Array): Map<StratumIndex, Pairs> {
  const sum = new Map(running);
  forEachSection(packed, (stratum, _metric, pairs) => {
    const soFar = sum.get(stratum);
    sum.set(stratum, soFar ? mergePairs([soFar, pairs]) : pairs);
  });
  return sum;
}

/** Builds every running total when their table is out of step with instructor_values (after the migration that adds it). */
export function ensureRunningValues(sqlite: Database.Database): void {
  const count = (table: string) => sqlite.prepare(`SELECT count(*) FROM ${table}`).pluck().get() as number;
  if (count("instructor_running_values") !== count("instructor_values")) {
    sqlite.transaction(() => refreshRunningValues(sqlite, "all")).immediate();
  }
}

/**
 * Calls `visit` with each instructor's pairs per stratum and metric over the quarters from `from` to `to`, for
 * the packed columns named (indices into PACKED_COLUMNS) and the strata wanted; strata without attempts in the
 * range are left out.
 */
export function forEachRunningSection(
  sqlite: Database.Database,
  range: { from: string; to: string; instructorId: number | null },
  metrics: readonly number[],
  wanted: (stratum: StratumIndex) => boolean,
  visit: (instructorId: number, stratum: StratumIndex, metric: number, pairs: Pairs) => void,
): void {
  const columns = metrics.map((m) => `r.${PACKED_COLUMNS[m]}`).join(", ");
  const onlyOne = range.instructorId === null ? "" : "AND instructor_id = ?";
  const latest = (comparison: string) =>
    `SELECT r.instructor_id, r.quarter, ${columns} FROM instructor_running_values r
     JOIN (SELECT instructor_id, max(quarter) AS quarter FROM instructor_running_values WHERE quarter ${comparison} ? ${onlyOne} GROUP BY instructor_id) latest
       USING (instructor_id, quarter)`;
  const params = (quarter: string) => (range.instructorId === null ? [quarter] : [quarter, range.instructorId]);
  const before = new Map<number, Buffer[]>();
  for (const [instructorId, , ...packed] of sqlite
    .prepare(latest("<"))
    .raw(true)
    .iterate(...params(range.from)) as Iterable<[number, string, ...Buffer[]]>) {
    before.set(instructorId, packed);
  }
  for (const [instructorId, quarter, ...packed] of sqlite
    .prepare(latest("<="))
    .raw(true)
    .iterate(...params(range.to)) as Iterable<[number, string, ...Buffer[]]>) {
    if (quarter < range.from) continue; // nothing in the range
    const earlier = before.get(instructorId);
    packed.forEach((blob, k) => {
      const m = metrics[k];
      const subtrahend = earlier ? sectionsOf(earlier[k]) : null;
      forEachSection(blob, (stratum, _metric, pairs) => {
        if (!wanted(stratum)) return;
        const part = subtrahend?.get(stratum);
        const inRange = part ? subtractPairs(pairs, part) : pairs;
        if (inRange.length > 0) visit(instructorId, stratum, m, inRange);
      });
    });
  }
}
