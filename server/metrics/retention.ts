// Skill retention across recertifications. A learner returns when their pseudonymous code has an attempt in
// a class dated later than an earlier class of theirs; the time since that earlier class (days ÷ 30.4375,
// the mean month) places the return in a bin, and the outcome is whether their first attempt in the
// returning class (by start time, ties by attempt id) passed. Learners with no earlier class in the data are
// first-timers. The period selects the returning (or first) class by its date. By patient type, the outcome
// is the learner's first attempt on that patient type in the class; the gap still runs from their previous
// class of any kind, since a recertification follows the learner's last course whatever it practised.
import { sql } from "drizzle-orm";
import type { PatientType } from "../../shared/scoring/policy";
import { quarterDates, quarterOf } from "../../shared/period";
import { retentionBins, type RetentionBin } from "../../shared/schemas/learners";
import { wilsonInterval } from "../../shared/stats/wilson";
import type { Db } from "../db/client";
import { attempts, classes } from "../db/schema";

export const DAYS_PER_MONTH = 30.4375;
export { retentionBins, type RetentionBin };

export interface RetentionGroup {
  /** Learner–class pairs. */
  learners: number;
  /** Of those, pairs whose first attempt in the class passed. */
  passed: number;
  rate: number | null;
  ci95: [number, number] | null;
}

export interface Retention {
  first_time: RetentionGroup;
  returning: ({ months: RetentionBin } & RetentionGroup)[];
}

/** The bin of a gap in months: [0, 6), [6, 12), [12, 18), [18, 24), 24 or more. */
export function retentionBin(months: number): RetentionBin {
  if (months < 6) return "0-6";
  if (months < 12) return "6-12";
  if (months < 18) return "12-18";
  if (months < 24) return "18-24";
  return "24+";
}

/** Whole days from one ISO date to a later one. */
function daysBetween(earlier: string, later: string): number {
  return (Date.parse(`${later}T00:00:00Z`) - Date.parse(`${earlier}T00:00:00Z`)) / 86_400_000;
}

function group(learners: number, passed: number): RetentionGroup {
  return { learners, passed, rate: learners === 0 ? null : passed / learners, ci95: wilsonInterval(passed, learners) };
}

/** Each learner–class pair of the quarters `from` to `to`: the class's date, whether its first attempt passed, and the learner's previous class date. */
function retentionPairs(db: Db, from: string, to: string, profile: PatientType | null) {
  const first = quarterDates(from).first;
  const last = quarterDates(to).last;
  const ofProfile = profile === null ? sql`1` : sql`${attempts.profile} = ${profile}`;
  return db.all<{ date: string; passed: number; previous_date: string | null }>(sql`
    WITH firsts AS (
      SELECT ${attempts.learner} AS learner, ${attempts.classId} AS class_id, ${classes.date} AS date, ${attempts.passed} AS passed,
        row_number() OVER (PARTITION BY ${attempts.learner}, ${attempts.classId} ORDER BY ${attempts.startedAt}, ${attempts.id}) AS k
      FROM ${attempts} JOIN ${classes} ON ${classes.id} = ${attempts.classId}
      WHERE ${ofProfile}
    ), pairs AS (SELECT learner, class_id, date, passed FROM firsts WHERE k = 1),
    learner_classes AS (
      SELECT DISTINCT ${attempts.learner} AS learner, ${classes.date} AS date
      FROM ${attempts} JOIN ${classes} ON ${classes.id} = ${attempts.classId}
    )
    SELECT p.date, p.passed,
      (SELECT max(q.date) FROM learner_classes q WHERE q.learner = p.learner AND q.date < p.date) AS previous_date
    FROM pairs p WHERE p.date BETWEEN ${first} AND ${last}`);
}

function retentionOf(pairs: ReturnType<typeof retentionPairs>): Retention {
  const firstTime = { learners: 0, passed: 0 };
  const byBin = new Map(retentionBins.map((bin) => [bin, { learners: 0, passed: 0 }]));
  for (const pair of pairs) {
    const tally = pair.previous_date === null ? firstTime : byBin.get(retentionBin(daysBetween(pair.previous_date, pair.date) / DAYS_PER_MONTH))!;
    tally.learners += 1;
    tally.passed += pair.passed;
  }
  return {
    first_time: group(firstTime.learners, firstTime.passed),
    returning: retentionBins.map((months) => ({ months, ...group(byBin.get(months)!.learners, byBin.get(months)!.passed) })),
  };
}

export function retention(db: Db, from: string, to: string, profile: PatientType | null = null): Retention {
  return retentionOf(retentionPairs(db, from, to, profile));
}

/** Retention of each quarter from `from` to `to` that has learner–class pairs, from one read (the funder report's disclosure control judges them all). */
export function retentionByQuarter(db: Db, from: string, to: string): Map<string, Retention> {
  const byQuarter = new Map<string, ReturnType<typeof retentionPairs>>();
  for (const pair of retentionPairs(db, from, to, null)) {
    const quarter = quarterOf(pair.date);
    const list = byQuarter.get(quarter);
    if (list) list.push(pair);
    else byQuarter.set(quarter, [pair]);
  }
  return new Map([...byQuarter].map(([quarter, pairs]) => [quarter, retentionOf(pairs)]));
}
