// Row-level checks shared by the importer and `quarterbeat analyze`.
import { describe, expect, it } from "vitest";
import { resolveHeader } from "../../../shared/import/header";
import { identityMapping, importMappingSchema, unitFactors } from "../../../shared/import/mapping";
import { isOffsetDateTime, parseDecimal, RowReader } from "../../../shared/import/rows";
import { suggestMapping } from "../../../shared/import/suggest";
import { MM_PER_INCH } from "../../../shared/units";

describe("numbers and times", () => {
  it("reads strict decimals only", () => {
    expect([parseDecimal("12"), parseDecimal("-1.5"), parseDecimal(".5"), parseDecimal("1e3"), parseDecimal("+2.")]).toEqual([12, -1.5, 0.5, 1000, 2]);
    for (const bad of ["", " 1", "0x10", "1,5", "Infinity", "NaN", "1e", "--1", "."]) expect(parseDecimal(bad)).toBeNaN();
  });

  it("accepts ISO 8601 times with an offset or Z, and nothing else", () => {
    for (const good of ["2026-07-14T09:30Z", "2026-07-14T09:30:00+02:00", "2026-07-14T23:59:59.123456-05:30", "2024-02-29T00:00:00Z"]) {
      expect(isOffsetDateTime(good), good).toBe(true);
    }
    for (const bad of [
      "2026-07-14T09:30:00",
      "2026-07-14 09:30:00Z",
      "2026-02-29T10:00Z",
      "2026-07-14T24:00Z",
      "2026-07-14T09:60Z",
      "2026-07-14T09:30:00+0200",
      "2026-07-14T09:30:00.Z",
    ]) {
      expect(isOffsetDateTime(bad), bad).toBe(false);
    }
  });
});

describe("mapping", () => {
  it("fills defaults and converts inches exactly (1 in = 25.4 mm, 1959 international yard and pound agreement)", () => {
    const mapping = importMappingSchema.parse({ units: { depth: "in" } });
    expect(mapping).toEqual({ columns: {}, units: { depth: "in", time: "ms", shares: "percent" }, values: {} });
    expect(MM_PER_INCH).toBe(25.4);
    expect(unitFactors(mapping).depth).toBe(25.4);
    const header = resolveHeader(["t_ms", "depth_mm", "release_mm"], "compressions", mapping);
    const reader = new RowReader("compressions", header, mapping);
    const out = { tMs: 0, depthTenths: 0, releaseTenths: 0 };
    // 2 in = 50.8 mm and 0.1 in = 2.54 mm → 2.5 mm at the stored precision of a tenth of a millimetre
    expect(reader.at(["1500", "2", "0.1"], 1).compressionValues(out)).toBe(true);
    expect(out).toEqual({ tMs: 1500, depthTenths: 508, releaseTenths: 25 });
  });

  it("refuses unknown keys and units", () => {
    expect(importMappingSchema.safeParse({ units: { depth: "ft" } }).success).toBe(false);
    expect(importMappingSchema.safeParse({ column: {} }).success).toBe(false);
  });

  it("finds columns ignoring case and spaces, and names what is missing", () => {
    const resolved = resolveHeader([" Class_ID ", "date", "site", "course", "learners", "passed", "manikins", "extra"], "classes", identityMapping);
    expect(resolved.index.class_id).toBe(0);
    expect(resolved.problems).toEqual([{ column: "instructor", reason: `required column "instructor" is missing from the header` }]);
    expect(resolved.extra).toEqual(["extra"]);
  });

  it("suggests a mapping for an invented device's export", () => {
    const header = ["Run", "Class", "Trainee", "Unit", "Patient", "Mode", "Begin", "Verdict", "Time (s)", "Depth (cm)", "Residual (cm)"];
    const { mapping, matches } = suggestMapping("compressions", header);
    expect(matches).toMatchObject({
      attempt_id: "Run",
      class_id: "Class",
      learner: "Trainee",
      t_ms: "Time (s)",
      depth_mm: "Depth (cm)",
      release_mm: "Residual (cm)",
    });
    expect(mapping.units).toEqual({ depth: "cm", time: "s", shares: "percent" });
    const shares = suggestMapping("attempts", ["attempt_id", "depth_ok_pct", "too_shallow_pct"], [["A", "0.8", "0.2"]]);
    expect(shares.mapping.units.shares).toBe("fraction");
  });
});
