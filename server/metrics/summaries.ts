// Reads the attempt summaries: tallies and value distributions kept in the transactions that write attempts
// (docs/decisions/004-metric-summaries.md, 008-packed-instructor-distributions.md). Every attempt figure of the
// insight pages, the funder report and the statistics command is a sum over tallies or an order statistic over
// value counts read here, so every answer counts the same way; only medians narrowed to a site or a manikin
// read the (few) attempts in scope.
import { and, between, eq, sql, type SQL } from "drizzle-orm";
import type { SQLiteColumn } from "drizzle-orm/sqlite-core";
import { attemptErrorNames, type AttemptError } from "../../shared/scoring/scoreAttempt";
import type { Db } from "../db/client";
import { attemptTallies, learnerTallies, networkTallies, networkValues, summaryMetrics } from "../db/schema";
import { DISTRIBUTION_COLUMNS, StrataValues, type DistributionRow } from "./instructorValues";
import { forEachSection, mergePairs, quantileOfPairs, stratumOf, type Pairs, type StratumIndex, type SummaryMetric } from "./packedValues";

/** Metrics whose distributions are kept (exact, at the values as recorded). */
export type { SummaryMetric };

/** What a figure can be narrowed to: a quarter range and any of the attempt dimensions. */
export interface SummaryScope {
  from: string;
  to: string;
  siteId: number | null;
  profile: string | null;
  feedback: string | null;
  instructorId: number | null;
  manikinId: number | null;
}

export interface Tally {
  n: number;
  passed: number;
  /** instructor's result × measured result: pass/pass, pass/fail, fail/pass, fail/fail */
  pp: number;
  pf: number;
  fp: number;
  ff: number;
  withErrors: number;
  compressions: number;
  errors: Record<AttemptError, number>;
}

/** Dimensions a tally or a distribution can be grouped by. */
export type Dimension = "quarter" | "siteId" | "instructorId" | "manikinId" | "profile" | "feedback" | "policyVersion";

type TallyTable = typeof attemptTallies | typeof networkTallies;

function errorColumnsOf(table: TallyTable): Record<AttemptError, SQLiteColumn> {
  return {
    too_shallow: table.errTooShallow,
    too_deep: table.errTooDeep,
    too_slow: table.errTooSlow,
    too_fast: table.errTooFast,
    incomplete_recoil: table.errIncompleteRecoil,
    low_hands_on: table.errLowHandsOn,
    long_pause: table.errLongPause,
  };
}

export function emptyTally(): Tally {
  return {
    n: 0,
    passed: 0,
    pp: 0,
    pf: 0,
    fp: 0,
    ff: 0,
    withErrors: 0,
    compressions: 0,
    errors: Object.fromEntries(attemptErrorNames.map((name) => [name, 0])) as Record<AttemptError, number>,
  };
}

/** Adds `row` into `into` (in place) and returns `into`. */
export function addTally(into: Tally, row: Tally): Tally {
  into.n += row.n;
  into.passed += row.passed;
  into.pp += row.pp;
  into.pf += row.pf;
  into.fp += row.fp;
  into.ff += row.ff;
  into.withErrors += row.withErrors;
  into.compressions += row.compressions;
  for (const name of attemptErrorNames) into.errors[name] += row.errors[name];
  return into;
}

/** Attempts that carry an instructor's pass or fail. */
export function judgedOf(tally: Tally): number {
  return tally.pp + tally.pf + tally.fp + tally.ff;
}

/** The whole network over a range of quarters. */
export function networkScope(from: string, to: string): SummaryScope {
  return { from, to, siteId: null, profile: null, feedback: null, instructorId: null, manikinId: null };
}

type ScopedTable = typeof attemptTallies | typeof learnerTallies;

