// How each instructor's pass/fail compares with the measurement: their own 2×2 table, how lenient they are
// (measured failures they passed) and how strict (measured passes they failed), and their kappa. Attempts
// without the instructor's judgement are left out.
import { and, eq, isNotNull, sql } from "drizzle-orm";
import { cohensKappa } from "../../shared/stats/kappa";
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

export function calibrationByInstructor(db: Db, quarter: string): InstructorCalibration[] {
  const rows = db
    .select({
      instructor: instructors.code,
      pp: sql<number>`sum(${attempts.instructorResult} = 'pass' AND ${attempts.passed} = 1)`,
      pf: sql<number>`sum(${attempts.instructorResult} = 'pass' AND ${attempts.passed} = 0)`,
      fp: sql<number>`sum(${attempts.instructorResult} = 'fail' AND ${attempts.passed} = 1)`,
      ff: sql<number>`sum(${attempts.instructorResult} = 'fail' AND ${attempts.passed} = 0)`,
    })
    .from(attempts)
    .innerJoin(instructors, eq(instructors.id, attempts.instructorId))
    .where(and(eq(attempts.quarter, quarter), isNotNull(attempts.instructorResult)))
    .groupBy(instructors.code)
    .orderBy(instructors.code)
    .all();
  return rows.map(({ instructor, pp, pf, fp, ff }) => ({
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
