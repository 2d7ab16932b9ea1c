// Row validation for the four import formats: pure functions from a CSV record (an array of strings) to a
// typed row, or to reasons naming the column. The server importer and `quarterbeat analyze` share them.
// Written for millions of rows: one reader object per file, no closures or regular expressions per value
// where a character scan does.
import { courseTypes, equipmentEventTypes, feedbackModes, type CourseType, type EquipmentEventType, type FeedbackMode, type ImportKind } from "../domain";
import type { PatientType } from "../scoring/policy";
import { importColumns, type UnitGroup } from "./columns";
import type { ResolvedHeader } from "./header";
import { unitFactors, type ImportMapping } from "./mapping";

export const patientTypeValues = ["infant", "child", "adult"] as const;
export const instructorResults = ["pass", "fail"] as const;

/** One reason a row was refused. Row 1 is the first data row after the header; null = the header. */
export interface RowIssue {
  row: number | null;
  column: string | null;
  reason: string;
}

export interface ClassRow {
  id: string;
  date: string;
  siteCode: string;
  instructorCode: string;
  course: CourseType;
  learners: number;
  passed: number;
  manikins: string[];
  lungsReplaced: number | null;
  mouthpiecesCleaned: number | null;
  batteriesReplaced: number | null;
}

/** The columns every row of an attempt shares (attempts and compressions files). */
export interface AttemptIdentity {
  id: string;
  classId: string;
  learner: string;
  manikin: string | null;
  profile: PatientType;
  feedback: FeedbackMode;
  startedAt: string;
  instructorResult: "pass" | "fail" | null;
}

export interface AttemptSummaryRow extends AttemptIdentity {
  durationS: number;
  compressions: number;
  rateCpm: number;
  depthMm: number;
  depthOkPct: number;
  tooShallowPct: number;
  tooDeepPct: number;
  rateOkPct: number;
  tooSlowPct: number;
  tooFastPct: number;
  recoilOkPct: number;
  handsOnPct: number;
  longestPauseS: number;
}

export interface CompressionValues {
  tMs: number;
  /** Depth and release in tenths of a millimetre: the precision streams are stored and analysed at. */
  depthTenths: number;
  releaseTenths: number;
}

export interface EquipmentRow {
  date: string;
  manikin: string;
  siteCode: string | null;
  event: EquipmentEventType;
  quantity: number;
  patientType: PatientType | null;
  note: string;
}

const ID_MAX = 64;
const CODE_MAX = 32;
const NOTE_MAX = 500;
const EARLIEST_DATE = "2000-01-01";
/** Start times may run up to a day ahead of the server's clock (time zones, device clocks). */
const FUTURE_SLACK_MS = 24 * 60 * 60 * 1000;
const DAY_MS = 24 * 60 * 60 * 1000;
/** One attempt on one manikin lasts minutes; an hour leaves room for a long scenario and stops nonsense. */
export const ATTEMPT_MAX_S = 3600;
/** How many days an attempt's start may lie from its class's date: time zones and classes past midnight. */
export const START_DAYS_FROM_CLASS = 1;

/**
 * Why an attempt's start does not fit its class's date, or null. The start's own calendar date (as written,
 * in its offset: the local date where the class was held) may differ from the class date by one day at most.
 */
export function startOutsideClassDate(startedAt: string, classDate: string): string | null {
  const days = Math.round((Date.parse(startedAt.slice(0, 10)) - Date.parse(classDate)) / DAY_MS);
  if (Math.abs(days) <= START_DAYS_FROM_CLASS) return null;
  return `${startedAt} is ${Math.abs(days)} days ${days < 0 ? "before" : "after"} the class date ${classDate}; an attempt must start within ${START_DAYS_FROM_CLASS} day of its class's date`;
}

function isIdChar(c: number): boolean {
  return (c >= 48 && c <= 57) || (c >= 65 && c <= 90) || (c >= 97 && c <= 122) || c === 46 || c === 95 || c === 45;
}

/** Strict decimal: optional sign, digits, optional fraction, optional exponent. NaN for anything else. */
export function parseDecimal(text: string): number {
  const n = text.length;
  if (n === 0 || n > 40) return NaN;
  let i = 0;
  let c = text.charCodeAt(0);
  if (c === 43 || c === 45) i++;
  let digits = 0;
  while (i < n && (c = text.charCodeAt(i)) >= 48 && c <= 57) {
    i++;
    digits++;
  }
  if (i < n && text.charCodeAt(i) === 46) {
    i++;
    while (i < n && (c = text.charCodeAt(i)) >= 48 && c <= 57) {
      i++;
      digits++;
    }
  }
  if (digits === 0) return NaN;
  if (i < n && ((c = text.charCodeAt(i)) === 101 || c === 69)) {
    i++;
    if (i < n && ((c = text.charCodeAt(i)) === 43 || c === 45)) i++;
    let expDigits = 0;
    while (i < n && (c = text.charCodeAt(i)) >= 48 && c <= 57) {
      i++;
      expDigits++;
    }
    if (expDigits === 0) return NaN;
  }
  if (i !== n) return NaN;
  return +text;
}

