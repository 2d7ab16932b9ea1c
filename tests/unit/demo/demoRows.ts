// Reads the demo network's CSV files back the way a tester would: csv-parse, then every attempt (summary
// rows and attempts rebuilt from their compression streams) with its class and its measured result.
import { parse } from "csv-parse/sync";
import type { DemoNetwork } from "../../../server/demo/generate";
import { analyzeStream, type AttemptMetrics } from "../../../shared/scoring/analyzeStream";
import { DEFAULT_POLICY, type PatientType } from "../../../shared/scoring/policy";
import { scoreAttempt, type AttemptScore } from "../../../shared/scoring/scoreAttempt";

export type Row = Record<string, string>;

export function readCsv(text: string): Row[] {
  return parse(text, { columns: true }) as Row[];
}

export function headerOf(text: string): string[] {
  return (parse(text, { to_line: 1 }) as string[][])[0];
}

export interface DemoFiles {
  classes: Row[];
  attempts: Row[];
  compressions: Row[];
  equipment: Row[];
}

export function readFiles(network: DemoNetwork): DemoFiles {
  return {
    classes: readCsv(network.files.classes),
    attempts: readCsv(network.files.attempts),
    compressions: readCsv(network.files.compressions),
    equipment: readCsv(network.files.equipment),
  };
}

/** Compression rows grouped by attempt, in file order. */
export function streamsByAttempt(compressions: Row[]): Map<string, Row[]> {
  const streams = new Map<string, Row[]>();
  for (const row of compressions) {
    const rows = streams.get(row.attempt_id);
    if (rows) rows.push(row);
    else streams.set(row.attempt_id, [row]);
  }
  return streams;
}

export interface MeasuredAttempt {
  id: string;
  classRow: Row;
  profile: PatientType;
  feedback: string;
  instructorResult: string;
  metrics: Pick<
    AttemptMetrics,
    | "compressions"
    | "depth_mm"
    | "depth_ok_pct"
    | "too_shallow_pct"
    | "too_deep_pct"
    | "rate_ok_pct"
    | "too_slow_pct"
    | "too_fast_pct"
    | "recoil_ok_pct"
    | "hands_on_pct"
    | "longest_pause_s"
  >;
  score: AttemptScore;
}

/** Every attempt of both files, scored under the default policy as the import would score it. */
export function measuredAttempts(files: DemoFiles): MeasuredAttempt[] {
  const classes = new Map(files.classes.map((c) => [c.class_id, c]));
  const measured: MeasuredAttempt[] = [];
  const add = (identity: Row, metrics: MeasuredAttempt["metrics"]) => {
    const profile = identity.profile as PatientType;
    measured.push({
      id: identity.attempt_id,
      classRow: classes.get(identity.class_id)!,
      profile,
      feedback: identity.feedback,
      instructorResult: identity.instructor_result,
      metrics,
      score: scoreAttempt(metrics, profile, DEFAULT_POLICY),
    });
  };
  for (const a of files.attempts) {
    add(a, {
      compressions: Number(a.compressions),
      depth_mm: Number(a.depth_mm),
      depth_ok_pct: Number(a.depth_ok_pct),
      too_shallow_pct: Number(a.too_shallow_pct),
      too_deep_pct: Number(a.too_deep_pct),
      rate_ok_pct: Number(a.rate_ok_pct),
      too_slow_pct: Number(a.too_slow_pct),
      too_fast_pct: Number(a.too_fast_pct),
      recoil_ok_pct: Number(a.recoil_ok_pct),
      hands_on_pct: Number(a.hands_on_pct),
      longest_pause_s: Number(a.longest_pause_s),
    });
  }
  for (const rows of streamsByAttempt(files.compressions).values()) {
    const profile = rows[0].profile as PatientType;
    const metrics = analyzeStream(
      rows.map((r) => ({ t_ms: Number(r.t_ms), depth_mm: Number(r.depth_mm), release_mm: Number(r.release_mm) })),
      DEFAULT_POLICY.bands[profile],
      DEFAULT_POLICY,
    );
    add(rows[0], metrics);
  }
  return measured;
}

export function mean(values: number[]): number {
  return values.reduce((sum, v) => sum + v, 0) / values.length;
}

export function groupBy<T>(items: T[], key: (item: T) => string): Map<string, T[]> {
  const groups = new Map<string, T[]>();
  for (const item of items) {
    const k = key(item);
    const group = groups.get(k);
    if (group) group.push(item);
    else groups.set(k, [item]);
  }
  return groups;
}

/** "2026-Q3" for a YYYY-MM-DD date. */
export function quarterOfDate(date: string): string {
  return `${date.slice(0, 4)}-Q${Math.floor((Number(date.slice(5, 7)) - 1) / 3) + 1}`;
}
