// Scores the compression streams of a CSV file without the network's database: the analysis behind
// `quarterbeat analyze`. Same reading, grouping and precision as the importer (depths in tenths of a mm), so
// an attempt scores the same here as once imported under the same policy.
import Database from "better-sqlite3";
import { resolveHeader } from "../../shared/import/header";
import { identityMapping, type ImportMapping } from "../../shared/import/mapping";
import { patientTypeValues, RowReader, type CompressionValues, type RowIssue } from "../../shared/import/rows";
import { analyzeSorted, type AttemptMetrics } from "../../shared/scoring/analyzeStream";
import { bandFor, DEFAULT_POLICY, type NetworkPolicy, type PatientType } from "../../shared/scoring/policy";
import { scoreAttempt, type AttemptError } from "../../shared/scoring/scoreAttempt";
import { ISSUE_LIST_CAP } from "../imports/run";
import { readCsv, CsvSyntaxError, type ImportInput } from "../imports/csvInput";
import { StreamGrouper } from "./grouper";

export interface AnalyzedAttempt {
  attempt_id: string;
  profile: PatientType;
  metrics: AttemptMetrics;
  score: number;
  passed: boolean;
  errors: AttemptError[];
  reason?: string;
}

export interface AnalyzeResult {
  rowsRead: number;
  attempts: AnalyzedAttempt[];
  issues: RowIssue[];
  issuesTotal: number;
}

export interface AnalyzeOptions {
  /** Patient type for every attempt; required when the file has no profile column. */
  profile?: PatientType;
  policy?: NetworkPolicy;
  mapping?: ImportMapping;
}

const REQUIRED = new Set(["attempt_id", "t_ms", "depth_mm", "release_mm"]);

export async function analyzeFile(input: ImportInput, options: AnalyzeOptions = {}): Promise<AnalyzeResult> {
  const policy = options.policy ?? DEFAULT_POLICY;
  const mapping = options.mapping ?? identityMapping;
  const issues: RowIssue[] = [];
  let issuesTotal = 0;
  const addIssue = (issue: RowIssue) => {
    issuesTotal++;
    if (issues.length < ISSUE_LIST_CAP) issues.push(issue);
  };
  // A private temporary database (deleted on close) holds spilled rows of very large files.
  const scratch = new Database("");
  const grouper = new StreamGrouper(scratch);
  const ids: string[] = [];
  const profiles: PatientType[] = [];
  const index = new Map<string, number>();
  let reader: RowReader | undefined;
  let headerLength = 0;
  let profileColumn = false;
  const values: CompressionValues = { tMs: 0, depthTenths: 0, releaseTenths: 0 };
  let rowsRead = 0;

  try {
    const csv = await readCsv(input, {
      header(fields) {
        const resolved = resolveHeader(fields, "compressions", mapping);
        // Only the stream itself is needed here; class, learner and the rest are for the database.
        const problems = resolved.problems.filter((p) => REQUIRED.has(p.column) || (p.column === "profile" && !options.profile));
        for (const problem of problems) addIssue({ row: null, column: problem.column, reason: problem.reason });
        if (problems.length > 0) return false;
        profileColumn = resolved.index.profile >= 0;
        headerLength = fields.length;
        reader = new RowReader("compressions", resolved, mapping);
        return true;
      },
      record(fields, row) {
        const r = reader!;
        r.issues.length = 0;
        r.at(fields, row);
        if (fields.length !== headerLength) {
          r.fail(null, `the row has ${fields.length} values; the header has ${headerLength} columns`);
        } else {
          const id = r.id("attempt_id");
          let profile: PatientType | null = options.profile ?? null;
          if (!profile && profileColumn) profile = r.enumValue("profile", patientTypeValues);
          const ok = r.compressionValues(values);
          if (id !== null && profile !== null && ok) {
            let idx = index.get(id);
            if (idx === undefined) {
              idx = ids.length;
              index.set(id, idx);
              ids.push(id);
              profiles.push(profile);
            } else if (profiles[idx] !== profile) {
              r.fail("profile", `"${profile}" differs from "${profiles[idx]}" on an earlier row of attempt ${id}`);
            }
            if (r.issues.length === 0) grouper.add(idx, row, values.tMs, values.depthTenths, values.releaseTenths);
          }
        }
        for (const issue of r.issues) addIssue(issue);
      },
    });
    rowsRead = csv.rows;
    if (issuesTotal > 0) return { rowsRead, attempts: [], issues, issuesTotal };

    const attempts: AnalyzedAttempt[] = [];
    const depthMm = new Float64Array(0);
    let depth = depthMm;
    let release = depthMm;
    for (const stream of grouper.attempts()) {
      const n = stream.n;
      for (let i = 1; i < n; i++) {
        if (stream.tMs[i] === stream.tMs[i - 1]) {
          addIssue({
            row: stream.rows[i],
            column: "t_ms",
            reason: `t_ms ${stream.tMs[i]} appears on rows ${stream.rows[i - 1]} and ${stream.rows[i]} of attempt ${ids[stream.idx]}; each compression needs its own time`,
          });
          break;
        }
      }
      if (depth.length < n) {
        depth = new Float64Array(n * 2);
        release = new Float64Array(n * 2);
      }
      for (let i = 0; i < n; i++) {
        depth[i] = stream.depthTenths[i] / 10;
        release[i] = stream.releaseTenths[i] / 10;
      }
      if (issuesTotal > 0) continue;
      const profile = profiles[stream.idx];
      const metrics = analyzeSorted(stream.tMs, depth, release, 0, n, bandFor(policy, profile), policy);
      const scored = scoreAttempt(metrics, profile, policy);
      attempts.push({
        attempt_id: ids[stream.idx],
        profile,
        metrics,
        score: scored.score,
        passed: scored.passed,
        errors: scored.errors,
        reason: scored.reason,
      });
    }
    return { rowsRead, attempts: issuesTotal > 0 ? [] : attempts, issues, issuesTotal };
  } catch (err) {
    if (err instanceof CsvSyntaxError) {
      addIssue({ row: err.row, column: null, reason: err.message });
      return { rowsRead, attempts: [], issues, issuesTotal };
    }
    throw err;
  } finally {
    grouper.dispose();
    scratch.close();
  }
}