function isCalendarDate(text: string): boolean {
  if (text.length !== 10 || text.charCodeAt(4) !== 45 || text.charCodeAt(7) !== 45) return false;
  for (const i of [0, 1, 2, 3, 5, 6, 8, 9]) {
    const c = text.charCodeAt(i);
    if (c < 48 || c > 57) return false;
  }
  const year = +text.slice(0, 4);
  const month = +text.slice(5, 7);
  const day = +text.slice(8, 10);
  if (month < 1 || month > 12 || day < 1) return false;
  return day <= new Date(Date.UTC(year, month, 0)).getUTCDate();
}

function digitsAt(text: string, from: number, count: number): number {
  let value = 0;
  for (let i = from; i < from + count; i++) {
    const c = text.charCodeAt(i) - 48;
    if (c < 0 || c > 9) return -1;
    value = value * 10 + c;
  }
  return value;
}

/** YYYY-MM-DDTHH:MM[:SS[.fraction]] followed by Z or ±HH:MM, with a real calendar date and clock time. */
export function isOffsetDateTime(text: string): boolean {
  const n = text.length;
  if (n < 17 || text.charCodeAt(10) !== 84 /* T */ || !isCalendarDate(text.slice(0, 10))) return false;
  if (digitsAt(text, 11, 2) > 23 || text.charCodeAt(13) !== 58 || digitsAt(text, 14, 2) > 59) return false;
  if (digitsAt(text, 11, 2) < 0 || digitsAt(text, 14, 2) < 0) return false;
  let i = 16;
  if (text.charCodeAt(i) === 58 /* : */) {
    const seconds = digitsAt(text, i + 1, 2);
    if (seconds < 0 || seconds > 59) return false;
    i += 3;
    if (text.charCodeAt(i) === 46 /* . */) {
      let fraction = 0;
      i++;
      while (i < n && text.charCodeAt(i) >= 48 && text.charCodeAt(i) <= 57) {
        i++;
        fraction++;
      }
      if (fraction === 0 || fraction > 9) return false;
    }
  }
  const sign = text.charCodeAt(i);
  if (sign === 90 /* Z */) return i + 1 === n;
  if (sign !== 43 && sign !== 45) return false;
  if (i + 6 !== n || text.charCodeAt(i + 3) !== 58) return false;
  const hours = digitsAt(text, i + 1, 2);
  const minutes = digitsAt(text, i + 4, 2);
  return hours >= 0 && hours <= 14 && minutes >= 0 && minutes <= 59;
}

const quoted = (value: string) => JSON.stringify(value.length > 60 ? `${value.slice(0, 57)}...` : value);

/**
 * Reads one file's rows. Set `fields` and `row`, then call a kind's read method: it returns the typed row,
 * or null after adding one issue per faulty column to `issues`.
 */
export class RowReader {
  fields: readonly string[] = [];
  row = 0;
  issues: RowIssue[] = [];
  private readonly index: Record<string, number>;
  private readonly factors: Record<UnitGroup, number>;
  private readonly unitOf: Record<string, UnitGroup | undefined>;
  /** Value translations as Maps: a file's value such as "constructor" must never find an inherited property. */
  private readonly values: Map<string, Map<string, string>>;
  private readonly today: string;
  private readonly latestStartMs: number;
  private readonly yesterday: string;

  constructor(
    readonly kind: ImportKind,
    header: ResolvedHeader,
    mapping: ImportMapping,
    now: Date = new Date(),
  ) {
    this.index = header.index;
    this.factors = unitFactors(mapping);
    this.values = new Map(Object.entries(mapping.values).map(([column, table]) => [column, new Map(Object.entries(table))]));
    this.unitOf = Object.fromEntries(importColumns[kind].map((c) => [c.name, c.unit]));
    this.today = now.toISOString().slice(0, 10);
    this.latestStartMs = now.getTime() + FUTURE_SLACK_MS;
    this.yesterday = new Date(now.getTime() - FUTURE_SLACK_MS).toISOString().slice(0, 10);
  }

