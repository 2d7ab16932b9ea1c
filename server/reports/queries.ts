// The raw numbers behind a funder report: class logs and equipment events from their tables, attempt figures
// from the attempt summaries (metrics/summaries), as every page and the statistics command read them. Nothing here is shown as is: data.ts applies
// small-cell suppression and formats. No query returns an instructor, learner or manikin id; sites and
// instructors leave only as counts.
import { and, count, countDistinct, gte, inArray, lt, sum } from "drizzle-orm";
import { courseTypes, feedbackModes, type CourseType, type FeedbackMode } from "../../shared/domain";
import { nextQuarter, quarterDates } from "../../shared/period";
import { patientTypes, type PatientType } from "../../shared/scoring/policy";
import { attemptErrorNames } from "../../shared/scoring/scoreAttempt";
import type { KappaTable } from "../../shared/stats";
import type { Db } from "../db/client";
import { classes, equipmentEvents } from "../db/schema";
import { addTally, distinctIn, emptyTally, networkScope, talliesBy, talliesByPair, totalTally, type SummaryScope } from "../metrics/summaries";

export interface PassTally {
  attempts: number;
  passed: number;
}

export interface ReportNumbers {
  classes: number;
  learners: number;
  /** Learners the instructors recorded as having completed the course. */
  completions: number;
  sites: number;
  instructors: number;
  byCourse: Record<CourseType, { classes: number; learners: number }>;
  attempts: PassTally;
  byPatientType: Record<PatientType, PassTally>;
  byFeedback: Record<FeedbackMode, PassTally>;
  /** Attempts showing each error, in attemptErrorNames order. */
  errorCounts: number[];
  attemptsWithErrors: number;
  /** Rows: instructor said pass / fail; columns: measured pass / fail. */
  agreement: KappaTable;
  manikinsUsed: number;
  compressions: number;
  /** null when no class of the period recorded the item at all. */
  lungsReplaced: number | null;
  mouthpiecesCleaned: number | null;
  batteriesReplaced: number | null;
  services: number;
  faults: number;
  /** Policy versions the period's attempts were scored under. */
  policyVersions: number[];
}

const asNumber = (value: unknown) => Number(value ?? 0);

/** The whole network over the span of `quarters` (a report's quarters are always consecutive). */
export function reportScope(quarters: readonly string[]): SummaryScope {
  const sorted = [...quarters].sort();
  return networkScope(sorted[0], sorted[sorted.length - 1]);
}

/** First day of the quarters and first day after them, for tables that carry dates rather than quarters. */
function dateSpan(quarters: readonly string[]): [string, string] {
  const { from, to } = reportScope(quarters);
  return [quarterDates(from).first, quarterDates(nextQuarter(to)).first];
}

export function reportNumbers(db: Db, quarters: readonly string[]): ReportNumbers {
  const inPeriod = inArray(classes.quarter, [...quarters]);

  const classTotals = db
    .select({
      classes: count(),
      learners: sum(classes.learners),
      completions: sum(classes.passed),
      sites: countDistinct(classes.siteId),
      instructors: countDistinct(classes.instructorId),
      lungs: sum(classes.lungsReplaced),
      mouthpieces: sum(classes.mouthpiecesCleaned),
      batteries: sum(classes.batteriesReplaced),
      lungsRecorded: count(classes.lungsReplaced),
      mouthpiecesRecorded: count(classes.mouthpiecesCleaned),
      batteriesRecorded: count(classes.batteriesReplaced),
    })
    .from(classes)
    .where(inPeriod)
    .get()!;

  const byCourse = Object.fromEntries(courseTypes.map((c) => [c, { classes: 0, learners: 0 }])) as ReportNumbers["byCourse"];
  for (const row of db
    .select({ course: classes.course, classes: count(), learners: sum(classes.learners) })
    .from(classes)
    .where(inPeriod)
    .groupBy(classes.course)
    .all()) {
    byCourse[row.course] = { classes: row.classes, learners: asNumber(row.learners) };
  }

  const byPatientType = Object.fromEntries(patientTypes.map((p) => [p, { attempts: 0, passed: 0 }])) as ReportNumbers["byPatientType"];
  const byFeedback = Object.fromEntries(feedbackModes.map((f) => [f, { attempts: 0, passed: 0 }])) as ReportNumbers["byFeedback"];
  const scope = reportScope(quarters);
  const pairs = talliesByPair(db, scope, "profile", "feedback");
  for (const [key, tally] of pairs) {
    const [profile, feedback] = key.split("|") as [PatientType, FeedbackMode];
    for (const target of [byPatientType[profile], byFeedback[feedback]]) {
      target.attempts += tally.n;
      target.passed += tally.passed;
    }
  }
  const all = [...pairs.values()].reduce(addTally, emptyTally());
  const total: PassTally = { attempts: all.n, passed: all.passed };

  const [from, before] = dateSpan(quarters);
  const eventCounts = db
    .select({ event: equipmentEvents.event, quantity: sum(equipmentEvents.quantity) })
    .from(equipmentEvents)
    .where(and(gte(equipmentEvents.date, from), lt(equipmentEvents.date, before), inArray(equipmentEvents.event, ["serviced", "fault"])))
    .groupBy(equipmentEvents.event)
    .all();
  const eventTotal = (event: string) => asNumber(eventCounts.find((row) => row.event === event)?.quantity);

  return {
    classes: classTotals.classes,
    learners: asNumber(classTotals.learners),
    completions: asNumber(classTotals.completions),
    sites: classTotals.sites,
    instructors: classTotals.instructors,
    byCourse,
    attempts: total,
    byPatientType,
    byFeedback,
    errorCounts: attemptErrorNames.map((name) => all.errors[name]),
    attemptsWithErrors: all.withErrors,
    agreement: [
      [all.pp, all.pf],
      [all.fp, all.ff],
    ],
    manikinsUsed: distinctIn(db, scope, "manikinId").filter((id) => id !== 0).length,
    compressions: all.compressions,
    lungsReplaced: classTotals.lungsRecorded > 0 ? asNumber(classTotals.lungs) : null,
    mouthpiecesCleaned: classTotals.mouthpiecesRecorded > 0 ? asNumber(classTotals.mouthpieces) : null,
    batteriesReplaced: classTotals.batteriesRecorded > 0 ? asNumber(classTotals.batteries) : null,
    services: eventTotal("serviced"),
    faults: eventTotal("fault"),
    policyVersions: distinctIn(db, scope, "policyVersion").map(Number),
  };
}

/** Attempts and passes per quarter, for the trend and the comparisons; quarters without attempts give zeros. */
export function passTallyByQuarter(db: Db, quarters: readonly string[]): Map<string, PassTally> {
  const tallies = new Map<string, PassTally>(quarters.map((q) => [q, { attempts: 0, passed: 0 }]));
  for (const [quarter, tally] of talliesBy<string>(db, reportScope(quarters), "quarter")) {
    if (tallies.has(quarter)) tallies.set(quarter, { attempts: tally.n, passed: tally.passed });
  }
  return tallies;
}

/** True when the period has at least one class or attempt. */
export function periodHasData(db: Db, quarters: readonly string[]): boolean {
  const classRow = db
    .select({ n: count() })
    .from(classes)
    .where(inArray(classes.quarter, [...quarters]))
    .get();
  if ((classRow?.n ?? 0) > 0) return true;
  return totalTally(db, reportScope(quarters)).n > 0;
}