/** The scope as conditions on any summary table that carries every dimension. */
export function scopeConditions(table: ScopedTable, scope: SummaryScope): SQL {
  // one quarter as an equality: the summaries' keys then hand over their rows in key order, with no sort
  const parts: SQL[] = [scope.from === scope.to ? eq(table.quarter, scope.from) : between(table.quarter, scope.from, scope.to)];
  if (scope.siteId !== null) parts.push(eq(table.siteId, scope.siteId));
  if (scope.profile !== null) parts.push(sql`${table.profile} = ${scope.profile}`);
  if (scope.feedback !== null) parts.push(sql`${table.feedback} = ${scope.feedback}`);
  if (scope.instructorId !== null) parts.push(eq(table.instructorId, scope.instructorId));
  if (scope.manikinId !== null) parts.push(eq(table.manikinId, scope.manikinId));
  return and(...parts)!;
}

function tallySums(table: TallyTable) {
  const errors = errorColumnsOf(table);
  return {
    n: sql<number>`sum(${table.n})`,
    passed: sql<number>`sum(${table.passed})`,
    pp: sql<number>`sum(${table.judgedPp})`,
    pf: sql<number>`sum(${table.judgedPf})`,
    fp: sql<number>`sum(${table.judgedFp})`,
    ff: sql<number>`sum(${table.judgedFf})`,
    withErrors: sql<number>`sum(${table.withErrors})`,
    compressions: sql<number>`sum(${table.compressions})`,
    ...Object.fromEntries(attemptErrorNames.map((name) => [`err_${name}`, sql<number>`sum(${errors[name]})`])),
  };
}

/** Dimensions network_tallies keeps. */
const networkDimensions = new Set<Dimension>(["quarter", "profile", "feedback", "policyVersion"]);

/**
 * The tally table that answers a scope grouped by `dimensions`: network_tallies (a few rows per quarter) when
 * neither the scope nor the grouping names a site, instructor or manikin, else attempt_tallies.
 */
function tallySource(scope: SummaryScope, dimensions: Dimension[]): { table: TallyTable; where: SQL } {
  if (isNetworkWide(scope) && dimensions.every((d) => networkDimensions.has(d))) {
    const parts: SQL[] = [between(networkTallies.quarter, scope.from, scope.to)];
    if (scope.profile !== null) parts.push(sql`${networkTallies.profile} = ${scope.profile}`);
    if (scope.feedback !== null) parts.push(sql`${networkTallies.feedback} = ${scope.feedback}`);
    return { table: networkTallies, where: and(...parts)! };
  }
  return { table: attemptTallies, where: scopeConditions(attemptTallies, scope) };
}

function dimensionColumn(table: TallyTable, dimension: Dimension): SQLiteColumn {
  return (table as typeof attemptTallies)[dimension];
}

function tallyOf(row: Record<string, unknown>): Tally {
  return {
    n: Number(row.n ?? 0),
    passed: Number(row.passed ?? 0),
    pp: Number(row.pp ?? 0),
    pf: Number(row.pf ?? 0),
    fp: Number(row.fp ?? 0),
    ff: Number(row.ff ?? 0),
    withErrors: Number(row.withErrors ?? 0),
    compressions: Number(row.compressions ?? 0),
    errors: Object.fromEntries(attemptErrorNames.map((name) => [name, Number(row[`err_${name}`] ?? 0)])) as Record<AttemptError, number>,
  };
}

/** The tally of every attempt in scope. */
export function totalTally(db: Db, scope: SummaryScope): Tally {
  const { table, where } = tallySource(scope, []);
  return tallyOf(db.select(tallySums(table)).from(table).where(where).get() ?? {});
}

/**
 * Tallies of the attempts in scope, one per value of `dimension` that has attempts. Keys are the stored values;
 * a manikin key of 0 stands for attempts that name no manikin.
 */
