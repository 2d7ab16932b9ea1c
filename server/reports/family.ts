// The report family's disclosure decision: every count any funder report (each quarter's, each year's) shows,
// judged once over the cells quarter × category of each measure, so that no count hidden in one report can be
// worked out from counts shown in it or in any other (shared/suppression.ts, releaseMeasure;
// docs/decisions/007-report-disclosure.md). Every report, its PDF, its CSV and the API read their hidden
// counts from here, so no two of them can disagree.
import { count, sum } from "drizzle-orm";
import { courseTypes, feedbackModes } from "../../shared/domain";
import { patientTypes } from "../../shared/scoring/policy";
import { attemptErrorNames } from "../../shared/scoring/scoreAttempt";
import { hiddenReasonOf, measureShows, releaseMeasure, type FamilyCell, type MeasureCells, type MeasureRelease } from "../../shared/suppression";
import type { HiddenReason } from "../../shared/schemas/report";
import type { Db } from "../db/client";
import { classes } from "../db/schema";
import { cached } from "../insight/cache";
import { countsByGrid, networkScope, quartersWithAttempts, talliesBy } from "../metrics/summaries";
import { retentionBins, retentionByQuarter } from "../metrics/retention";

/**
 * What the reports count, and the breakdowns each is shown by. A report showing a new count adds it here;
 * a new breakdown of a count is listed with its measure, or the decision would never have judged its cells.
 */
export const FAMILY_MEASURES = {
  attempts: ["profile", "feedback"],
  judged: ["total"],
  errors: ["error"],
  attemptsWithErrors: ["total"],
  classes: ["course"],
  learners: ["course"],
  retention: ["group"],
} as const;

export type FamilyMeasure = keyof typeof FAMILY_MEASURES;
export type FamilyBreakdown = (typeof FAMILY_MEASURES)[FamilyMeasure][number];

export const TOTAL = "all";

export type FamilyCells = Record<FamilyMeasure, MeasureCells>;

/** The cells of every measure over every quarter with data: attempt figures from the summaries, class figures from the class logs. */
export function familyCells(db: Db): FamilyCells {
  const cells: FamilyCells = Object.fromEntries(
    Object.entries(FAMILY_MEASURES).map(([measure, breakdowns]) => [measure, Object.fromEntries(breakdowns.map((b) => [b, [] as FamilyCell[]]))]),
  ) as unknown as FamilyCells;
  const put = (measure: FamilyMeasure, breakdown: FamilyBreakdown, quarter: string, category: string, n: number) =>
    (cells[measure][breakdown] as FamilyCell[]).push({ quarter, category, count: n });

  // attempts by patient type and by display, with the judged ones, from one grouped read of the summaries
  const byProfile = new Map<string, number>();
  const byFeedback = new Map<string, number>();
  const judged = new Map<string, number>();
  const add = (map: Map<string, number>, key: string, n: number) => map.set(key, (map.get(key) ?? 0) + n);
  for (const row of countsByGrid(db, ["quarter", "profile", "feedback"])) {
    const [quarter, profile, feedback] = row.key.map(String);
    add(byProfile, `${quarter}|${profile}`, row.n);
    add(byFeedback, `${quarter}|${feedback}`, row.n);
    add(judged, quarter, row.judged);
  }
  const attemptQuarters = quartersWithAttempts(db).sort();
  for (const quarter of attemptQuarters) {
    for (const profile of patientTypes) put("attempts", "profile", quarter, profile, byProfile.get(`${quarter}|${profile}`) ?? 0);
    for (const mode of feedbackModes) put("attempts", "feedback", quarter, mode, byFeedback.get(`${quarter}|${mode}`) ?? 0);
    put("judged", "total", quarter, TOTAL, judged.get(quarter) ?? 0);
  }
  if (attemptQuarters.length > 0) {
    const scope = networkScope(attemptQuarters[0], attemptQuarters[attemptQuarters.length - 1]);
    for (const [quarter, tally] of talliesBy<string>(db, scope, "quarter")) {
      for (const name of attemptErrorNames) put("errors", "error", quarter, name, tally.errors[name]);
      put("attemptsWithErrors", "total", quarter, TOTAL, tally.withErrors);
    }
    for (const [quarter, answer] of retentionByQuarter(db, attemptQuarters[0], attemptQuarters[attemptQuarters.length - 1])) {
      put("retention", "group", quarter, "first_time", answer.first_time.learners);
      for (const bin of retentionBins) put("retention", "group", quarter, bin, answer.returning.find((r) => r.months === bin)?.learners ?? 0);
    }
  }

  const classRows = db
    .select({ quarter: classes.quarter, course: classes.course, classes: count(), learners: sum(classes.learners) })
    .from(classes)
    .groupBy(classes.quarter, classes.course)
    .all();
  for (const quarter of [...new Set(classRows.map((row) => row.quarter))].sort()) {
    for (const course of courseTypes) {
      const row = classRows.find((r) => r.quarter === quarter && r.course === course);
      put("classes", "course", quarter, course, row?.classes ?? 0);
      put("learners", "course", quarter, course, Number(row?.learners ?? 0));
    }
  }
  return cells;
}

/** The family's decision: for each count a report shows, whether it is hidden and why. */
export interface FamilyRelease {
  /**
   * Why the count `value` of `measure` over `quarters` (one quarter or a year's four) is hidden — in `category`
   * of `breakdown`, or over every category when `category` is null — or null when it is shown.
   */
  hidden(measure: FamilyMeasure, quarters: readonly string[], value: number, breakdown?: FamilyBreakdown, category?: string | null): HiddenReason | null;
}

export function decideFamily(cells: FamilyCells, minCount: number): FamilyRelease {
  const releases = Object.fromEntries(Object.entries(cells).map(([measure, measureCells]) => [measure, releaseMeasure(measureCells, minCount)])) as Record<
    FamilyMeasure,
    MeasureRelease
  >;
  return {
    hidden(measure, quarters, value, breakdown = FAMILY_MEASURES[measure][0], category = null) {
      // an empty count holds no one, and no pool counts on an empty cell, so "no data" never gives anything away
      if (value === 0) return null;
      return measureShows(releases[measure], quarters, breakdown, category) ? null : hiddenReasonOf(value, minCount);
    },
  };
}

/** The decision for the database as it is, made once per database state and threshold. */
export function familyRelease(db: Db, minCount: number): FamilyRelease {
  return cached(db, `report-family|${minCount}`, () => decideFamily(familyCells(db), minCount));
}