  /** Starts a row; returns the same reader for chaining. */
  at(fields: readonly string[], row: number): this {
    this.fields = fields;
    this.row = row;
    return this;
  }

  fail(column: string | null, reason: string): null {
    this.issues.push({ row: this.row, column, reason });
    return null;
  }

  /** Position of a column in the file's rows, -1 when absent. */
  position(column: string): number {
    const position = this.index[column];
    return position === undefined ? -1 : position;
  }

  /** The raw text of a column after value translation, trimmed; "" when the column is absent. */
  text(column: string): string {
    const position = this.index[column];
    if (position === undefined || position < 0) return "";
    const raw = this.fields[position];
    if (raw === undefined) return "";
    const value = raw.trim();
    const translate = this.values.get(column);
    if (translate !== undefined) {
      const mapped = translate.get(value);
      if (mapped !== undefined) return mapped;
    }
    return value;
  }

  private required(column: string): string | null {
    const value = this.text(column);
    if (value === "") return this.fail(column, "is required but empty");
    return value;
  }

  id(column: string): string | null {
    const value = this.required(column);
    if (value === null) return null;
    if (value.length > ID_MAX) return this.fail(column, `must be at most ${ID_MAX} characters; got ${value.length}`);
    for (let i = 0; i < value.length; i++) {
      if (!isIdChar(value.charCodeAt(i))) {
        return this.fail(column, `${quoted(value)} may contain only letters, digits, '.', '_' and '-'`);
      }
    }
    return value;
  }

  code(column: string, value: string | null = this.required(column)): string | null {
    if (value === null) return null;
    if (value.length > CODE_MAX) return this.fail(column, `${quoted(value)} is longer than ${CODE_MAX} characters`);
    for (let i = 0; i < value.length; i++) {
      if (!isIdChar(value.charCodeAt(i))) {
        return this.fail(column, `${quoted(value)} is not a code: use 1–${CODE_MAX} letters, digits, '.', '_' or '-'`);
      }
    }
    return value;
  }

  optionalCode(column: string): string | null | undefined {
    const value = this.text(column);
    if (value === "") return null;
    const code = this.code(column, value);
    return code === null ? undefined : code;
  }

  learner(column: string): string | null {
    const value = this.required(column);
    if (value === null) return null;
    for (let i = 0; i < value.length; i++) {
      const c = value.charCodeAt(i);
      if (isIdChar(c)) continue;
      if (c === 32 || c === 9 || c === 160) {
        return this.fail(
          column,
          `${quoted(value)} looks like a personal name (it contains a space); learners are recorded only as pseudonymous codes such as L-0042, never by name`,
        );
      }
      if (c === 64) {
        return this.fail(column, `${quoted(value)} looks like an e-mail address; learners are recorded only as pseudonymous codes such as L-0042`);
      }
    }
    return this.code(column, value);
  }

  enumValue<T extends string>(column: string, allowed: readonly T[]): T | null {
    const value = this.required(column);
    if (value === null) return null;
    if ((allowed as readonly string[]).includes(value)) return value as T;
    return this.fail(column, `${quoted(value)} is not allowed; use one of ${allowed.join(", ")}`);
  }

  date(column: string): string | null {
    const value = this.required(column);
    if (value === null) return null;
    if (!isCalendarDate(value)) return this.fail(column, `${quoted(value)} is not a date; use YYYY-MM-DD, e.g. 2026-07-14`);
    if (value > this.today) return this.fail(column, `${value} is in the future`);
    if (value < EARLIEST_DATE) return this.fail(column, `${value} is before 2000; check the year`);
    return value;
  }

  dateTime(column: string): string | null {
    const value = this.required(column);
    if (value === null) return null;
    if (!isOffsetDateTime(value)) {
      return this.fail(column, `${quoted(value)} is not a time with an offset; use ISO 8601 such as 2026-07-14T09:30:00+02:00 or …Z`);
    }
    const date = value.slice(0, 10);
    // Only a start time within a day of today needs the exact (slower) comparison.
    if (date >= this.yesterday && Date.parse(value) > this.latestStartMs) return this.fail(column, `${value} is in the future`);
    if (date < EARLIEST_DATE) return this.fail(column, `${value} is before 2000; check the year`);
    return value;
  }

  /** A number converted by the column's unit group, within [min, max]; null after an issue. */
  number(column: string, min: number, max: number, what = ""): number | null {
    const value = this.required(column);
    if (value === null) return null;
    let n = parseDecimal(value);
    if (Number.isNaN(n)) return this.fail(column, `${quoted(value)} is not a number`);
    const unit = this.unitOf[column];
    if (unit !== undefined) {
      const factor = this.factors[unit];
      if (factor !== 1) n *= factor;
    }
    if (!(n >= min && n <= max)) {
      const converted = unit !== undefined && this.factors[unit] !== 1 ? ` (${n} after unit conversion)` : "";
      return this.fail(column, `${value}${converted} is outside ${min}–${max}${what}`);
    }
    return n;
  }

