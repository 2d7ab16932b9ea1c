// The columns of Quarterbeat's four import formats. docs/import-formats.md describes each one for people;
// this list is what the importer and the upload page read.
import type { ImportKind } from "../domain";

/** Which unit conversion of a mapping applies to a column. */
export type UnitGroup = "depth" | "time" | "share";

export interface ColumnSpec {
  name: string;
  required: boolean;
  unit?: UnitGroup;
  description: string;
}

const col = (name: string, description: string, unit?: UnitGroup): ColumnSpec => ({ name, required: true, description, unit });
const optional = (name: string, description: string): ColumnSpec => ({ name, required: false, description });

const attemptIdentity: ColumnSpec[] = [
  col("attempt_id", "Id of the attempt, 1–64 letters, digits, '.', '_' or '-'"),
  col("class_id", "Id of the class the attempt belongs to"),
  col("learner", "Pseudonymous learner code (never a name)"),
  col("manikin", "Asset id of the training manikin (may be empty)"),
  col("profile", "infant, child or adult"),
  col("feedback", "live or hidden: whether the learner saw the device's feedback"),
  col("started_at", "Start time, ISO 8601 with an offset or Z"),
];

export const importColumns: Record<ImportKind, readonly ColumnSpec[]> = {
  classes: [
    col("class_id", "Id of the class, 1–64 letters, digits, '.', '_' or '-'"),
    col("date", "Date of the class, YYYY-MM-DD"),
    col("site", "Site code"),
    col("instructor", "Instructor code"),
    col("course", "infant, child, adult or all-ages"),
    col("learners", "Number of learners, 0–500"),
    col("passed", "Learners the instructor recorded as completed, 0–learners"),
    col("manikins", "Asset ids of the manikins used, separated by ';' (may be empty)"),
    optional("lungs_replaced", "Manikin lungs replaced during the class"),
    optional("mouthpieces_cleaned", "Mouthpieces cleaned during the class"),
    optional("batteries_replaced", "Batteries replaced during the class"),
  ],
  attempts: [
    ...attemptIdentity,
    col("duration_s", "Length of the attempt in seconds, more than 0"),
    col("compressions", "Number of compressions"),
    col("rate_cpm", "Mean compression rate per minute, 20–300"),
    col("depth_mm", "Mean compression depth, 0–100 mm", "depth"),
    col("depth_ok_pct", "Share of compressions at target depth", "share"),
    col("too_shallow_pct", "Share of compressions too shallow", "share"),
    col("too_deep_pct", "Share of compressions too deep", "share"),
    col("rate_ok_pct", "Share of compressions at target rate", "share"),
    col("too_slow_pct", "Share of compressions too slow", "share"),
    col("too_fast_pct", "Share of compressions too fast", "share"),
    col("recoil_ok_pct", "Share of compressions with full recoil", "share"),
    col("hands_on_pct", "Share of the attempt's time spent compressing", "share"),
    col("longest_pause_s", "Longest interruption in seconds"),
    col("instructor_result", "pass, fail or empty: the instructor's own judgement"),
  ],
  compressions: [
    ...attemptIdentity,
    col("instructor_result", "pass, fail or empty, the same on every row of an attempt"),
    col("t_ms", "Time of the compression since the attempt started, whole milliseconds", "time"),
    col("depth_mm", "Peak depth of the compression, 0–100 mm", "depth"),
    col("release_mm", "Residual depth at the top of the following recoil, 0–100 mm", "depth"),
  ],
  equipment: [
    col("date", "Date of the event, YYYY-MM-DD"),
    col("manikin", "Asset id of the manikin"),
    col("site", "Site code (may be empty)"),
    col("event", "commissioned, lung_replaced, mouthpiece_cleaned, battery_replaced, serviced, fault or retired"),
    optional("quantity", "How many (default 1)"),
    optional("patient_type", "infant, child or adult; required on commissioned"),
    optional("note", "Free text, at most 500 characters"),
  ],
};

export function columnNames(kind: ImportKind): string[] {
  return importColumns[kind].map((c) => c.name);
}
