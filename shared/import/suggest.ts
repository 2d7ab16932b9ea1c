// Suggests a column mapping for a file whose header does not use Quarterbeat's names: matches names loosely
// (case, punctuation, unit suffixes, common synonyms) and guesses units from the names and the first rows.
// Only a suggestion: the person checks it on the preview before validating.
import type { ImportKind } from "../domain";
import { importColumns } from "./columns";
import type { ImportMapping } from "./mapping";

const SYNONYMS: Record<string, string[]> = {
  attempt_id: ["attempt", "attemptno", "attemptnumber", "run", "runid", "trial", "trialid"],
  class_id: ["class", "classno", "course_id", "session", "sessionid"],
  learner: ["learnerid", "learnercode", "student", "studentcode", "participant", "trainee", "pseudonym"],
  manikin: ["manikinid", "asset", "assetid", "device", "deviceid", "torso"],
  profile: ["patient", "patienttype", "size", "age"],
  feedback: ["feedbackmode", "mode", "display"],
  started_at: ["start", "started", "starttime", "timestamp", "datetime", "begin"],
  instructor_result: ["instructor", "instructorverdict", "verdict", "assessment", "result"],
  duration_s: ["duration", "length", "seconds"],
  compressions: ["count", "compressioncount", "ncompressions", "total"],
  rate_cpm: ["rate", "meanrate", "averagerate", "cpm"],
  depth_mm: ["depth", "meandepth", "averagedepth", "peakdepth"],
  release_mm: ["release", "residual", "residualdepth", "leaning", "recoildepth"],
  t_ms: ["t", "time", "offset", "elapsed"],
  depth_ok_pct: ["depthok", "correctdepth", "depthcorrect", "gooddepth"],
  too_shallow_pct: ["shallow", "tooshallow"],
  too_deep_pct: ["deep", "toodeep"],
  rate_ok_pct: ["rateok", "correctrate", "raterightpct", "goodrate"],
  too_slow_pct: ["slow", "tooslow"],
  too_fast_pct: ["fast", "toofast"],
  recoil_ok_pct: ["recoil", "recoilok", "fullrecoil", "release_ok"],
  hands_on_pct: ["handson", "ccf", "fraction", "compressionfraction", "flowfraction"],
  longest_pause_s: ["longestpause", "maxpause", "pause"],
  date: ["day", "classdate"],
  site: ["sitecode", "location", "venue"],
  instructor: ["instructorcode", "trainer", "teacher"],
  course: ["coursetype", "type"],
  learners: ["participants", "students", "attendees", "enrolled"],
  passed: ["completed", "certified", "pass"],
  manikins: ["assets", "devices"],
  event: ["eventtype", "action"],
  quantity: ["qty", "amount", "number"],
  patient_type: ["patient", "patienttype", "type"],
  note: ["notes", "comment", "comments", "remarks"],
};

const UNIT_SUFFIX = /(mm|cm|in|inch|inches|ms|sec|secs|seconds|s|pct|percent|perc|fraction|frac|cpm|permin|min)$/;

function key(name: string): string {
  return name
    .toLowerCase()
    .replace(/\(.*?\)|\[.*?\]/g, "")
    .replace(/[^a-z0-9]/g, "");
}

function bareKey(name: string): string {
  const k = key(name);
  const stripped = k.replace(UNIT_SUFFIX, "");
  return stripped.length >= 2 ? stripped : k;
}

export interface Suggestion {
  mapping: ImportMapping;
  /** Quarterbeat column → file column (null: nothing matched). */
  matches: Record<string, string | null>;
}

export function suggestMapping(kind: ImportKind, header: readonly string[], rows: readonly (readonly string[])[] = []): Suggestion {
  const columns: Record<string, string> = {};
  const matches: Record<string, string | null> = {};
  const taken = new Set<number>();
  const exact = new Map(header.map((h, i) => [h.trim().toLowerCase(), i]));

  for (const spec of importColumns[kind]) {
    const direct = exact.get(spec.name);
    if (direct !== undefined) {
      taken.add(direct);
      matches[spec.name] = header[direct].trim();
    }
  }
  for (const spec of importColumns[kind]) {
    if (matches[spec.name]) continue;
    const wanted = new Set([key(spec.name), bareKey(spec.name), ...(SYNONYMS[spec.name] ?? []).map(key)]);
    const found = header.findIndex((h, i) => !taken.has(i) && (wanted.has(key(h)) || wanted.has(bareKey(h))));
    if (found >= 0) {
      taken.add(found);
      columns[spec.name] = header[found].trim();
      matches[spec.name] = header[found].trim();
    } else {
      matches[spec.name] = null;
    }
  }

  const nameOf = (column: string) => (matches[column] ?? "").toLowerCase();
  const depthName = nameOf("depth_mm");
  const depth = /\bcm\b|\(cm\)|_cm$|cm$/.test(depthName) ? "cm" : /\bin\b|\(in\)|inch|_in$/.test(depthName) ? "in" : "mm";
  const timeName = nameOf("t_ms");
  const time = /\(s\)|_s$|\bsec|seconds|\bs$/.test(timeName) && !/ms/.test(timeName) ? "s" : "ms";
  // Shares: fractions when every value seen in the share columns is at most 1.
  let shares: "percent" | "fraction" = "percent";
  const shareColumns = importColumns[kind].filter((c) => c.unit === "share").map((c) => matches[c.name]);
  const positions = shareColumns.map((name) => (name ? header.findIndex((h) => h.trim() === name) : -1)).filter((i) => i >= 0);
  if (positions.length > 0 && rows.length > 0) {
    const values = rows.flatMap((row) => positions.map((i) => Number(row[i])));
    if (values.every((v) => Number.isFinite(v) && v >= 0 && v <= 1) && values.some((v) => v > 0 && v < 1)) shares = "fraction";
  }
  return { mapping: { columns, units: { depth, time, shares }, values: {} }, matches };
}
