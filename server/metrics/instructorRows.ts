// Reads instructor_values (./instructorValues.ts): each instructor-quarter's tallies and distributions per
// stratum, for the scopes those rows can answer — quarters, an instructor, a patient type, a feedback display.
// Instructor-quarters still noted as changed are taken from their attempts, as are distributions narrowed to a
// site or a manikin (below the rows' grain; such scopes hold a small share of the attempts).
import type { Db } from "../db/client";
import { summaryMetrics } from "../db/schema";
import { INSTRUCTOR_ROW_COLUMNS, StrataValues, type InstructorRow } from "./instructorValues";
import {
  forEachCell,
  forEachSection,
  forEachTally,
  PACKED_COLUMNS,
  STRATA,
  type GridCount,
  type Pairs,
  type StratumIndex,
  type SummaryMetric,
} from "./packedValues";
import { forEachRunningSection, forEachRunningTally } from "./runningValues";
import type { SummaryScope } from "./summaries";

type DistributionVisitor = (quarter: string, instructorId: number, stratum: StratumIndex, metric: number, pairs: Pairs) => void;
type TallyVisitor = (quarter: string, instructorId: number, stratum: StratumIndex, fields: Float64Array) => void;

/** Whether instructor_values answers the scope (it names no site and no manikin). */
export function rowsAnswer(scope: SummaryScope): boolean {
  return scope.siteId === null && scope.manikinId === null;
}

function stratumFilter(scope: SummaryScope): (stratum: StratumIndex) => boolean {
  const wanted = STRATA.map(
    ({ profile, feedback }) => (scope.profile === null || scope.profile === profile) && (scope.feedback === null || scope.feedback === feedback),
  );
  return (stratum) => wanted[stratum];
}

/** The scope's conditions on attempts or instructor_values (quarters and instructor), with their parameters. */
function rowConditions(scope: SummaryScope): { where: string; params: unknown[] } {
  const where = [scope.from === scope.to ? "quarter = ?" : "quarter BETWEEN ? AND ?"];
  const params: unknown[] = scope.from === scope.to ? [scope.from] : [scope.from, scope.to];
  if (scope.instructorId !== null) {
    where.push("instructor_id = ?");
    params.push(scope.instructorId);
  }
  return { where: where.join(" AND "), params };
}

/** Attempt rows gathered per instructor-quarter. */
function fromAttempts(db: Db, where: string, params: unknown[], visit: (quarter: string, instructorId: number, values: StrataValues) => void): void {
  const byGroup = new Map<string, { quarter: string; instructorId: number; values: StrataValues }>();
  for (const row of db.$client
    .prepare(`SELECT ${INSTRUCTOR_ROW_COLUMNS.join(", ")} FROM attempts WHERE ${where}`)
    .raw(true)
    .iterate(...params) as Iterable<InstructorRow>) {
    const key = `${row[0]}|${row[1]}`;
    let group = byGroup.get(key);
    if (!group) byGroup.set(key, (group = { quarter: row[0], instructorId: row[1], values: new StrataValues() }));
    group.values.add(row);
  }
  for (const { quarter, instructorId, values } of byGroup.values()) visit(quarter, instructorId, values);
}

/**
 * Each instructor-quarter of a scope rowsAnswer(): `fromRow` with the stored columns, or `fromValues` with the
 * values rebuilt from the attempts where the pair is noted as changed.
 */
function forEachInstructorQuarter<Column = Buffer>(
  db: Db,
  scope: SummaryScope,
  columns: readonly string[],
  fromRow: (quarter: string, instructorId: number, values: Column[]) => void,
  fromValues: (quarter: string, instructorId: number, values: StrataValues) => void,
): void {
  const sqlite = db.$client;
  const { where, params } = rowConditions(scope);
  const noted = sqlite
    .prepare(`SELECT quarter, instructor_id FROM instructor_values_stale WHERE ${where}`)
    .raw(true)
    .all(...params) as [string, number][];
  const notedKeys = new Set(noted.map(([quarter, instructorId]) => `${quarter}|${instructorId}`));
  for (const [quarter, instructorId, ...blobs] of sqlite
    .prepare(`SELECT quarter, instructor_id, ${columns.join(", ")} FROM instructor_values WHERE ${where}`)
    .raw(true)
    .iterate(...params) as Iterable<[string, number, ...Column[]]>) {
    if (notedKeys.size === 0 || !notedKeys.has(`${quarter}|${instructorId}`)) fromRow(quarter, instructorId, blobs);
  }
  for (const [quarter, instructorId] of noted) fromAttempts(db, "quarter = ? AND instructor_id = ?", [quarter, instructorId], fromValues);
}

/**
 * Visits the distributions of every instructor-quarter in scope, by stratum and metric index (summaryMetrics),
 * for the metrics asked for (all when none are named).
 */
