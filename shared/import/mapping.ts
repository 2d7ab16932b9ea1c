// A column mapping turns another tool's CSV export into one of Quarterbeat's formats before validation:
// it renames columns, converts units and translates enum values. The CLI reads it from --map FILE; the web
// keeps the same JSON as a named preset.
import { z } from "zod";
import type { ImportKind } from "../domain";
import { MM_PER_CM, MM_PER_INCH } from "../units";
import { importColumns, type UnitGroup } from "./columns";

export const depthUnits = ["mm", "cm", "in"] as const;
export const timeUnits = ["ms", "s"] as const;
export const shareUnits = ["percent", "fraction"] as const;

export const importMappingSchema = z
  .object({
    /** Quarterbeat column → column name in the file (matched ignoring case and surrounding spaces). */
    columns: z.record(z.string().min(1), z.string().trim().min(1, "Name the column in the file")).default({}),
    units: z
      .object({
        /** Unit of depth_mm and release_mm in the file. 1 in = 25.4 mm exactly, 1 cm = 10 mm. */
        depth: z.enum(depthUnits).default("mm"),
        /** Unit of t_ms in the file. */
        time: z.enum(timeUnits).default("ms"),
        /** Shares (*_pct) as percentages 0–100 or fractions 0–1. */
        shares: z.enum(shareUnits).default("percent"),
      })
      .strict()
      .default({ depth: "mm", time: "ms", shares: "percent" }),
    /** Quarterbeat column → { value in the file → Quarterbeat value }, e.g. feedback: { on: "live" }. */
    values: z.record(z.string().min(1), z.record(z.string(), z.string())).default({}),
  })
  .strict();

export type ImportMapping = z.infer<typeof importMappingSchema>;
export type ImportMappingInput = z.input<typeof importMappingSchema>;

export const identityMapping: ImportMapping = {
  columns: {},
  units: { depth: "mm", time: "ms", shares: "percent" },
  values: {},
};

/** Factor from the file's unit to Quarterbeat's (mm, ms, percent) for each unit group. */
export function unitFactors(mapping: ImportMapping): Record<UnitGroup, number> {
  return {
    depth: mapping.units.depth === "in" ? MM_PER_INCH : mapping.units.depth === "cm" ? MM_PER_CM : 1,
    time: mapping.units.time === "s" ? 1000 : 1,
    share: mapping.units.shares === "fraction" ? 100 : 1,
  };
}

/** Mapping keys that are not columns of the kind: the mapping was written for another format. */
export function unknownMappingColumns(kind: ImportKind, mapping: ImportMapping): string[] {
  const known = new Set(importColumns[kind].map((c) => c.name));
  return [...Object.keys(mapping.columns), ...Object.keys(mapping.values)].filter((name) => !known.has(name));
}
