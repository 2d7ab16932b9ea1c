// Writes attempts (from device summaries or analysed streams) with Quarterbeat's own score under the current
// policy; the device's score is never read. Shared by attempts.ts and compressions.ts.
import { startOutsideClassDate, type AttemptIdentity } from "../../shared/import/rows";
import type { AttemptMetrics } from "../../shared/scoring/analyzeStream";
import { errorsToMask, scoreAttempt, type ScoringInput } from "../../shared/scoring/scoreAttempt";
import { addAttemptsFrom } from "../metrics/deferredSummaries";
import { RowStore, type WriteOutcome } from "./rowStore";
import type { ClassInfo, ImportRun, RowProblem } from "./run";

export const ATTEMPT_COLUMNS = [
  "id",
  "class_id",
  "learner",
  "manikin_id",
  "profile",
  "feedback",
  "started_at",
  "quarter",
  "site_id",
  "instructor_id",
  "duration_s",
  "compressions",
  "rate_cpm",
  "depth_mm",
  "depth_ok_pct",
  "too_shallow_pct",
  "too_deep_pct",
  "rate_ok_pct",
  "too_slow_pct",
  "too_fast_pct",
  "recoil_ok_pct",
  "hands_on_pct",
  "longest_pause_s",
  "pauses",
  "pauses_over10s", // drizzle's snake_case of pausesOver10s
  "instructor_result",
  "source",
  "score",
  "passed",
  "error_mask",
  "policy_version",
  "batch_id",
] as const;

const SOURCE = ATTEMPT_COLUMNS.indexOf("source");
const INSTRUCTOR = ATTEMPT_COLUMNS.indexOf("instructor_id");

/** Metrics as stored: a summary has no pause count (null), a stream has. */
export type StoredMetrics = ScoringInput &
  Pick<AttemptMetrics, "duration_s" | "rate_cpm" | "depth_mm"> & {
    pauses: number | null;
    pauses_over_10s: number | null;
  };

export class AttemptStore {
  private readonly store: RowStore;

  constructor(
    private readonly run: ImportRun,
    private readonly source: "summary" | "stream",
    batchRows = 1,
  ) {
    const own = run.restrictedToInstructor;
    this.store = new RowStore(run.sqlite, {
      table: "attempts",
      key: "id",
      columns: ATTEMPT_COLUMNS,
      write: run.write,
      batchId: run.batchId,
      recordChange: run.recordChange,
      batchRows,
      // a batched store serves summary rows, which nothing refers to within the import (a stream refers to its attempt)
      stage: batchRows > 1,
      refuse: (existing, values) => {
        if (own !== null && existing[INSTRUCTOR] !== own) {
          return `attempt ${String(values[0])} is already recorded for another instructor's class`;
        }
        if (existing[SOURCE] !== values[SOURCE]) {
          return existing[SOURCE] === "stream"
            ? `attempt ${String(values[0])} was imported from its compression stream; a summary row cannot replace it`
            : `attempt ${String(values[0])} was imported as a summary; import the stream under a new attempt id or undo that batch first`;
        }
        return null;
      },
    });
  }

  /** Settles what is still queued (each row's outcome is known after this). */
  flush() {
    this.store.flush();
  }

  /** Writes the staged new attempts and adds them to the summaries; once the file is accepted. */
  writeStaged() {
    const staged = this.store.stagedTable;
    if (staged === null) return;
    addAttemptsFrom(this.run.sqlite, staged, () => this.store.writeStaged());
    this.store.clearStaged();
  }

  /**
   * The class of an attempt, or a reason it may not be imported: the class must exist (in the database or
   * an earlier file of the same command) and, for an instructor, be their own.
   */
  classFor(classId: string): ClassInfo | string {
    const info = this.run.classInfo(classId);
    if (!info) return `class ${classId} is not in the database or in an earlier file of this import; import its class log first`;
    const own = this.run.restrictedToInstructor;
    if (own !== null && info.instructorId !== own) {
      return `class ${classId} is another instructor's class; instructors may import attempts only for their own classes`;
    }
    return info;
  }

  /**
   * Why an attempt does not fit its class, or null: its start must lie within a day of the class date, and an
   * instructor's file may not name a manikin the network does not have.
   */
  classFitIssue(identity: AttemptIdentity, cls: ClassInfo): RowProblem | null {
    const start = startOutsideClassDate(identity.startedAt, cls.date);
    if (start) return { column: "started_at", reason: start };
    if (identity.manikin === null || !this.run.instructorScope) return null;
    return this.run.instructorScope.manikinIssue("manikin", identity.manikin);
  }

  /** Scores and writes an attempt; `done` gets the outcome, at once or when the queued batch is written. */
  write(identity: AttemptIdentity, cls: ClassInfo, metrics: StoredMetrics, done: (outcome: WriteOutcome, refusal: string) => void) {
    const run = this.run;
    const { policy, version } = run.policy;
    const scored = scoreAttempt(metrics, identity.profile, policy);
    const manikinId = identity.manikin === null ? null : run.codes.manikin(identity.manikin, cls.siteId);
    this.store.queue(
      [
        identity.id,
        identity.classId,
        identity.learner,
        manikinId,
        identity.profile,
        identity.feedback,
        identity.startedAt,
        cls.quarter,
        cls.siteId,
        cls.instructorId,
        metrics.duration_s,
        metrics.compressions,
        metrics.rate_cpm,
        metrics.depth_mm,
        metrics.depth_ok_pct,
        metrics.too_shallow_pct,
        metrics.too_deep_pct,
        metrics.rate_ok_pct,
        metrics.too_slow_pct,
        metrics.too_fast_pct,
        metrics.recoil_ok_pct,
        metrics.hands_on_pct,
        metrics.longest_pause_s,
        metrics.pauses,
        metrics.pauses_over_10s,
        identity.instructorResult,
        this.source,
        scored.score,
        scored.passed ? 1 : 0,
        errorsToMask(scored.errors),
        version,
        run.batchId,
      ],
      done,
    );
  }
}
