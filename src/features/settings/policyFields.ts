// The fields of the policy form: where each lives in the policy, its words, its unit, and how the form's text
// turns back into the stored policy. Lengths are typed in the user's unit and stored in millimetres; a length
// the user did not touch keeps its stored value exactly, so opening and saving never drifts by rounding.
import { patientTypes, type NetworkPolicy, type PatientType } from "../../../shared/scoring/policy";
import { fromMm, toMm, type LengthUnit } from "../../../shared/units";

export type FieldKind = "length" | "rate" | "seconds" | "percent" | "count" | "days" | "perLearner";

export interface PolicyField {
  /** Dotted path into the policy, e.g. "bands.adult.depthMinMm". */
  path: string;
  label: string;
  kind: FieldKind;
  /** Whole numbers only. */
  whole?: boolean;
}

const bandFields = (type: PatientType): PolicyField[] => [
  { path: `bands.${type}.depthMinMm`, label: "Depth at least", kind: "length" },
  { path: `bands.${type}.depthMaxMm`, label: "Depth at most", kind: "length" },
  { path: `bands.${type}.rateMin`, label: "Rate at least", kind: "rate" },
  { path: `bands.${type}.rateMax`, label: "Rate at most", kind: "rate" },
  { path: `bands.${type}.recoilMaxMm`, label: "Full recoil: still pressed at most", kind: "length" },
];

export const fieldGroups = {
  bands: Object.fromEntries(patientTypes.map((type) => [type, bandFields(type)])) as Record<PatientType, PolicyField[]>,
  pauses: [
    { path: "pauseThresholdS", label: "A gap is a pause when longer than", kind: "seconds" },
    { path: "longPauseLimitS", label: "A pause is long when longer than", kind: "seconds" },
  ] as PolicyField[],
  passRule: [
    { path: "passRule.minDepthOkPct", label: "Compressions at target depth, at least", kind: "percent" },
    { path: "passRule.minRateOkPct", label: "Compressions at target rate, at least", kind: "percent" },
    { path: "passRule.minRecoilOkPct", label: "Compressions with full recoil, at least", kind: "percent" },
    { path: "passRule.minHandsOnPct", label: "Hands-on time, at least", kind: "percent" },
    { path: "passRule.maxLongestPauseS", label: "Longest pause, at most", kind: "seconds" },
  ] as PolicyField[],
  privacy: [
    { path: "suppressionMinCount", label: "Smallest group shown to funders and to instructors looking at others", kind: "count", whole: true },
    { path: "suppressionMinInstructors", label: "Fewest other instructors in a group shown to funders and to instructors", kind: "count", whole: true },
  ] as PolicyField[],
  equipment: [
    { path: "equipment.serviceEveryCompressions", label: "Service after this many compressions", kind: "count", whole: true },
    { path: "equipment.serviceEveryDays", label: "Or after this many days", kind: "count", whole: true },
    { path: "equipment.minMouthpieceCleansPerLearner", label: "Mouthpiece cleans per learner, at least", kind: "perLearner" },
    { path: "equipment.driftMinClasses", label: "Judge a manikin's depth readings after this many shared classes", kind: "count", whole: true },
    { path: "equipment.driftMinOffsetMm", label: "Check a manikin that reads deeper or shallower than its peers by at least", kind: "length" },
  ] as PolicyField[],
};

export const allFields: PolicyField[] = [
  ...patientTypes.flatMap((type) => fieldGroups.bands[type]),
  ...fieldGroups.pauses,
  ...fieldGroups.passRule,
  ...fieldGroups.privacy,
  ...fieldGroups.equipment,
];

export function unitWord(kind: FieldKind, unit: LengthUnit): string {
  return { length: unit, rate: "per minute", seconds: "s", percent: "%", count: kind === "count" ? "" : "", days: "days", perLearner: "" }[kind];
}

export function readPath(policy: NetworkPolicy, path: string): number {
  return path.split(".").reduce<unknown>((node, key) => (node as Record<string, unknown>)[key], policy) as number;
}

function writePath(target: Record<string, unknown>, path: string, value: number): void {
  const keys = path.split(".");
  let node = target;
  for (const key of keys.slice(0, -1)) {
    node[key] = { ...(node[key] as Record<string, unknown>) };
    node = node[key] as Record<string, unknown>;
  }
  node[keys[keys.length - 1]] = value;
}

/** Decimals shown for a length: enough that a stored millimetre value reads back sensibly. */
const lengthDecimals: Record<LengthUnit, number> = { mm: 2, cm: 3, in: 3 };

/** A stored value as the form shows it (lengths in the user's unit, trailing zeros dropped). */
export function displayValue(field: PolicyField, stored: number, unit: LengthUnit): string {
  if (field.kind !== "length") return String(stored);
  return String(Number(fromMm(stored, unit).toFixed(lengthDecimals[unit])));
}

export type FormValues = Record<string, string>;

export function formValuesOf(policy: NetworkPolicy, unit: LengthUnit): FormValues {
  return Object.fromEntries(allFields.map((field) => [field.path, displayValue(field, readPath(policy, field.path), unit)]));
}

/** Text as typed → number (a decimal comma is accepted); empty or unreadable text gives NaN for the schema to name. */
export function parseNumber(text: string): number {
  const trimmed = text.trim().replace(",", ".");
  if (trimmed === "" || !/^[-+]?(\d+\.?\d*|\.\d+)(e[-+]?\d+)?$/i.test(trimmed)) return Number.NaN;
  return Number(trimmed);
}

/**
 * The policy the form describes. `base` is the version the form started from: fields whose text is unchanged
 * keep its exact stored values, and so does text that shows a value of one of the `known` policies. Lengths typed in cm or inches are converted to millimetres (1 in = 25.4 mm,
 * 1959 international yard and pound agreement) and kept to a thousandth of a millimetre.
 */
export function policyFromValues(values: FormValues, base: NetworkPolicy, unit: LengthUnit, known: readonly NetworkPolicy[] = []): NetworkPolicy {
  const start = formValuesOf(base, unit);
  const policy = structuredClone(base) as unknown as Record<string, unknown>;
  for (const field of allFields) {
    const text = values[field.path] ?? "";
    if (text === start[field.path]) continue;
    // text that shows another known policy's value (the defaults filled in) stands for that exact value
    const exact = known.find((other) => displayValue(field, readPath(other, field.path), unit) === text);
    if (exact) {
      writePath(policy, field.path, readPath(exact, field.path));
      continue;
    }
    const typed = parseNumber(text);
    const stored = field.kind === "length" && Number.isFinite(typed) ? Math.round(toMm(typed, unit) * 1000) / 1000 : typed;
    writePath(policy, field.path, stored);
  }
  return policy as unknown as NetworkPolicy;
}

/** Schema issues → one message per field path (the first one). */
export function errorsByPath(issues: readonly { path: readonly PropertyKey[]; message: string }[]): Record<string, string> {
  const errors: Record<string, string> = {};
  for (const issue of issues) {
    const key = issue.path.map(String).join(".") || "form";
    errors[key] ??= issue.message;
  }
  return errors;
}

/** Fields whose value differs between two versions, for the version list. */
export function changedFields(before: NetworkPolicy, after: NetworkPolicy): PolicyField[] {
  return allFields.filter((field) => readPath(before, field.path) !== readPath(after, field.path));
}