export function forEachDistribution(db: Db, scope: SummaryScope, visit: DistributionVisitor, metrics: readonly SummaryMetric[] = summaryMetrics): void {
  const wanted = stratumFilter(scope);
  const indices = metrics.map((metric) => summaryMetrics.indexOf(metric));
  const fromValues = (quarter: string, instructorId: number, values: StrataValues) => {
    for (const [stratum, byMetric] of values.pairs(indices)) {
      if (wanted(stratum)) for (const m of indices) visit(quarter, instructorId, stratum, m, byMetric[m]);
    }
  };
  if (!rowsAnswer(scope)) {
    const { where, params } = rowConditions(scope);
    const parts = [where];
    if (scope.siteId !== null) {
      parts.push("site_id = ?");
      params.push(scope.siteId);
    }
    // 0 stands for attempts without a manikin
    if (scope.manikinId !== null) parts.push(scope.manikinId === 0 ? "manikin_id IS NULL" : `manikin_id = ${Number(scope.manikinId)}`);
    fromAttempts(db, parts.join(" AND "), params, fromValues);
    return;
  }
  forEachInstructorQuarter(
    db,
    scope,
    indices.map((m) => PACKED_COLUMNS[m]),
    (quarter, instructorId, blobs) => {
      for (const packed of blobs) {
        forEachSection(packed, (stratum, m, pairs) => {
          if (wanted(stratum)) visit(quarter, instructorId, stratum, m, pairs);
        });
      }
    },
    fromValues,
  );
}

/**
 * Whether the running totals answer a scope: a range of more than one quarter that rowsAnswer(), with no
 * instructor-quarter up to its end still noted as changed (a running total includes every earlier quarter).
 */
function runningTotalsAnswer(db: Db, scope: SummaryScope): boolean {
  if (scope.from === scope.to || !rowsAnswer(scope)) return false;
  const noted = db.$client
    .prepare(`SELECT 1 FROM instructor_values_stale WHERE quarter <= ?${scope.instructorId === null ? "" : " AND instructor_id = ?"} LIMIT 1`)
    .pluck()
    .get(...(scope.instructorId === null ? [scope.to] : [scope.to, scope.instructorId]));
  return noted === undefined;
}

/**
 * Visits each instructor's distributions over the scope, by stratum and metric index, once per instructor rather
 * than once per quarter: a range of quarters is read from the running totals (./runningValues) unless an
 * instructor-quarter up to its end is still noted as changed, in which case (and for a single quarter, or a
 * site or a manikin) the quarters are visited one by one, as forEachDistribution does.
 */
export function forEachRangeDistribution(
  db: Db,
  scope: SummaryScope,
  visit: (instructorId: number, stratum: StratumIndex, metric: number, pairs: Pairs) => void,
  metrics: readonly SummaryMetric[] = summaryMetrics,
): void {
  if (!runningTotalsAnswer(db, scope)) {
    return forEachDistribution(db, scope, (_quarter, instructorId, stratum, m, pairs) => visit(instructorId, stratum, m, pairs), metrics);
  }
  forEachRunningSection(
    db.$client,
    scope,
    metrics.map((metric) => summaryMetrics.indexOf(metric)),
    stratumFilter(scope),
    visit,
  );
}

/** Visits the tally fields (packedValues TALLY_FIELDS) of every instructor-quarter and stratum in a scope rowsAnswer(). */
export function forEachInstructorTally(db: Db, scope: SummaryScope, visit: TallyVisitor): void {
  const wanted = stratumFilter(scope);
  forEachInstructorQuarter(
    db,
    scope,
    ["tallies"],
    (quarter, instructorId, [tallies]) =>
      forEachTally(tallies, (stratum, fields) => {
        if (wanted(stratum)) visit(quarter, instructorId, stratum, fields);
      }),
    (quarter, instructorId, values) => {
      for (const [stratum, fields] of values.tallies()) if (wanted(stratum)) visit(quarter, instructorId, stratum, fields);
    },
  );
}

/**
 * Visits each instructor's tally fields per stratum over a scope rowsAnswer(), once per instructor rather than
 * once per quarter: from the running totals where they answer, else quarter by quarter.
 */
export function forEachRangeTally(db: Db, scope: SummaryScope, visit: (instructorId: number, stratum: StratumIndex, fields: Float64Array) => void): void {
  if (!runningTotalsAnswer(db, scope))
    return forEachInstructorTally(db, scope, (_quarter, instructorId, stratum, fields) => visit(instructorId, stratum, fields));
  forEachRunningTally(db.$client, scope, stratumFilter(scope), visit);
}

/** Visits the attempts of every instructor-quarter in a scope rowsAnswer(), from instructor_values_attempts_idx (no row is read). */
export function forEachInstructorAttempts(db: Db, scope: SummaryScope, visit: (quarter: string, instructorId: number, attempts: number) => void): void {
  forEachInstructorQuarter<number>(
    db,
    scope,
    ["attempts"],
    (quarter, instructorId, [attempts]) => visit(quarter, instructorId, attempts),
    (quarter, instructorId, values) => visit(quarter, instructorId, values.attempts),
  );
}

/** Visits the release-grid cells of every instructor-quarter in a scope rowsAnswer(). */
export function forEachGridCount(db: Db, scope: SummaryScope, visit: (quarter: string, instructorId: number, cell: GridCount) => void): void {
  forEachInstructorQuarter(
    db,
    scope,
    ["cells"],
    (quarter, instructorId, [cells]) => forEachCell(cells, (cell) => visit(quarter, instructorId, cell)),
    (quarter, instructorId, values) => {
      for (const cell of values.cells()) visit(quarter, instructorId, cell);
    },
  );
}
