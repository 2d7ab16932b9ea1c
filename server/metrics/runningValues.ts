// Keeps instructor_running_values — each instructor's tallies and distributions summed over every quarter up to
// each of their quarters — in step with instructor_values, and reads an instructor's figures over a range of
// quarters from them: the running total at the range's end less the one before its start. A range of any length
// then costs two rows per instructor instead of one per quarter, and no merging.
import type Database from "better-sqlite3";
import {
  forEachSection,
  forEachTally,
  mergePairs,
  PACKED_COLUMNS,
  packSections,
  packTallies,
  sectionsOf,
  subtractPairs,
  type Pairs,
  type StratumIndex,
} from "./packedValues";

/** The running row's columns, in this order: the tallies, then one packed column per metric. */
const COLUMNS = ["tallies", ...PACKED_COLUMNS];

/** One running row, unpacked: tally fields per stratum, and per metric the pairs per stratum. */
interface Running {
  tallies: Map<StratumIndex, Float64Array>;
  metrics: Map<StratumIndex, Pairs>[];
}

function unpack([tallies, ...metrics]: readonly Uint8Array[]): Running {
  return { tallies: talliesOf(tallies), metrics: metrics.map(sectionsOf) };
}

function talliesOf(packed: Uint8Array): Map<StratumIndex, Float64Array> {
  const strata = new Map<StratumIndex, Float64Array>();
  forEachTally(packed, (stratum, fields) => strata.set(stratum, fields));
  return strata;
}

/** A running total plus one quarter's row (fresh maps; the running total is not changed). */
function add(running: Running, [tallies, ...metrics]: readonly Uint8Array[]): Running {
  const sumTallies = new Map(running.tallies);
  forEachTally(tallies, (stratum, fields) => {
    const soFar = sumTallies.get(stratum);
    sumTallies.set(stratum, soFar ? soFar.map((value, i) => value + fields[i]) : fields);
  });
  const sumMetrics = running.metrics.map((sections, m) => {
    const sum = new Map(sections);
    forEachSection(metrics[m], (stratum, _metric, pairs) => {
      const soFar = sum.get(stratum);
      sum.set(stratum, soFar ? mergePairs([soFar, pairs]) : pairs);
    });
    return sum;
  });
  return { tallies: sumTallies, metrics: sumMetrics };
}

/**
 * Rebuilds the running totals of each instructor from the given quarter on (instructor → earliest changed
 * quarter), or of every instructor: call after their instructor_values rows changed, in the same transaction.
 */
export function refreshRunningValues(sqlite: Database.Database, changedFrom: ReadonlyMap<number, string> | "all"): void {
  const from =
    changedFrom === "all"
      ? new Map(sqlite.prepare("SELECT instructor_id, min(quarter) FROM instructor_values GROUP BY instructor_id").raw(true).all() as [number, string][])
      : changedFrom;
  if (changedFrom === "all") sqlite.prepare("DELETE FROM instructor_running_values").run();
  const before = sqlite
    .prepare(`SELECT ${COLUMNS.join(", ")} FROM instructor_running_values WHERE instructor_id = ? AND quarter < ? ORDER BY quarter DESC LIMIT 1`)
    .raw(true);
  const clear = sqlite.prepare("DELETE FROM instructor_running_values WHERE instructor_id = ? AND quarter >= ?");
  const quarters = sqlite
    .prepare(`SELECT quarter, ${COLUMNS.join(", ")} FROM instructor_values WHERE instructor_id = ? AND quarter >= ? ORDER BY quarter`)
    .raw(true);
  const save = sqlite.prepare(
    `INSERT INTO instructor_running_values (instructor_id, quarter, ${COLUMNS.join(", ")}) VALUES (?, ?, ${COLUMNS.map(() => "?").join(", ")})`,
  );
  const nothing = COLUMNS.map(() => Buffer.alloc(0));
  for (const [instructorId, quarter] of from) {
    let running = unpack((before.get(instructorId, quarter) as Buffer[] | undefined) ?? nothing);
    clear.run(instructorId, quarter);
    for (const [q, ...row] of quarters.all(instructorId, quarter) as [string, ...Buffer[]][]) {
      running = add(running, row);
      save.run(instructorId, q, packTallies(running.tallies), ...running.metrics.map((sections, m) => packSections(sections, m)));
    }
  }
}