export function talliesBy<K extends string | number>(db: Db, scope: SummaryScope, dimension: Dimension): Map<K, Tally> {
  const { table, where } = tallySource(scope, [dimension]);
  const column = dimensionColumn(table, dimension);
  const rows = db
    .select({ key: column, ...tallySums(table) })
    .from(table)
    .where(where)
    .groupBy(column)
    .all();
  return new Map(rows.map((row) => [row.key as K, tallyOf(row)]));
}

/** Tallies by two dimensions at once, keyed `${first}|${second}`. */
export function talliesByPair(db: Db, scope: SummaryScope, first: Dimension, second: Dimension): Map<string, Tally> {
  const { table, where } = tallySource(scope, [first, second]);
  const a = dimensionColumn(table, first);
  const b = dimensionColumn(table, second);
  const rows = db
    .select({ a, b, ...tallySums(table) })
    .from(table)
    .where(where)
    .groupBy(a, b)
    .all();
  return new Map(rows.map((row) => [`${row.a}|${row.b}`, tallyOf(row)]));
}

/** Distinct values of a dimension among the attempts in scope, ascending. */
export function distinctIn(db: Db, scope: SummaryScope, dimension: Dimension): (string | number)[] {
  const { table, where } = tallySource(scope, [dimension]);
  const column = dimensionColumn(table, dimension);
  return db
    .selectDistinct({ key: column })
    .from(table)
    .where(where)
    .orderBy(column)
    .all()
    .map((row) => row.key as string | number);
}

/** A distribution as ascending (value, count) pairs. */
export type ValueCounts = { value: number; count: number }[];

/** Type-7 quantile of a distribution (Hyndman & Fan 1996; shared/stats `quantile` on the expanded values). */
export function quantileOfCounts(counts: ValueCounts, p: number): number | null {
  return quantileOfPairs(pairsOf(counts), p);
}

/** A distribution as pairs (./packedValues). */
function pairsOf(counts: ValueCounts): Pairs {
  const pairs = new Float64Array(counts.length * 2);
  counts.forEach(({ value, count }, i) => {
    pairs[2 * i] = value;
    pairs[2 * i + 1] = count;
  });
  return pairs;
}

/**
 * Mid-rank percentile of `x` in a distribution: the share (0–100) of values below it, values equal to it
 * counted half — the definition of shared/stats `percentileRank` on the expanded values (common practice).
 */
export function percentileRankOfCounts(counts: ValueCounts, x: number): number | null {
  let n = 0;
  let below = 0;
  let equal = 0;
  for (const { value, count } of counts) {
    n += count;
    if (value < x) below += count;
    else if (value === x) equal += count;
  }
  return n === 0 ? null : (100 * (below + equal / 2)) / n;
}

export function medianOfCounts(counts: ValueCounts): number | null {
  return quantileOfCounts(counts, 0.5);
}

/** Merges ascending distributions into one. */
export function mergeCounts(...lists: ValueCounts[]): ValueCounts {
  const merged = new Map<number, number>();
  for (const list of lists) for (const { value, count } of list) merged.set(value, (merged.get(value) ?? 0) + count);
  return [...merged].sort((a, b) => a[0] - b[0]).map(([value, count]) => ({ value, count }));
}

/** Whether only quarter, patient type and feedback display narrow the scope (network_values answers it). */
function isNetworkWide(scope: SummaryScope): boolean {
  return scope.siteId === null && scope.instructorId === null && scope.manikinId === null;
}

function networkConditions(metric: SummaryMetric, scope: SummaryScope): SQL {
  const parts: SQL[] = [eq(networkValues.metric, metric), between(networkValues.quarter, scope.from, scope.to)];
  if (scope.profile !== null) parts.push(sql`${networkValues.profile} = ${scope.profile}`);
  if (scope.feedback !== null) parts.push(sql`${networkValues.feedback} = ${scope.feedback}`);
  return and(...parts)!;
}

