// Class logs as rows with Quarterbeat's pass rate over each class's attempts, and one class in full.
import { and, desc, eq, inArray, sql, type SQL } from "drizzle-orm";
import type { ClassDetailAnswer, ClassRow } from "../../shared/schemas/insight";
import { maskToErrors } from "../../shared/scoring/scoreAttempt";
import type { Db } from "../db/client";
import { attempts, classes, compressionStreams, instructors, sites } from "../db/schema";
import { notFound } from "../errors";
import { rateOf } from "./rates";

/** Class rows matching `where` (conditions on classes), newest first, with their attempts counted. */
export function classRows(db: Db, where: SQL, limit = 500): ClassRow[] {
  const logs = db
    .select({ id: classes.id, date: classes.date, course: classes.course, learners: classes.learners, passed: classes.passed })
    .from(classes)
    .where(where)
    .orderBy(desc(classes.date), classes.id)
    .limit(limit)
    .all();
  if (logs.length === 0) return [];
  const counts = new Map(
    db
      .select({ classId: attempts.classId, n: sql<number>`count(*)`, passed: sql<number>`sum(${attempts.passed})` })
      .from(attempts)
      .where(
        inArray(
          attempts.classId,
          logs.map((log) => log.id),
        ),
      )
      .groupBy(attempts.classId)
      .all()
      .map((row) => [row.classId, row]),
  );
  return logs.map((log) => {
    const tally = counts.get(log.id);
    return { ...log, attempts: tally?.n ?? 0, passRate: rateOf(tally?.passed ?? 0, tally?.n ?? 0) };
  });
}

/** One class log with its attempts. `instructorId` limits it to that instructor's classes (others: 404). */
export function classDetail(db: Db, id: string, instructorId: number | null): ClassDetailAnswer {
  const conditions = [eq(classes.id, id)];
  if (instructorId !== null) conditions.push(eq(classes.instructorId, instructorId));
  const log = db
    .select({
      class: classes,
      siteCode: sites.code,
      instructorCode: instructors.code,
      instructorName: instructors.name,
    })
    .from(classes)
    .innerJoin(sites, eq(classes.siteId, sites.id))
    .innerJoin(instructors, eq(classes.instructorId, instructors.id))
    .where(and(...conditions))
    .get();
  if (!log) throw notFound("The class");
  const rows = db
    .select({
      id: attempts.id,
      learner: attempts.learner,
      startedAt: attempts.startedAt,
      profile: attempts.profile,
      feedback: attempts.feedback,
      score: attempts.score,
      passed: attempts.passed,
      instructorResult: attempts.instructorResult,
      errorMask: attempts.errorMask,
      hasStream: sql<number>`EXISTS (SELECT 1 FROM ${compressionStreams} WHERE ${compressionStreams.attemptId} = ${attempts.id})`,
    })
    .from(attempts)
    .where(eq(attempts.classId, id))
    .orderBy(attempts.startedAt, attempts.id)
    .all();
  const c = log.class;
  return {
    class: {
      id: c.id,
      date: c.date,
      quarter: c.quarter,
      course: c.course,
      site: { id: c.siteId, code: log.siteCode },
      instructor: { id: c.instructorId, code: log.instructorCode, name: log.instructorName },
      learners: c.learners,
      passed: c.passed,
      manikins: c.manikins
        .split(";")
        .map((m) => m.trim())
        .filter(Boolean),
      lungsReplaced: c.lungsReplaced,
      mouthpiecesCleaned: c.mouthpiecesCleaned,
      batteriesReplaced: c.batteriesReplaced,
    },
    passRate: rateOf(rows.filter((r) => r.passed).length, rows.length),
    attempts: rows.map(({ errorMask, hasStream, ...row }) => ({ ...row, errors: maskToErrors(errorMask), hasStream: hasStream === 1 })),
  };
}
