// Writes the demo network in Quarterbeat's four import formats (classes, attempts, compressions,
// equipment). Column names and order are the import formats'; numbers are written with the precision a
// device or class log would give (whole percentages, tenths of seconds and millimetres).
import { CSV_LINE_END, csvRecord, IMPORT_FILE_CSV, toCsv } from "../../shared/csv";
import type { ClassOutcome, AttemptRecord } from "./attempts";
import { total, type ClassConsumables } from "./consumables";
import type { EquipmentEvent } from "./equipment";
import { Random } from "./random";
import { simulateStream } from "./simulateStream";

export const CLASSES_COLUMNS = [
  "class_id",
  "date",
  "site",
  "instructor",
  "course",
  "learners",
  "passed",
  "manikins",
  "lungs_replaced",
  "mouthpieces_cleaned",
  "batteries_replaced",
] as const;

export const ATTEMPTS_COLUMNS = [
  "attempt_id",
  "class_id",
  "learner",
  "manikin",
  "profile",
  "feedback",
  "started_at",
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
  "instructor_result",
] as const;

export const COMPRESSIONS_COLUMNS = [
  "attempt_id",
  "class_id",
  "learner",
  "manikin",
  "profile",
  "feedback",
  "started_at",
  "instructor_result",
  "t_ms",
  "depth_mm",
  "release_mm",
] as const;

export const EQUIPMENT_COLUMNS = ["date", "manikin", "site", "event", "quantity", "patient_type", "note"] as const;

export function classesCsv(classes: (ClassOutcome & { consumables: ClassConsumables })[]): string {
  return toCsv(
    CLASSES_COLUMNS,
    classes.map(({ plannedClass: c, passed, consumables }) => {
      const manikins = Object.values(c.stations)
        .flat()
        .map((m) => m!.assetId)
        .sort();
      const logged = (value: number) => (consumables.logged ? value : null);
      return [
        c.id,
        c.date,
        c.site,
        c.instructor.code,
        c.course,
        c.learners,
        passed,
        manikins.join(";"),
        logged(total(consumables.lungs)),
        logged(total(consumables.mouthpieces)),
        logged(total(consumables.batteries)),
      ];
    }),
    IMPORT_FILE_CSV,
  );
}

export function attemptsCsv(attempts: AttemptRecord[]): string {
  return toCsv(
    ATTEMPTS_COLUMNS,
    attempts.map((a) => {
      const s = a.summary;
      return [
        a.id,
        a.classId,
        a.learner,
        a.manikin,
        a.profile,
        a.feedback,
        a.startedAt,
        s.duration_s.toFixed(1),
        s.compressions,
        s.rate_cpm.toFixed(1),
        s.depth_mm.toFixed(1),
        s.depth_ok_pct,
        s.too_shallow_pct,
        s.too_deep_pct,
        s.rate_ok_pct,
        s.too_slow_pct,
        s.too_fast_pct,
        s.recoil_ok_pct,
        s.hands_on_pct,
        s.longest_pause_s.toFixed(1),
        a.instructorResult,
      ];
    }),
    IMPORT_FILE_CSV,
  );
}

/**
 * One row per compression; the stream is simulated again from the attempt's seed (same numbers as before).
 * The attempt's columns are written once per attempt: this file has tens of thousands of rows.
 */
export function compressionsCsv(attempts: AttemptRecord[]): string {
  const lines = [csvRecord(COMPRESSIONS_COLUMNS, IMPORT_FILE_CSV)];
  for (const a of attempts) {
    const stream = simulateStream(a.plan, new Random(a.streamSeed));
    const identity = csvRecord([a.id, a.classId, a.learner, a.manikin, a.profile, a.feedback, a.startedAt, a.instructorResult], IMPORT_FILE_CSV);
    for (let i = 0; i < stream.t.length; i++) {
      lines.push(`${identity},${stream.t[i]},${stream.depth[i].toFixed(1)},${stream.release[i].toFixed(1)}`);
    }
  }
  return lines.join(CSV_LINE_END) + CSV_LINE_END;
}

export function equipmentCsv(events: EquipmentEvent[]): string {
  return toCsv(
    EQUIPMENT_COLUMNS,
    events.map((e) => [e.date, e.manikin, e.site, e.event, e.quantity, e.patientType, e.note]),
    IMPORT_FILE_CSV,
  );
}