/** The distribution of a metric over the attempts in scope. */
export function valueCounts(db: Db, metric: SummaryMetric, scope: SummaryScope): ValueCounts {
  if (isNetworkWide(scope)) {
    return db
      .select({ value: networkValues.value, count: sql<number>`sum(${networkValues.count})` })
      .from(networkValues)
      .where(networkConditions(metric, scope))
      .groupBy(networkValues.value)
      .orderBy(networkValues.value)
      .all();
  }
  const lists: Pairs[] = [];
  const wanted = summaryMetrics.indexOf(metric);
  forEachDistribution(db, scope, (_quarter, _instructorId, _stratum, m, pairs) => {
    if (m === wanted) lists.push(pairs);
  });
  return countsOf(mergePairs(lists));
}

/** Rows (key, value, count) in key then value order, gathered into one distribution per key. */
function groupRows(db: Db, query: { toSQL(): { sql: string; params: unknown[] } }): Map<string | number, ValueCounts> {
  const { sql: text, params } = query.toSQL();
  const byKey = new Map<string | number, ValueCounts>();
  let currentKey: string | number | undefined;
  let current: ValueCounts = [];
  for (const [key, value, count] of db.$client
    .prepare(text)
    .raw(true)
    .iterate(...params) as Iterable<[string | number, number, number]>) {
    if (key !== currentKey) {
      current = [];
      byKey.set(key, current);
      currentKey = key;
    }
    current.push({ value, count });
  }
  return byKey;
}

/** Dimensions a distribution can be grouped by. */
export type DistributionDimension = "quarter" | "instructorId" | "profile" | "feedback";

/** The distribution of a metric for each value of `dimension`. */
export function valueCountsBy<K extends string | number>(
  db: Db,
  metric: SummaryMetric,
  scope: SummaryScope,
  dimension: DistributionDimension,
): Map<K, ValueCounts> {
  if (isNetworkWide(scope) && dimension !== "instructorId") {
    const column = networkValues[dimension];
    return groupRows(
      db,
      db
        .select({ key: column, value: networkValues.value, count: sql<number>`sum(${networkValues.count})` })
        .from(networkValues)
        .where(networkConditions(metric, scope))
        .groupBy(column, networkValues.value)
        .orderBy(column, networkValues.value),
    ) as Map<K, ValueCounts>;
  }
  const wanted = summaryMetrics.indexOf(metric);
  const keyOf: (quarter: string, instructorId: number, stratum: StratumIndex) => string | number =
    dimension === "quarter"
      ? (quarter) => quarter
      : dimension === "instructorId"
        ? (_quarter, instructorId) => instructorId
        : (_quarter, _instructorId, stratum) => stratumOf(stratum)[dimension];
  const lists = new Map<string | number, Pairs[]>();
  forEachDistribution(db, scope, (quarter, instructorId, stratum, m, pairs) => {
    if (m !== wanted) return;
    const key = keyOf(quarter, instructorId, stratum);
    const list = lists.get(key);
    if (list) list.push(pairs);
    else lists.set(key, [pairs]);
  });
  return new Map([...lists].map(([key, list]) => [key as K, countsOf(mergePairs(list))]));
}

/** A stratum of the case-mix adjustment: `${profile}|${feedback}`. */
export type StratumKey = `${string}|${string}`;

/**
 * Per metric, each instructor's distribution over the scope, in total and in each stratum (patient type ×
 * feedback display), as pairs (./packedValues): ranking every instructor reads figures off them directly.
 */
export interface InstructorDistributions {
  byInstructor: Record<SummaryMetric, Map<number, Pairs>>;
  byStratum: Record<SummaryMetric, Map<number, Map<StratumKey, Pairs>>>;
}

/**
 * Every metric's distribution for each instructor, in total and in each stratum of the scope, from one read of
 * the packed distributions: an instructor-quarter row carries all metrics and strata.
 */
