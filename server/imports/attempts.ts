// Attempt summaries: one row per learner attempt as summarised by a feedback device. Stored with source
// "summary"; a summary has no pause count, so pauses and pauses_over_10s stay null.
import type { RowReader } from "../../shared/import/rows";
import { AttemptStore, type StoredMetrics } from "./attemptStore";
import type { KindImporter } from "./kind";
import type { ImportRun } from "./run";

/** Attempts per multi-row INSERT. */
const WRITE_BATCH_ROWS = 16;

export function attemptsImporter(run: ImportRun, reader: RowReader): KindImporter {
  const store = new AttemptStore(run, "summary", WRITE_BATCH_ROWS);
  // One metrics object reused for every row.
  const metrics: StoredMetrics = {
    compressions: 0,
    duration_s: 0,
    rate_cpm: 0,
    depth_mm: 0,
    depth_ok_pct: 0,
    too_shallow_pct: 0,
    too_deep_pct: 0,
    rate_ok_pct: 0,
    too_slow_pct: 0,
    too_fast_pct: 0,
    recoil_ok_pct: 0,
    hands_on_pct: 0,
    longest_pause_s: 0,
    pauses: null,
    pauses_over_10s: null,
  };

  return {
    unit: "rows",
    row(fields, row) {
      const issues = reader.issues;
      issues.length = 0;
      const a = reader.at(fields, row).attemptRow();
      if (!a) return run.rejectRow(fields, issues);
      const cls = store.classFor(a.classId);
      if (typeof cls === "string") {
        reader.fail("class_id", cls);
        return run.rejectRow(fields, issues);
      }
      const misfit = store.classFitIssue(a, cls);
      if (misfit) {
        reader.fail(misfit.column, misfit.reason);
        return run.rejectRow(fields, issues);
      }
      metrics.compressions = a.compressions;
      metrics.duration_s = a.durationS;
      metrics.rate_cpm = a.rateCpm;
      metrics.depth_mm = a.depthMm;
      metrics.depth_ok_pct = a.depthOkPct;
      metrics.too_shallow_pct = a.tooShallowPct;
      metrics.too_deep_pct = a.tooDeepPct;
      metrics.rate_ok_pct = a.rateOkPct;
      metrics.too_slow_pct = a.tooSlowPct;
      metrics.too_fast_pct = a.tooFastPct;
      metrics.recoil_ok_pct = a.recoilOkPct;
      metrics.hands_on_pct = a.handsOnPct;
      metrics.longest_pause_s = a.longestPauseS;
      store.write(a, cls, metrics, (outcome, refusal) => {
        if (outcome === "duplicate") run.rejectRow(fields, [{ row, column: "attempt_id", reason: `attempt ${a.id} appears more than once in this file` }]);
        else if (outcome === "refused") run.rejectRow(fields, [{ row, column: "attempt_id", reason: refusal }]);
        else run.count(outcome);
      });
    },
    finish() {
      store.flush();
    },
    beforeCommit() {
      store.writeStaged();
    },
  };
}
