// Raw compression streams: one row per compression, rows of an attempt anywhere in the file. Each attempt is
// analysed with the scoring core and stored as an attempt (source "stream") plus its packed stream.
import type { RowReader } from "../../shared/import/rows";
import { analyzeSorted, emptyMetrics } from "../../shared/scoring/analyzeStream";
import { bandFor } from "../../shared/scoring/policy";
import { encodeStream } from "../streams/codec";
import { StreamCollector } from "../streams/collector";
import { StreamGrouper } from "../streams/grouper";
import { AttemptStore, type StoredMetrics } from "./attemptStore";
import type { KindImporter } from "./kind";
import { RowStore, type WriteOutcome } from "./rowStore";
import type { ClassInfo, ImportRun } from "./run";

export function compressionsImporter(
  run: ImportRun,
  reader: RowReader,
  bufferRows?: number,
): KindImporter & { attemptsRead(): number; attemptsRejected(): number } {
  const attempts = new AttemptStore(run, "stream");
  const streams = new RowStore(run.sqlite, {
    table: "compression_streams",
    key: "attempt_id",
    columns: ["attempt_id", "compressions", "data", "batch_id"],
    write: run.write,
    batchId: run.batchId,
    recordChange: run.recordChange,
  });
  const grouper = new StreamGrouper(run.sqlite, bufferRows);
  const classes = new Map<number, ClassInfo>();
  const collector = new StreamCollector(reader, grouper, {
    accept(attempt) {
      const cls = attempts.classFor(attempt.identity!.classId);
      if (typeof cls === "string") return { column: "class_id", reason: cls };
      const misfit = attempts.classFitIssue(attempt.identity!, cls);
      if (misfit) return misfit;
      classes.set(attempt.idx, cls);
      return null;
    },
    reject: (fields, issues) => run.rejectRow(fields, issues),
  });

  return {
    unit: "attempts",
    attemptsRead: () => collector.attempts.length,
    attemptsRejected: () => collector.badAttempts,
    row(fields, row) {
      collector.row(fields, row);
    },
    finish() {
      const { policy } = run.policy;
      const out = emptyMetrics();
      let depthMm = new Float64Array(1024);
      let releaseMm = new Float64Array(1024);
      for (const { attempt, stream } of collector.complete()) {
        const n = stream.n;
        if (n > depthMm.length) {
          depthMm = new Float64Array(n * 2);
          releaseMm = new Float64Array(n * 2);
        }
        // Analysed at the stored precision (tenths of a mm), so re-analysing a stored stream gives the same.
        for (let i = 0; i < n; i++) {
          depthMm[i] = stream.depthTenths[i] / 10;
          releaseMm[i] = stream.releaseTenths[i] / 10;
        }
        const identity = attempt.identity!;
        analyzeSorted(stream.tMs, depthMm, releaseMm, 0, n, bandFor(policy, identity.profile), policy, out);
        if (n < 2) run.warnings.push(`Attempt ${identity.id} has only ${n} compression; it is stored but cannot pass.`);
        const metrics: StoredMetrics = out;
        const blob = encodeStream(stream.tMs, stream.depthTenths, stream.releaseTenths, 0, n);
        // Unbatched: the outcome arrives at once, and the stream is written beside its attempt.
        attempts.write(identity, classes.get(attempt.idx)!, metrics, (outcome, refusal) => {
          if (outcome === "refused" || outcome === "duplicate") {
            attempt.bad = true;
            attempt.issueRows++;
            run.rejectRow([], [{ row: attempt.firstRow, column: "attempt_id", reason: refusal || `attempt ${identity.id} appears twice` }]);
            return;
          }
          const streamOutcome: WriteOutcome = streams.write([identity.id, n, blob, run.batchId]);
          run.count(outcome === "inserted" ? "inserted" : outcome === "updated" || streamOutcome === "updated" ? "updated" : "unchanged");
        });
      }
      run.rejectedRows += collector.rowsRefusedWithAttempt;
      grouper.dispose();
    },
  };
}