export function distributionsByInstructor(db: Db, scope: SummaryScope): InstructorDistributions {
  // metric → instructor → stratum → the quarters' pairs
  const lists = summaryMetrics.map(() => new Map<number, Map<StratumIndex, Pairs[]>>());
  forEachDistribution(db, scope, (_quarter, instructorId, stratum, m, pairs) => {
    let strata = lists[m].get(instructorId);
    if (!strata) lists[m].set(instructorId, (strata = new Map()));
    const list = strata.get(stratum);
    if (list) list.push(pairs);
    else strata.set(stratum, [pairs]);
  });
  const stratumKeyOf = (index: StratumIndex): StratumKey => {
    const { profile, feedback } = stratumOf(index);
    return `${profile}|${feedback}`;
  };
  const byInstructor = {} as InstructorDistributions["byInstructor"];
  const byStratum = {} as InstructorDistributions["byStratum"];
  summaryMetrics.forEach((metric, m) => {
    byInstructor[metric] = new Map();
    byStratum[metric] = new Map();
    for (const [instructorId, strata] of lists[m]) {
      const merged = [...strata.values()].map(mergePairs);
      byInstructor[metric].set(instructorId, mergePairs(merged));
      byStratum[metric].set(instructorId, new Map([...strata.keys()].map((stratum, i) => [stratumKeyOf(stratum), merged[i]])));
    }
  });
  return { byInstructor, byStratum };
}

type DistributionVisitor = (quarter: string, instructorId: number, stratum: StratumIndex, metric: number, pairs: Pairs) => void;

/**
 * Visits the distributions of every instructor-quarter in scope, by stratum and metric index (summaryMetrics).
 * Packed rows serve scopes of quarters, an instructor, a patient type and a feedback display; a site or a
 * manikin narrows below the packed rows, so those scopes — a small share of the attempts — and instructor-quarters
 * noted as changed since their row was built are read from the attempts themselves.
 */
function forEachDistribution(db: Db, scope: SummaryScope, visit: DistributionVisitor): void {
  const wantStratum = (stratum: StratumIndex) => {
    const { profile, feedback } = stratumOf(stratum);
    return (scope.profile === null || scope.profile === profile) && (scope.feedback === null || scope.feedback === feedback);
  };
  const sqlite = db.$client;
  const quarterCondition = scope.from === scope.to ? "quarter = ?" : "quarter BETWEEN ? AND ?";
  const quarterParams = scope.from === scope.to ? [scope.from] : [scope.from, scope.to];
  const instructorCondition = scope.instructorId === null ? "" : " AND instructor_id = ?";
  const instructorParams = scope.instructorId === null ? [] : [scope.instructorId];
  const fromAttempts = (where: string, params: unknown[]) => {
    const byGroup = new Map<string, { quarter: string; instructorId: number; values: StrataValues }>();
    for (const row of sqlite
      .prepare(`SELECT ${DISTRIBUTION_COLUMNS.join(", ")} FROM attempts WHERE ${where}`)
      .raw(true)
      .iterate(...params) as Iterable<DistributionRow>) {
      const key = `${row[0]}|${row[1]}`;
      let group = byGroup.get(key);
      if (!group) byGroup.set(key, (group = { quarter: row[0], instructorId: row[1], values: new StrataValues() }));
      group.values.add(row);
    }
    for (const { quarter, instructorId, values } of byGroup.values()) {
      for (const [stratum, byMetric] of values.pairs()) {
        if (wantStratum(stratum)) byMetric.forEach((pairs, m) => visit(quarter, instructorId, stratum, m, pairs));
      }
    }
  };

  if (scope.siteId !== null || scope.manikinId !== null) {
    const parts = [quarterCondition + instructorCondition];
    const params: unknown[] = [...quarterParams, ...instructorParams];
    if (scope.siteId !== null) {
      parts.push("site_id = ?");
      params.push(scope.siteId);
    }
    if (scope.manikinId !== null) parts.push(scope.manikinId === 0 ? "manikin_id IS NULL" : `manikin_id = ${Number(scope.manikinId)}`);
    if (scope.profile !== null) {
      parts.push("profile = ?");
      params.push(scope.profile);
    }
    if (scope.feedback !== null) {
      parts.push("feedback = ?");
      params.push(scope.feedback);
    }
    fromAttempts(parts.join(" AND "), params);
    return;
  }

  const noted = new Set(
    (
      sqlite
        .prepare(`SELECT quarter, instructor_id FROM instructor_values_stale WHERE ${quarterCondition}${instructorCondition}`)
        .raw(true)
        .all(...quarterParams, ...instructorParams) as [string, number][]
    ).map(([quarter, instructorId]) => `${quarter}|${instructorId}`),
  );
  for (const [quarter, instructorId, packed] of sqlite
    .prepare(`SELECT quarter, instructor_id, packed FROM instructor_values WHERE ${quarterCondition}${instructorCondition}`)
    .raw(true)
    .iterate(...quarterParams, ...instructorParams) as Iterable<[string, number, Buffer]>) {
    if (noted.has(`${quarter}|${instructorId}`)) continue;
    forEachSection(packed, (stratum, m, pairs) => {
      if (wantStratum(stratum)) visit(quarter, instructorId, stratum, m, pairs);
    });
  }
  for (const key of noted) {
    const [quarter, instructorId] = key.split("|");
    fromAttempts("quarter = ? AND instructor_id = ?", [quarter, Number(instructorId)]);
  }
}

