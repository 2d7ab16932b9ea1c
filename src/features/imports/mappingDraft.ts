// The mapping step's state and the mapping JSON it turns into. The page holds, for each Quarterbeat column,
// the file column the person chose; the server wants only the renames (a column read under its own name
// needs no entry), the units of the file and any value translations (shared/import/mapping.ts).
import { courseTypes, equipmentEventTypes, feedbackModes, type ImportKind } from "../../../shared/domain";
import { importColumns, type UnitGroup } from "../../../shared/import/columns";
import { resolveHeader, type HeaderProblem } from "../../../shared/import/header";
import { depthUnits, identityMapping, shareUnits, timeUnits, type ImportMapping } from "../../../shared/import/mapping";
import { patientTypes } from "../../../shared/scoring/policy";

export type DepthUnit = (typeof depthUnits)[number];
export type TimeUnit = (typeof timeUnits)[number];
export type ShareUnit = (typeof shareUnits)[number];

export interface MappingDraft {
  /** Quarterbeat column → the file's column name as it appears in the header, or "" for "not in the file". */
  columns: Record<string, string>;
  units: { depth: DepthUnit; time: TimeUnit; shares: ShareUnit };
  /** Quarterbeat column → { value in the file → Quarterbeat value }. */
  values: Record<string, Record<string, string>>;
}

const normalise = (name: string) => name.trim().toLowerCase();

/** The header's spelling of a column name, matched the way the server matches (case and spaces ignored). */
function inHeader(header: readonly string[], name: string): string | null {
  const found = header.find((h) => normalise(h) === normalise(name));
  return found === undefined ? null : found.trim();
}

/** The draft a mapping describes for this file: what each Quarterbeat column would read. */
export function draftFromMapping(kind: ImportKind, header: readonly string[], mapping: ImportMapping): MappingDraft {
  const columns: Record<string, string> = {};
  for (const spec of importColumns[kind]) {
    const source = mapping.columns[spec.name] ?? spec.name;
    columns[spec.name] = inHeader(header, source) ?? "";
  }
  return { columns, units: { ...mapping.units }, values: structuredClone(mapping.values) };
}

/** The mapping JSON the server expects (importMappingSchema): renames only, units, value translations. */
export function buildMapping(kind: ImportKind, draft: MappingDraft): ImportMapping {
  const columns: Record<string, string> = {};
  for (const spec of importColumns[kind]) {
    const source = draft.columns[spec.name] ?? "";
    if (source !== "" && normalise(source) !== normalise(spec.name)) columns[spec.name] = source.trim();
  }
  const values: Record<string, Record<string, string>> = {};
  for (const [column, translations] of Object.entries(draft.values)) {
    const kept = Object.fromEntries(Object.entries(translations).filter(([, to]) => to !== ""));
    if (Object.keys(kept).length > 0 && importColumns[kind].some((c) => c.name === column)) values[column] = kept;
  }
  const units = { ...identityMapping.units, ...draft.units };
  return { columns, units, values };
}

/** Header problems under the draft, checked in the browser with the server's own rules. */
export function draftProblems(kind: ImportKind, header: readonly string[], draft: MappingDraft): HeaderProblem[] {
  const problems = resolveHeader(header, kind, buildMapping(kind, draft)).problems;
  // Two Quarterbeat columns read from the same file column is almost always a slip.
  const seen = new Map<string, string>();
  for (const spec of importColumns[kind]) {
    const source = draft.columns[spec.name];
    if (!source) continue;
    const earlier = seen.get(normalise(source));
    if (earlier) problems.push({ column: spec.name, reason: `"${source}" is already read as ${earlier}` });
    else seen.set(normalise(source), spec.name);
  }
  return problems;
}

/** A file column whose name is a Quarterbeat column of this kind is always read as that column. */
export function readUnderOwnName(kind: ImportKind, header: readonly string[], column: string): boolean {
  return importColumns[kind].some((c) => c.name === column) && inHeader(header, column) !== null;
}

/** The unit conversions that matter for a kind, in the order the page asks about them. */
export function unitGroupsOf(kind: ImportKind): UnitGroup[] {
  const groups = new Set(importColumns[kind].map((c) => c.unit).filter((u): u is UnitGroup => u !== undefined));
  return (["depth", "time", "share"] as const).filter((g) => groups.has(g));
}

/** Columns whose values come from a fixed list, with that list (what value translations can map to). */
export const enumColumnValues: Record<string, readonly string[]> = {
  course: courseTypes,
  profile: patientTypes,
  patient_type: patientTypes,
  feedback: feedbackModes,
  instructor_result: ["pass", "fail"],
  event: equipmentEventTypes,
};

export interface UnknownValue {
  column: string;
  value: string;
  allowed: readonly string[];
}

/**
 * Values in the preview rows that the fixed-list columns would refuse (ignoring any translation already
 * chosen), so the person can say what each one means. Empty cells are left alone: some columns allow them.
 */
export function unknownValues(kind: ImportKind, header: readonly string[], rows: readonly (readonly string[])[], draft: MappingDraft): UnknownValue[] {
  const found: UnknownValue[] = [];
  for (const spec of importColumns[kind]) {
    const allowed = enumColumnValues[spec.name];
    const source = draft.columns[spec.name];
    if (!allowed || !source) continue;
    const position = header.findIndex((h) => normalise(h) === normalise(source));
    if (position < 0) continue;
    const distinct = new Set<string>();
    for (const row of rows) {
      const value = (row[position] ?? "").trim();
      if (value !== "" && !allowed.includes(value)) distinct.add(value);
    }
    for (const value of [...distinct].sort()) found.push({ column: spec.name, value, allowed });
  }
  return found;
}
