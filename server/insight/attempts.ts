// The attempt list (paged, filtered) and one attempt in full with its score history and decoded stream.
import { and, desc, eq, sql, type SQL } from "drizzle-orm";
import type { AttemptDetailAnswer, AttemptListAnswer, AttemptRow } from "../../shared/schemas/insight";
import { bandFor } from "../../shared/scoring/policy";
import { maskToErrors } from "../../shared/scoring/scoreAttempt";
import type { Db } from "../db/client";
import { attempts, compressionStreams, instructors, manikins, scoreHistory, sites } from "../db/schema";
import { notFound } from "../errors";
import { policyVersion } from "../policy/service";
import { decodeStream } from "../streams/codec";
import { attemptPlacement } from "./attemptPlacement";
import type { ResolvedFilters } from "./filters";
import type { Viewer } from "./viewer";
import { attemptOrder, attemptSearchConditions, hasStreamSql, type AttemptSearch } from "./attemptSearch";
import { errorLabels } from "../../shared/vocabulary";

export interface AttemptPage {
  page: number;
  pageSize: number;
}

const rowColumns = {
  attempt: attempts,
  siteCode: sites.code,
  instructorCode: instructors.code,
  manikinAssetId: manikins.assetId,
  hasStream: hasStreamSql,
};

type JoinedRow = {
  attempt: typeof attempts.$inferSelect;
  siteCode: string | null;
  instructorCode: string | null;
  manikinAssetId: string | null;
  hasStream: number;
};

/** The ids `selectRows` would give, with the same joins, so that any of the list's sort orders applies. */
export function selectRowIds(db: Db, where: SQL) {
  return db
    .select({ id: attempts.id })
    .from(attempts)
    .leftJoin(sites, eq(attempts.siteId, sites.id))
    .leftJoin(instructors, eq(attempts.instructorId, instructors.id))
    .leftJoin(manikins, eq(attempts.manikinId, manikins.id))
    .where(where);
}

export function selectRows(db: Db, where: SQL) {
  return db
    .select(rowColumns)
    .from(attempts)
    .leftJoin(sites, eq(attempts.siteId, sites.id))
    .leftJoin(instructors, eq(attempts.instructorId, instructors.id))
    .leftJoin(manikins, eq(attempts.manikinId, manikins.id))
    .where(where);
}

export function toRow({ attempt: a, siteCode, instructorCode, manikinAssetId, hasStream }: JoinedRow): AttemptRow {
  return {
    id: a.id,
    classId: a.classId,
    learner: a.learner,
    startedAt: a.startedAt,
    quarter: a.quarter,
    profile: a.profile,
    feedback: a.feedback,
    site: siteCode === null ? null : { id: a.siteId, code: siteCode },
    instructor: instructorCode === null ? null : { id: a.instructorId, code: instructorCode },
    manikin: a.manikinId === null || manikinAssetId === null ? null : { id: a.manikinId, assetId: manikinAssetId },
    metrics: {
      durationS: a.durationS,
      compressions: a.compressions,
      rateCpm: a.rateCpm,
      depthMm: a.depthMm,
      depthOkPct: a.depthOkPct,
      tooShallowPct: a.tooShallowPct,
      tooDeepPct: a.tooDeepPct,
      rateOkPct: a.rateOkPct,
      tooSlowPct: a.tooSlowPct,
      tooFastPct: a.tooFastPct,
      recoilOkPct: a.recoilOkPct,
      handsOnPct: a.handsOnPct,
      longestPauseS: a.longestPauseS,
      pauses: a.pauses,
      pausesOver10s: a.pausesOver10s,
    },
    score: a.score,
    passed: a.passed,
    instructorResult: a.instructorResult,
    errors: maskToErrors(a.errorMask),
    policyVersion: a.policyVersion,
    source: a.source,
    hasStream: hasStream === 1,
  };
}

/** One page of the attempts the filters and search select, in the search's order, with their total. */
export function attemptList(db: Db, filters: ResolvedFilters, search: AttemptSearch, { page, pageSize }: AttemptPage): AttemptListAnswer {
  const where = attemptSearchConditions(filters, search);
  const total = db
    .select({ n: sql<number>`count(*)` })
    .from(attempts)
    .where(where)
    .get()!.n;
  const rows = selectRows(db, where)
    .orderBy(...attemptOrder(search))
    .limit(pageSize)
    .offset((page - 1) * pageSize)
    .all();
  return { page, pageSize, total, attempts: rows.map(toRow) };
}

/**
 * One attempt, with the rules that scored it and its place in the network for this viewer;
 * `onlyInstructorId` limits it to that instructor's attempts (anything else: 404).
 */
export function attemptDetail(db: Db, id: string, onlyInstructorId: number | null, viewer: Viewer): AttemptDetailAnswer {
  const conditions = [eq(attempts.id, id)];
  if (onlyInstructorId !== null) conditions.push(eq(attempts.instructorId, onlyInstructorId));
  const row = selectRows(db, and(...conditions)!).get();
  if (!row) throw notFound("The attempt");
  const attempt = toRow(row);

  const history = db
    .select()
    .from(scoreHistory)
    .where(eq(scoreHistory.attemptId, id))
    .orderBy(desc(scoreHistory.policyVersion))
    .all()
    .map((h) => ({ policyVersion: h.policyVersion, score: h.score, passed: h.passed, errors: maskToErrors(h.errorMask), replacedAt: h.replacedAt }));

  const policy = policyVersion(db, attempt.policyVersion)?.policy;
  const scoring: AttemptDetailAnswer["scoring"] = policy
    ? { passRule: policy.passRule, band: bandFor(policy, attempt.profile), pauseThresholdS: policy.pauseThresholdS, longPauseLimitS: policy.longPauseLimitS }
    : null;

  const blob = db.select({ data: compressionStreams.data }).from(compressionStreams).where(eq(compressionStreams.attemptId, id)).get();
  let stream: AttemptDetailAnswer["stream"] = null;
  if (blob) {
    const decoded = decodeStream(blob.data);
    stream = {
      compressions: decoded.tMs.length,
      t_ms: Array.from(decoded.tMs),
      depth_mm: Array.from(decoded.depthTenths, (tenths) => tenths / 10),
      release_mm: Array.from(decoded.releaseTenths, (tenths) => tenths / 10),
      band: bandFor(policy!, attempt.profile),
    };
  }
  return {
    attempt,
    scoring,
    placement: attemptPlacement(db, viewer, attempt),
    errorLabels: attempt.errors.map((error) => ({ error, label: errorLabels[error] })),
    scoreHistory: history,
    stream,
  };
}
