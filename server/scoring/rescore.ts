// Scores attempts again under the policy in force. Attempts scored under an older version get the new score;
// where the score, the result or the errors change, the old ones move to score_history first. All in one
// transaction: a failure leaves every attempt as it was.
import { analyzeSorted, emptyMetrics, type AttemptMetrics } from "../../shared/scoring/analyzeStream";
import { scoreAttempt, errorsToMask, type ScoringInput } from "../../shared/scoring/scoreAttempt";
import { bandFor, type NetworkPolicy, type PatientType } from "../../shared/scoring/policy";
import type { Db } from "../db/client";
import { currentPolicy } from "../policy/service";
import { decodeStream, tenthsToMm } from "../streams/codec";
import { refreshInstructorValues } from "../metrics/instructorValues";

const BATCH = 5_000;

/** A row as selected below: the scoring input's columns carry the same snake_case names in SQLite. */
interface StoredAttempt extends ScoringInput {
  rowid: number;
  id: string;
  profile: PatientType;
  score: number;
  passed: number;
  error_mask: number;
  policy_version: number;
  source: "summary" | "stream";
}

export interface RescoreResult {
  version: number;
  examined: number;
  changed: number;
}

export function rescoreAttempts(db: Db, fromQuarter?: string): RescoreResult {
  const { version, policy } = currentPolicy(db);
  const sqlite = db.$client;
  // plain prepared statements: a million rows through the query builder would cost minutes
  const nextBatch = sqlite.prepare(
    `SELECT rowid, id, profile, compressions, depth_ok_pct, too_shallow_pct, too_deep_pct, rate_ok_pct, too_slow_pct,
            too_fast_pct, recoil_ok_pct, hands_on_pct, longest_pause_s, score, passed, error_mask, policy_version, source
       FROM attempts
      WHERE rowid > ? AND policy_version <> ? AND quarter >= ?
      ORDER BY rowid LIMIT ?`,
  );
  const keepOld = sqlite.prepare(
    `INSERT INTO score_history (attempt_id, policy_version, score, passed, error_mask) VALUES (?, ?, ?, ?, ?)
     ON CONFLICT (attempt_id, policy_version) DO NOTHING`,
  );
  const update = sqlite.prepare("UPDATE attempts SET score = ?, passed = ?, error_mask = ?, policy_version = ? WHERE rowid = ?");
  // Attempts measured from a stored stream are measured again under the new bands and pause limits; a
  // device's summary can only be judged again under the new pass rule (its shares were counted by the device).
  const streamOf = sqlite.prepare("SELECT data FROM compression_streams WHERE attempt_id = ?").pluck();
  const updateMetrics = sqlite.prepare(
    `UPDATE attempts SET duration_s = ?, compressions = ?, rate_cpm = ?, depth_mm = ?, depth_ok_pct = ?, too_shallow_pct = ?,
            too_deep_pct = ?, rate_ok_pct = ?, too_slow_pct = ?, too_fast_pct = ?, recoil_ok_pct = ?, hands_on_pct = ?,
            pauses = ?, longest_pause_s = ?, pauses_over10s = ? WHERE rowid = ?`,
  );
  const measured = emptyMetrics();
  const remeasure = (row: StoredAttempt): StoredAttempt => {
    const blob = streamOf.get(row.id) as Buffer | undefined;
    if (!blob) return row;
    const m = measureStream(blob, row.profile, policy, measured);
    updateMetrics.run(
      m.duration_s,
      m.compressions,
      m.rate_cpm,
      m.depth_mm,
      m.depth_ok_pct,
      m.too_shallow_pct,
      m.too_deep_pct,
      m.rate_ok_pct,
      m.too_slow_pct,
      m.too_fast_pct,
      m.recoil_ok_pct,
      m.hands_on_pct,
      m.pauses,
      m.longest_pause_s,
      m.pauses_over_10s,
      row.rowid,
    );
    return { ...row, ...m };
  };

  return sqlite.transaction((): RescoreResult => {
    let examined = 0;
    let changed = 0;
    let after = 0;
    for (;;) {
      const rows = nextBatch.all(after, version, fromQuarter ?? "", BATCH) as StoredAttempt[];
      if (rows.length === 0) break;
      for (const stored of rows) {
        const row = stored.source === "stream" ? remeasure(stored) : stored;
        const result = scoreAttempt(row, row.profile, policy);
        const mask = errorsToMask(result.errors);
        const passed = result.passed ? 1 : 0;
        if (result.score !== row.score || passed !== row.passed || mask !== row.error_mask) {
          keepOld.run(row.id, row.policy_version, row.score, row.passed, row.error_mask);
          changed += 1;
        }
        update.run(result.score, passed, mask, version, row.rowid);
      }
      examined += rows.length;
      after = rows[rows.length - 1].rowid;
    }
    refreshInstructorValues(sqlite);
    return { version, examined, changed };
  })();
}

function measureStream(blob: Buffer, profile: PatientType, policy: NetworkPolicy, out: AttemptMetrics): AttemptMetrics {
  const stream = decodeStream(blob);
  return analyzeSorted(
    stream.tMs,
    tenthsToMm(stream.depthTenths),
    tenthsToMm(stream.releaseTenths),
    0,
    stream.tMs.length,
    bandFor(policy, profile),
    policy,
    out,
  );
}
