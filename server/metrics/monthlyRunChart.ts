// The monthly run chart of an aim (the measured pass rate, or the share of attempts failing on one error) in
// a scope: one point per calendar month of the class date with attempts, its median (of the baseline months
// when a baseline is named) and the run-chart rules of Anhøj & Olesen 2014 (shared/stats/runChart.ts).
// `quarterbeat trend` and the action detail page answer from here.
//
// Months are finer than the quarters the attempt summaries keep, so the counts come from the attempts table
// in one grouped query, narrowed by the quarter index; the chart is a tool of the quality lead, not a figure
// shown to instructors or funders about other people's attempts (see server/actions/routes.ts).
import { and, between, eq, sql, type SQL } from "drizzle-orm";
import { quarterOf } from "../../shared/period";
import type { PatientType } from "../../shared/scoring/policy";
import type { MonthlyRunChart, MonthPoint, PhaseCentre, RunChartRules } from "../../shared/schemas/runChart";
import { median, runChartLimits, runChartSignals } from "../../shared/stats";
import type { AimFigure } from "../../shared/vocabulary";
import type { Db } from "../db/client";
import { attempts, classes } from "../db/schema";
import { hasError } from "../insight/sql";

export interface MonthlyScope {
  /** First and last quarter (of the class date), e.g. 2025-Q1. */
  from: string;
  to: string;
  siteId: number | null;
  instructorId: number | null;
  profile: PatientType | null;
  /** What each point counts; the measured pass rate unless named. */
  aim?: AimFigure;
}

const classMonth = sql<string>`substr(${classes.date}, 1, 7)`;

function countedOf(scope: MonthlyScope) {
  const aim = scope.aim ?? "passRate";
  return aim === "passRate" ? sql<number>`sum(${attempts.passed})` : sql<number>`sum(${hasError(aim)})`;
}

function conditionsOf(scope: MonthlyScope): SQL | undefined {
  const conditions: SQL[] = [between(attempts.quarter, scope.from, scope.to)];
  if (scope.siteId !== null) conditions.push(eq(attempts.siteId, scope.siteId));
  if (scope.instructorId !== null) conditions.push(eq(attempts.instructorId, scope.instructorId));
  if (scope.profile !== null) conditions.push(eq(attempts.profile, scope.profile));
  return and(...conditions);
}

/** Attempts and the aim's count per calendar month of the class date: one grouped query. */
export function monthlyCounts(db: Db, scope: MonthlyScope): { period: string; n: number; x: number }[] {
  return db
    .select({ period: classMonth, n: sql<number>`count(*)`, x: countedOf(scope) })
    .from(attempts)
    .innerJoin(classes, eq(classes.id, attempts.classId))
    .where(conditionsOf(scope))
    .groupBy(classMonth)
    .orderBy(classMonth)
    .all()
    .map((row) => ({ period: row.period, n: Number(row.n), x: Number(row.x ?? 0) }));
}

/**
 * The same counts split by site and instructor, for readers who must not learn about a small group of others'
 * attempts: one grouped query serves the network's series and every site's.
 */
export function monthlyCountsBySiteAndInstructor(
  db: Db,
  scope: MonthlyScope,
): { period: string; siteId: number; instructorId: number; n: number; x: number }[] {
  return db
    .select({ period: classMonth, siteId: attempts.siteId, instructorId: attempts.instructorId, n: sql<number>`count(*)`, x: countedOf(scope) })
    .from(attempts)
    .innerJoin(classes, eq(classes.id, attempts.classId))
    .where(conditionsOf(scope))
    .groupBy(classMonth, attempts.siteId, attempts.instructorId)
    .orderBy(classMonth)
    .all()
    .map((row) => ({ period: row.period, siteId: row.siteId, instructorId: row.instructorId, n: Number(row.n), x: Number(row.x ?? 0) }));
}

/** The rules over some rates around a centre; the limits are null without a useful point. */
export function runChartRules(rates: readonly number[], centre: number | null): RunChartRules {
  if (centre === null) return { median: null, useful: 0, longestRun: 0, longestRunLimit: null, crossings: 0, crossingsLimit: null, signal: false };
  const signals = runChartSignals(rates, centre);
  if (signals) {
    return {
      median: centre,
      useful: signals.useful,
      longestRun: signals.run,
      longestRunLimit: signals.longestRun,
      crossings: signals.crossings,
      crossingsLimit: signals.fewestCrossings,
      signal: signals.shift,
    };
  }
  // fewer than two useful points: one run of at most one point and no crossing, which signals nothing
  const useful = rates.filter((rate) => rate !== centre).length;
  const limits = useful > 0 ? runChartLimits(useful) : null;
  return {
    median: centre,
    useful,
    longestRun: useful,
    longestRunLimit: limits?.longestRun ?? null,
    crossings: 0,
    crossingsLimit: limits?.fewestCrossings ?? null,
    signal: false,
  };
}

function monthOf(date: string): string {
  return date.slice(0, 7);
}

/** A month's phase around a start date: its own month counts on neither side unless the start is its first day. */
export function phaseOfMonth(month: string, startDate: string): MonthPoint["phase"] {
  const startMonth = monthOf(startDate);
  if (month < startMonth) return "before";
  if (month > startMonth || startDate.endsWith("-01")) return "after";
  return "transition";
}

function centreOf(phase: PhaseCentre["phase"], points: readonly MonthPoint[]): PhaseCentre | null {
  const own = points.filter((point) => point.phase === phase);
  if (own.length === 0) return null;
  const centre = median(own.map((point) => point.rate));
  return {
    phase,
    from: own[0].period,
    to: own[own.length - 1].period,
    median: centre,
    rules: runChartRules(
      own.map((point) => point.rate),
      centre,
    ),
  };
}

export interface MonthlyRunChartOptions {
  /** The median is taken over the months of quarters up to this one, and the rules judge every month around it. */
  baselineTo?: string;
  /**
   * Split at an action's start: each side gets its own median, and the rules judge the months after the start
   * around the median of the months before it.
   */
  splitAt?: string;
}

export function monthlyRunChart(db: Db, scope: MonthlyScope, options: MonthlyRunChartOptions = {}): MonthlyRunChart {
  const points: MonthPoint[] = monthlyCounts(db, scope).map((row) => ({
    ...row,
    rate: row.x / row.n,
    phase: options.splitAt === undefined ? null : phaseOfMonth(row.period, options.splitAt),
  }));
  const baselineTo = options.baselineTo;
  const baseline =
    options.splitAt !== undefined
      ? points.filter((point) => point.phase === "before")
      : baselineTo !== undefined
        ? points.filter((point) => quarterOf(`${point.period}-01`) <= baselineTo)
        : points;
  const centre = median(baseline.map((point) => point.rate));
  const phases = options.splitAt === undefined ? [] : [centreOf("before", points), centreOf("after", points)].flatMap((phase) => (phase ? [phase] : []));
  // split at a start, the question is whether the months after it left the level of the months before
  const judged = options.splitAt === undefined ? points : points.filter((point) => point.phase === "after");
  return {
    aim: scope.aim ?? "passRate",
    baseline: baseline.length === 0 ? null : { from: baseline[0].period, to: baseline[baseline.length - 1].period, months: baseline.length },
    points,
    ...runChartRules(
      judged.map((point) => point.rate),
      centre,
    ),
    phases,
  };
}
