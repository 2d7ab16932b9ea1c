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
import {
  forEachDistribution,
  forEachGridCount,
  forEachInstructorAttempts,
  forEachInstructorTally,
  forEachRangeDistribution,
  forEachRangeTally,
  rowsAnswer,
} from "./instructorRows";
import { mergePairs, quantileOfPairs, STRATA, type Pairs, type StratumIndex, type SummaryMetric } from "./packedValues";

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

/** Dimensions instructor_values holds its tallies by. */
const instructorRowDimensions = new Set<Dimension>(["quarter", "instructorId", "profile", "feedback"]);

/** A stratum's key (`${profile}|${feedback}`) by stratum index. */
const STRATUM_KEYS: readonly StratumKey[] = STRATA.map(({ profile, feedback }): StratumKey => `${profile}|${feedback}`);

/** An instructor-quarter row's coordinate on one of instructorRowDimensions. */
function coordinateOf(dimension: DistributionDimension): (quarter: string, instructorId: number, stratum: StratumIndex) => string | number {
  if (dimension === "quarter") return (quarter) => quarter;
  if (dimension === "instructorId") return (_quarter, instructorId) => instructorId;
  return (_quarter, _instructorId, stratum) => STRATA[stratum][dimension];
}

/**
 * Tallies grouped by instructor (and quarter, patient type or feedback display) from instructor_values: a few
 * hundred rows per quarter instead of every group of attempt_tallies. Null where those rows cannot answer.
 */
function instructorTallies(db: Db, scope: SummaryScope, dimensions: readonly Dimension[]): Map<string | number, Tally> | null {
  if (!rowsAnswer(scope) || !dimensions.includes("instructorId") || !dimensions.every((d) => instructorRowDimensions.has(d))) return null;
  const [first, second] = dimensions.map((dimension) => coordinateOf(dimension as DistributionDimension));
  const keyOf =
    second === undefined
      ? first
      : (quarter: string, instructorId: number, stratum: StratumIndex) => `${first(quarter, instructorId, stratum)}|${second(quarter, instructorId, stratum)}`;
  const byKey = new Map<string | number, Tally>();
  const add = (quarter: string, instructorId: number, stratum: StratumIndex, fields: Float64Array) => {
    const key = keyOf(quarter, instructorId, stratum);
    let tally = byKey.get(key);
    if (!tally) byKey.set(key, (tally = emptyTally()));
    addFields(tally, fields);
  };
  // grouped by quarter, the quarters are read one by one; otherwise each instructor's range at once
  if (dimensions.includes("quarter")) forEachInstructorTally(db, scope, add);
  else forEachRangeTally(db, scope, (instructorId, stratum, fields) => add(scope.from, instructorId, stratum, fields));
  return byKey;
}

