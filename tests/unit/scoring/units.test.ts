// Length units. 1 in = 25.4 mm exactly: international yard and pound agreement, 1959.
import { describe, expect, it } from "vitest";
import { formatLength, fromMm, MM_PER_INCH, toMm } from "../../../shared/units";

describe("length units", () => {
  it("1 in is exactly 25.4 mm (international yard and pound agreement, 1959)", () => {
    expect(MM_PER_INCH).toBe(25.4);
    expect(toMm(1, "in")).toBe(25.4);
    expect(fromMm(25.4, "in")).toBe(1);
  });

  it("converts the guideline depths (AHA 2020: 1.5 in, 2 in, 2.4 in)", () => {
    expect(toMm(1.5, "in")).toBeCloseTo(38.1, 12);
    expect(toMm(2, "in")).toBe(50.8);
    expect(toMm(2.4, "in")).toBeCloseTo(60.96, 12);
    expect(fromMm(50, "cm")).toBe(5);
    expect(toMm(5, "cm")).toBe(50);
    expect(toMm(7, "mm")).toBe(7);
  });

  it("round-trips through every unit", () => {
    for (const unit of ["mm", "cm", "in"] as const) {
      for (const mm of [0, 3.5, 38.1, 50, 60.96]) expect(toMm(fromMm(mm, unit), unit)).toBeCloseTo(mm, 12);
    }
  });

  it("formats with sensible decimals", () => {
    expect(formatLength(50, "mm")).toBe("50 mm");
    expect(formatLength(38.1, "mm")).toBe("38.1 mm");
    expect(formatLength(54.43, "mm")).toBe("54.4 mm");
    expect(formatLength(50, "cm")).toBe("5.0 cm");
    expect(formatLength(38.1, "cm")).toBe("3.8 cm");
    expect(formatLength(50.8, "in")).toBe("2.00 in");
    expect(formatLength(60, "in")).toBe("2.36 in");
    expect(formatLength(-0.01, "mm")).toBe("0 mm");
    expect(formatLength(NaN, "cm")).toBe("–");
  });
});