/** Pairs as a distribution of (value, count) entries. */
export function countsOf(pairs: Pairs): ValueCounts {
  const counts: ValueCounts = new Array(pairs.length / 2);
  for (let i = 0; i < pairs.length; i += 2) counts[i / 2] = { value: pairs[i], count: pairs[i + 1] };
  return counts;
}

/** The median of a metric over the attempts in scope; null when there are none. */
export function medianIn(db: Db, metric: SummaryMetric, scope: SummaryScope): number | null {
  return medianOfCounts(valueCounts(db, metric, scope));
}

/** The median of a metric for each value of `dimension`. */
export function mediansBy<K extends string | number>(db: Db, metric: SummaryMetric, scope: SummaryScope, dimension: DistributionDimension): Map<K, number> {
  return new Map([...valueCountsBy<K>(db, metric, scope, dimension)].map(([key, counts]) => [key, medianOfCounts(counts)!]));
}

/** Quarters that hold attempts, newest first. */
export function quartersWithAttempts(db: Db): string[] {
  return db
    .selectDistinct({ quarter: networkTallies.quarter })
    .from(networkTallies)
    .orderBy(sql`${networkTallies.quarter} DESC`)
    .all()
    .map((row) => row.quarter);
}

/** Attempts and judged attempts (those with an instructor's result) for each combination of `dimensions`, over every quarter. */
export function countsByGrid(db: Db, dimensions: readonly Dimension[]): { key: (string | number)[]; n: number; judged: number }[] {
  const columns = dimensions.map((dimension) => attemptTallies[dimension]);
  const { sql: text, params } = db
    .select({
      ...Object.fromEntries(columns.map((column, i) => [`k${i}`, column])),
      n: sql<number>`sum(${attemptTallies.n})`,
      judged: sql<number>`sum(${attemptTallies.judgedPp} + ${attemptTallies.judgedPf} + ${attemptTallies.judgedFp} + ${attemptTallies.judgedFf})`,
    })
    .from(attemptTallies)
    .groupBy(...columns)
    .toSQL();
  // raw rows: tens of thousands of cells at a million attempts, read on every change of the data
  const rows = db.$client
    .prepare(text)
    .raw(true)
    .all(...params) as (string | number)[][];
  return rows.map((row) => ({ key: row.slice(0, columns.length), n: Number(row[columns.length]), judged: Number(row[columns.length + 1]) }));
}