/** Adds packed tally fields (packedValues TALLY_FIELDS order) into a tally. */
function addFields(into: Tally, fields: Float64Array): void {
  into.n += fields[0];
  into.passed += fields[1];
  into.pp += fields[2];
  into.pf += fields[3];
  into.fp += fields[4];
  into.ff += fields[5];
  into.withErrors += fields[6];
  into.compressions += fields[7];
  for (let bit = 0; bit < attemptErrorNames.length; bit++) into.errors[attemptErrorNames[bit]] += fields[8 + bit];
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
  const fromRows = instructorTallies(db, scope, [dimension]);
  if (fromRows) return fromRows as Map<K, Tally>;
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
  const fromRows = instructorTallies(db, scope, [first, second]);
  if (fromRows) return fromRows as Map<string, Tally>;
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

/**
 * Tallies of each instructor in each stratum (patient type × feedback display) of the scope, from one read: what
 * the case-mix comparisons (funnel, standing's ranks) stand on.
 */
export function talliesByInstructorStratum(db: Db, scope: SummaryScope): Map<number, Map<StratumKey, Tally>> {
  const byInstructor = new Map<number, Map<StratumKey, Tally>>();
  const tallyAt = (instructorId: number, stratum: StratumKey): Tally => {
    let strata = byInstructor.get(instructorId);
    if (!strata) byInstructor.set(instructorId, (strata = new Map()));
    let tally = strata.get(stratum);
    if (!tally) strata.set(stratum, (tally = emptyTally()));
    return tally;
  };
  if (rowsAnswer(scope)) {
    forEachRangeTally(db, scope, (instructorId, stratum, fields) => addFields(tallyAt(instructorId, STRATUM_KEYS[stratum]), fields));
    return byInstructor;
  }
  const t = attemptTallies;
  const rows = db
    .select({ instructorId: t.instructorId, profile: t.profile, feedback: t.feedback, ...tallySums(t) })
    .from(t)
    .where(scopeConditions(t, scope))
    .groupBy(t.instructorId, t.profile, t.feedback)
    .all();
  for (const row of rows) addTally(tallyAt(row.instructorId, `${row.profile}|${row.feedback}`), tallyOf(row));
  return byInstructor;
}

/** Each instructor's tally over all their strata (the sum of talliesByInstructorStratum's). */
export function totalsByInstructor(byStratum: ReadonlyMap<number, ReadonlyMap<StratumKey, Tally>>): Map<number, Tally> {
  return new Map([...byStratum].map(([id, strata]) => [id, [...strata.values()].reduce(addTally, emptyTally())]));
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
  return quantileOfPairs(pairsOfCounts(counts), p);
}

/** A distribution as pairs (./packedValues). */
function pairsOfCounts(counts: ValueCounts): Pairs {
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
  forEachRangeDistribution(db, scope, (_instructorId, _stratum, _metric, pairs) => lists.push(pairs), [metric]);
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
  return new Map([...instructorPairsBy<K>(db, metric, scope, dimension)].map(([key, pairs]) => [key, countsOf(pairs)]));
}

/** The distribution of a metric for each value of `dimension`, as pairs, from the instructor-quarter rows. */
function instructorPairsBy<K extends string | number>(db: Db, metric: SummaryMetric, scope: SummaryScope, dimension: DistributionDimension): Map<K, Pairs> {
  const keyOf = coordinateOf(dimension);
  const lists = new Map<string | number, Pairs[]>();
  const add = (quarter: string, instructorId: number, stratum: StratumIndex, _metric: number, pairs: Pairs) => {
    const key = keyOf(quarter, instructorId, stratum);
    const list = lists.get(key);
    if (list) list.push(pairs);
    else lists.set(key, [pairs]);
  };
  // grouped by quarter, the quarters are read one by one; otherwise each instructor's range at once
  if (dimension === "quarter") forEachDistribution(db, scope, add, [metric]);
  else forEachRangeDistribution(db, scope, (instructorId, stratum, m, pairs) => add(scope.from, instructorId, stratum, m, pairs), [metric]);
  return new Map([...lists].map(([key, list]) => [key as K, mergePairs(list)]));
}

/** A stratum of the case-mix adjustment: `${profile}|${feedback}`. */
export type StratumKey = `${string}|${string}`;

/**
 * Per metric, each instructor's distribution over the scope, in total and in each stratum (patient type ×
 * feedback display), as pairs (./packedValues): ranking every instructor reads figures off them directly.
 */
export interface InstructorDistributions {
  byInstructor: Record<SummaryMetric, WholeDistributions>;
  byStratum: Record<SummaryMetric, Map<number, Map<StratumKey, Pairs>>>;
}

/**
 * Each instructor's distribution over all their strata, merged when first asked for: ranks adjusted for case
 * mix read the strata, so most instructors' whole distributions are never needed.
 */
export class WholeDistributions implements Iterable<[number, Pairs]> {
  private readonly merged = new Map<number, Pairs>();

  constructor(private readonly strata: ReadonlyMap<number, ReadonlyMap<StratumKey, Pairs>>) {}

  get(instructorId: number): Pairs | undefined {
    let whole = this.merged.get(instructorId);
    if (whole === undefined) {
      const parts = this.strata.get(instructorId);
      if (!parts) return undefined;
      this.merged.set(instructorId, (whole = mergePairs([...parts.values()])));
    }
    return whole;
  }

  *[Symbol.iterator](): Iterator<[number, Pairs]> {
    for (const instructorId of this.strata.keys()) yield [instructorId, this.get(instructorId)!];
  }
}

/**
 * Every metric's distribution for each instructor, in total and in each stratum of the scope, from one read of
 * the packed distributions: an instructor-quarter row carries all metrics and strata.
 */
export function distributionsByInstructor(db: Db, scope: SummaryScope): InstructorDistributions {
  // metric → instructor → stratum → the pairs (one list per quarter where the range is read quarter by quarter)
  const lists = summaryMetrics.map(() => new Map<number, Map<StratumIndex, Pairs[]>>());
  forEachRangeDistribution(db, scope, (instructorId, stratum, m, pairs) => {
    let strata = lists[m].get(instructorId);
    if (!strata) lists[m].set(instructorId, (strata = new Map()));
    const list = strata.get(stratum);
    if (list) list.push(pairs);
    else strata.set(stratum, [pairs]);
  });
  const byInstructor = {} as InstructorDistributions["byInstructor"];
  const byStratum = {} as InstructorDistributions["byStratum"];
  summaryMetrics.forEach((metric, m) => {
    byStratum[metric] = new Map(
      [...lists[m]].map(([instructorId, strata]) => [instructorId, new Map([...strata].map(([stratum, list]) => [STRATUM_KEYS[stratum], mergePairs(list)]))]),
    );
    byInstructor[metric] = new WholeDistributions(byStratum[metric]);
  });
  return { byInstructor, byStratum };
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
  if (isNetworkWide(scope) && dimension !== "instructorId") {
    return new Map([...valueCountsBy<K>(db, metric, scope, dimension)].map(([key, counts]) => [key, medianOfCounts(counts)!]));
  }
  // one median per instructor (or quarter, stratum) read off the pairs, without building (value, count) entries
  return new Map([...instructorPairsBy<K>(db, metric, scope, dimension)].map(([key, pairs]) => [key, quantileOfPairs(pairs, 0.5)!]));
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

/** Each instructor's attempts, or judged attempts, in each quarter from `from` to `to` (instructors with none left out). */
export function countsByQuarterAndInstructor(
  db: Db,
  from: string,
  to: string,
  measure: "attempts" | "judged",
): { quarter: string; instructorId: number; count: number }[] {
  const counts: { quarter: string; instructorId: number; count: number }[] = [];
  const scope = networkScope(from, to);
  if (measure === "attempts") {
    forEachInstructorAttempts(db, scope, (quarter, instructorId, count) => counts.push({ quarter, instructorId, count }));
    return counts;
  }
  for (const [key, tally] of talliesByPair(db, scope, "quarter", "instructorId")) {
    const [quarter, instructorId] = key.split("|");
    const count = judgedOf(tally);
    if (count > 0) counts.push({ quarter, instructorId: Number(instructorId), count });
  }
  return counts;
}

/** A cell of the release grid with one instructor's attempts and judged attempts in it. */
export interface InstructorCellCount {
  quarter: string;
  siteId: number;
  profile: string;
  feedback: string;
  /** 0 for attempts without a manikin. */
  manikinId: number;
  instructorId: number;
  n: number;
  judged: number;
}

/** Every instructor's attempts and judged attempts in each cell (site × patient type × feedback display × manikin) of one quarter. */
export function instructorCellCounts(db: Db, quarter: string): InstructorCellCount[] {
  const counts: InstructorCellCount[] = [];
  forEachGridCount(db, networkScope(quarter, quarter), (quarter, instructorId, { siteId, stratum, manikinId, n, judged }) =>
    counts.push({ quarter, siteId, ...STRATA[stratum], manikinId, instructorId, n, judged }),
  );
  return counts;
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
  // raw rows: tens of thousands of cells at a million attempts
  const rows = db.$client
    .prepare(text)
    .raw(true)
    .all(...params) as (string | number)[][];
  return rows.map((row) => ({ key: row.slice(0, columns.length), n: Number(row[columns.length]), judged: Number(row[columns.length + 1]) }));
}