  /** A number more than 0 and at most `max`; null after an issue. */
  positive(column: string, max: number, what = ""): number | null {
    const value = this.required(column);
    if (value === null) return null;
    const n = parseDecimal(value);
    if (Number.isNaN(n)) return this.fail(column, `${quoted(value)} is not a number`);
    if (!(n > 0 && Number.isFinite(n))) return this.fail(column, `must be more than 0${what}; got ${value}`);
    if (n > max) return this.fail(column, `must be at most ${max}${what}; got ${value}`);
    return n;
  }

  integer(column: string, min: number, max: number): number | null {
    const value = this.required(column);
    if (value === null) return null;
    const n = parseDecimal(value);
    if (Number.isNaN(n)) return this.fail(column, `${quoted(value)} is not a number`);
    if (!Number.isInteger(n) || n < min || n > max) return this.fail(column, `must be a whole number from ${min} to ${max}; got ${value}`);
    return n;
  }

  /** An optional whole count ≥ 0: null when empty or absent, undefined after an issue. */
  optionalCount(column: string): number | null | undefined {
    if (this.text(column) === "") return null;
    const n = this.integer(column, 0, 1_000_000);
    return n === null ? undefined : n;
  }

  /** pass, fail or empty. undefined after an issue. */
  instructorResult(column: string): "pass" | "fail" | null | undefined {
    const value = this.text(column);
    if (value === "") return null;
    if (value === "pass" || value === "fail") return value;
    this.fail(column, `${quoted(value)} is not allowed; use pass, fail or leave it empty`);
    return undefined;
  }

  /** Three shares of the same compressions must add up to 100 % (± 1 for the device's rounding). */
  sharesAddUp(columns: readonly [string, string, string], values: readonly [number | null, number | null, number | null]): boolean {
    if (values[0] === null || values[1] === null || values[2] === null) return true;
    const sum = values[0] + values[1] + values[2];
    if (Math.abs(sum - 100) <= 1) return true;
    this.fail(columns[0], `${columns.join(" + ")} = ${+sum.toFixed(4)}; the three shares must add up to 100 (± 1)`);
    return false;
  }

  classRow(): ClassRow | null {
    const before = this.issues.length;
    const id = this.id("class_id");
    const date = this.date("date");
    const siteCode = this.code("site");
    const instructorCode = this.code("instructor");
    const course = this.enumValue("course", courseTypes);
    const learners = this.integer("learners", 0, 500);
    let passed = this.integer("passed", 0, 500);
    if (learners !== null && passed !== null && passed > learners) {
      passed = this.fail("passed", `${passed} passed is more than the ${learners} learners`);
    }
    const manikinText = this.text("manikins");
    const manikins: string[] = [];
    if (manikinText !== "") {
      for (const part of manikinText.split(";")) {
        const asset = part.trim();
        if (asset === "") continue;
        if (this.code("manikins", asset) === null) break;
        if (!manikins.includes(asset)) manikins.push(asset);
      }
    }
    const lungsReplaced = this.optionalCount("lungs_replaced");
    const mouthpiecesCleaned = this.optionalCount("mouthpieces_cleaned");
    const batteriesReplaced = this.optionalCount("batteries_replaced");
    if (this.issues.length > before) return null;
    return {
      id: id!,
      date: date!,
      siteCode: siteCode!,
      instructorCode: instructorCode!,
      course: course!,
      learners: learners!,
      passed: passed!,
      manikins,
      lungsReplaced: lungsReplaced ?? null,
      mouthpiecesCleaned: mouthpiecesCleaned ?? null,
      batteriesReplaced: batteriesReplaced ?? null,
    };
  }

  attemptIdentity(): AttemptIdentity | null {
    const before = this.issues.length;
    const id = this.id("attempt_id");
    const classId = this.id("class_id");
    const learner = this.learner("learner");
    const manikin = this.optionalCode("manikin");
    const profile = this.enumValue("profile", patientTypeValues);
    const feedback = this.enumValue("feedback", feedbackModes);
    const startedAt = this.dateTime("started_at");
    const instructorResult = this.instructorResult("instructor_result");
    if (this.issues.length > before) return null;
    return {
      id: id!,
      classId: classId!,
      learner: learner!,
      manikin: manikin ?? null,
      profile: profile!,
      feedback: feedback!,
      startedAt: startedAt!,
      instructorResult: instructorResult ?? null,
    };
  }

