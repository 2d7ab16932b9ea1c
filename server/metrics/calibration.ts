// How each instructor's pass/fail compares with the measurement: their own 2×2 table, how lenient they are
// (measured failures they passed) and how strict (measured passes they failed), and their kappa. Attempts
// without the instructor's judgement are left out.
import { and, between, eq, isNotNull, sql } from "drizzle-orm";
import { kappaInterval } from "../../shared/stats/agreement";
import { cohensKappa } from "../../shared/stats/kappa";
import { wilsonInterval } from "../../shared/stats/wilson";
import type { Db } from "../db/client";
import { attempts, instructors } from "../db/schema";

export interface InstructorCalibration {
  instructor: string;
  judged: number;
  both_pass: number;
  instructor_pass_measured_fail: number;
  instructor_fail_measured_pass: number;
  both_fail: number;
  /** Measured failures the instructor passed, of the measured failures they judged; null without any. */
  lenient_share: number | null;
  /** Measured passes the instructor failed, of the measured passes they judged; null without any. */
  strict_share: number | null;
  kappa: number | null;
}

/** The quarter's (or, with `to`, the quarters from `quarter` to `to`) table per instructor, by code. */
export function calibrationByInstructor(db: Db, quarter: string, to: string = quarter): InstructorCalibration[] {
  return calibrationCells(db, quarter, to).map(({ instructorId: _id, name: _name, ...row }) => row);
}

function calibrationCells(db: Db, from: string, to: string): (InstructorCalibration & { instructorId: number; name: string })[] {
  const rows = db
    .select({
      instructorId: instructors.id,
      name: instructors.name,
      instructor: instructors.code,
      pp: sql<number>`sum(${attempts.instructorResult} = 'pass' AND ${attempts.passed} = 1)`,
      pf: sql<number>`sum(${attempts.instructorResult} = 'pass' AND ${attempts.passed} = 0)`,
      fp: sql<number>`sum(${attempts.instructorResult} = 'fail' AND ${attempts.passed} = 1)`,
      ff: sql<number>`sum(${attempts.instructorResult} = 'fail' AND ${attempts.passed} = 0)`,
    })
    .from(attempts)
    .innerJoin(instructors, eq(instructors.id, attempts.instructorId))
    .where(and(between(attempts.quarter, from, to), isNotNull(attempts.instructorResult)))
    .groupBy(instructors.id)
    .orderBy(instructors.code)
    .all();
  return rows.map(({ instructorId, name, instructor, pp, pf, fp, ff }) => ({
    instructorId,
    name,
    instructor,
    judged: pp + pf + fp + ff,
    both_pass: pp,
    instructor_pass_measured_fail: pf,
    instructor_fail_measured_pass: fp,
    both_fail: ff,
    lenient_share: pf + ff === 0 ? null : pf / (pf + ff),
    strict_share: pp + fp === 0 ? null : fp / (pp + fp),
    kappa: cohensKappa([
      [pp, pf],
      [fp, ff],
    ]).kappa,
  }));
}

export interface InstructorCalibrationDetail extends InstructorCalibration {
  instructorId: number;
  name: string;
  /** Wilson 95 % intervals of the two shares; κ's large-sample 95 % interval (shared/stats/agreement.ts). */
  lenient_ci95: [number, number] | null;
  strict_ci95: [number, number] | null;
  kappa_ci95: [number, number] | null;
}

/** Each instructor's table over a period of quarters, with the intervals the calibration page shows. */
export function calibrationDetail(db: Db, from: string, to: string): InstructorCalibrationDetail[] {
  return calibrationCells(db, from, to).map((row) => {
    const measuredFail = row.instructor_pass_measured_fail + row.both_fail;
    const measuredPass = row.both_pass + row.instructor_fail_measured_pass;
    return {
      ...row,
      lenient_ci95: wilsonInterval(row.instructor_pass_measured_fail, measuredFail),
      strict_ci95: wilsonInterval(row.instructor_fail_measured_pass, measuredPass),
      kappa_ci95: kappaInterval([
        [row.both_pass, row.instructor_pass_measured_fail],
        [row.instructor_fail_measured_pass, row.both_fail],
      ]),
    };
  });
}