/** Builds every running total when their table is out of step with instructor_values (after the migration that adds it). */
export function ensureRunningValues(sqlite: Database.Database): void {
  const count = (table: string) => sqlite.prepare(`SELECT count(*) FROM ${table}`).pluck().get() as number;
  if (count("instructor_running_values") !== count("instructor_values")) {
    sqlite.transaction(() => refreshRunningValues(sqlite, "all")).immediate();
  }
}

interface RunningRange {
  from: string;
  to: string;
  instructorId: number | null;
}

/**
 * Calls `visit` with each instructor's running row at the range's end and the one before its start (undefined
 * when the range starts at or before their first quarter), for the columns named; instructors without attempts
 * in the range are left out.
 */
function forEachRunningPair(
  sqlite: Database.Database,
  range: RunningRange,
  columns: readonly string[],
  visit: (instructorId: number, end: Buffer[], beforeStart: Buffer[] | undefined) => void,
): void {
  const onlyOne = range.instructorId === null ? "" : "AND instructor_id = ?";
  const latest = (comparison: string) =>
    `SELECT r.instructor_id, r.quarter, ${columns.map((column) => `r.${column}`).join(", ")} FROM instructor_running_values r
     JOIN (SELECT instructor_id, max(quarter) AS quarter FROM instructor_running_values WHERE quarter ${comparison} ? ${onlyOne} GROUP BY instructor_id) latest
       USING (instructor_id, quarter)`;
  const params = (quarter: string) => (range.instructorId === null ? [quarter] : [quarter, range.instructorId]);
  const beforeStart = new Map<number, Buffer[]>();
  for (const [instructorId, , ...row] of sqlite
    .prepare(latest("<"))
    .raw(true)
    .iterate(...params(range.from)) as Iterable<[number, string, ...Buffer[]]>) {
    beforeStart.set(instructorId, row);
  }
  for (const [instructorId, quarter, ...row] of sqlite
    .prepare(latest("<="))
    .raw(true)
    .iterate(...params(range.to)) as Iterable<[number, string, ...Buffer[]]>) {
    if (quarter >= range.from) visit(instructorId, row, beforeStart.get(instructorId));
  }
}

/**
 * Calls `visit` with each instructor's pairs per stratum and metric over the range, for the metrics named
 * (indices into PACKED_COLUMNS) and the strata wanted; strata without attempts in the range are left out.
 */
export function forEachRunningSection(
  sqlite: Database.Database,
  range: RunningRange,
  metrics: readonly number[],
  wanted: (stratum: StratumIndex) => boolean,
  visit: (instructorId: number, stratum: StratumIndex, metric: number, pairs: Pairs) => void,
): void {
  forEachRunningPair(
    sqlite,
    range,
    metrics.map((m) => PACKED_COLUMNS[m]),
    (instructorId, end, beforeStart) => {
      end.forEach((packed, k) => {
        const earlier = beforeStart ? sectionsOf(beforeStart[k]) : null;
        forEachSection(packed, (stratum, _metric, pairs) => {
          if (!wanted(stratum)) return;
          const part = earlier?.get(stratum);
          const inRange = part ? subtractPairs(pairs, part) : pairs;
          if (inRange.length > 0) visit(instructorId, stratum, metrics[k], inRange);
        });
      });
    },
  );
}

/** Calls `visit` with each instructor's tally fields per stratum over the range, for the strata wanted with attempts in it. */
export function forEachRunningTally(
  sqlite: Database.Database,
  range: RunningRange,
  wanted: (stratum: StratumIndex) => boolean,
  visit: (instructorId: number, stratum: StratumIndex, fields: Float64Array) => void,
): void {
  forEachRunningPair(sqlite, range, ["tallies"], (instructorId, [end], beforeStart) => {
    const earlier = beforeStart ? talliesOf(beforeStart[0]) : null;
    forEachTally(end, (stratum, fields) => {
      if (!wanted(stratum)) return;
      const part = earlier?.get(stratum);
      const inRange = part ? fields.map((value, i) => value - part[i]) : fields;
      // field 0 is the attempts
      if (inRange[0] > 0) visit(instructorId, stratum, inRange);
    });
  });
}