  attemptRow(): AttemptSummaryRow | null {
    const before = this.issues.length;
    const identity = this.attemptIdentity();
    const durationS = this.positive("duration_s", ATTEMPT_MAX_S, " seconds");
    const compressions = this.integer("compressions", 1, 100_000);
    const rateCpm = this.number("rate_cpm", 20, 300, " compressions per minute");
    const depthMm = this.number("depth_mm", 0, 100, " mm");
    const depthOkPct = this.number("depth_ok_pct", 0, 100, " %");
    const tooShallowPct = this.number("too_shallow_pct", 0, 100, " %");
    const tooDeepPct = this.number("too_deep_pct", 0, 100, " %");
    const rateOkPct = this.number("rate_ok_pct", 0, 100, " %");
    const tooSlowPct = this.number("too_slow_pct", 0, 100, " %");
    const tooFastPct = this.number("too_fast_pct", 0, 100, " %");
    const recoilOkPct = this.number("recoil_ok_pct", 0, 100, " %");
    const handsOnPct = this.number("hands_on_pct", 0, 100, " %");
    let longestPauseS = this.number("longest_pause_s", 0, 86_400, " seconds");
    if (longestPauseS !== null && durationS !== null && longestPauseS > durationS) {
      longestPauseS = this.fail("longest_pause_s", `a pause of ${longestPauseS} s cannot be longer than the attempt's ${durationS} s`);
    }
    this.sharesAddUp(["depth_ok_pct", "too_shallow_pct", "too_deep_pct"], [depthOkPct, tooShallowPct, tooDeepPct]);
    this.sharesAddUp(["rate_ok_pct", "too_slow_pct", "too_fast_pct"], [rateOkPct, tooSlowPct, tooFastPct]);
    if (this.issues.length > before) return null;
    const id = identity!;
    return {
      id: id.id,
      classId: id.classId,
      learner: id.learner,
      manikin: id.manikin,
      profile: id.profile,
      feedback: id.feedback,
      startedAt: id.startedAt,
      instructorResult: id.instructorResult,
      durationS: durationS!,
      compressions: compressions!,
      rateCpm: rateCpm!,
      depthMm: depthMm!,
      depthOkPct: depthOkPct!,
      tooShallowPct: tooShallowPct!,
      tooDeepPct: tooDeepPct!,
      rateOkPct: rateOkPct!,
      tooSlowPct: tooSlowPct!,
      tooFastPct: tooFastPct!,
      recoilOkPct: recoilOkPct!,
      handsOnPct: handsOnPct!,
      longestPauseS: longestPauseS!,
    };
  }

  /** The three per-compression values; writes into `out` (no allocation per row). False after an issue. */
  compressionValues(out: CompressionValues): boolean {
    const before = this.issues.length;
    const t = this.number("t_ms", 0, 2_147_483_647, " ms");
    if (t !== null) {
      // Seconds converted to ms may carry binary rounding (0.123 × 1000 = 123.00000000000001).
      const whole = Math.round(t);
      if (Math.abs(whole - t) > 1e-6) this.fail("t_ms", `${this.text("t_ms")} is not a whole number of milliseconds`);
      else out.tMs = whole;
    }
    const depth = this.number("depth_mm", 0, 100, " mm");
    const release = this.number("release_mm", 0, 100, " mm");
    if (this.issues.length > before) return false;
    out.depthTenths = Math.round(depth! * 10);
    out.releaseTenths = Math.round(release! * 10);
    return true;
  }

  equipmentRow(): EquipmentRow | null {
    const before = this.issues.length;
    const date = this.date("date");
    const manikin = this.code("manikin");
    const siteCode = this.optionalCode("site");
    const event = this.enumValue("event", equipmentEventTypes);
    let quantity: number | null = 1;
    if (this.text("quantity") !== "") quantity = this.integer("quantity", 1, 10_000);
    let patientType: PatientType | null = null;
    if (this.text("patient_type") !== "") patientType = this.enumValue("patient_type", patientTypeValues);
    else if (event === "commissioned") this.fail("patient_type", "is required when the event is commissioned (infant, child or adult)");
    const note = this.text("note");
    if (note.length > NOTE_MAX) this.fail("note", `must be at most ${NOTE_MAX} characters; got ${note.length}`);
    if (this.issues.length > before) return null;
    return { date: date!, manikin: manikin!, siteCode: siteCode ?? null, event: event!, quantity: quantity!, patientType, note };
  }
}
