import { describe, expect, it } from "vitest";
import { changeVerdict, proportionDifference } from "../../../shared/stats/difference";

// Newcombe, "Interval estimation for the difference between independent proportions: comparison of eleven
// methods", Stat Med 1998;17:873–890, Table II, method 10 (hybrid score interval without continuity correction).
const newcombeTableII: [x1: number, n1: number, x2: number, n2: number, difference: number, low: number, high: number][] = [
  [56, 70, 48, 80, 0.2, 0.0524, 0.3339],
  [9, 10, 3, 10, 0.6, 0.1705, 0.809],
  [6, 7, 2, 7, 0.5714, 0.0582, 0.8062],
  [5, 56, 0, 29, 0.0893, -0.0381, 0.1926],
  [0, 10, 0, 20, 0, -0.1611, 0.2775],
  [10, 10, 0, 20, 1, 0.6791, 1],
];

describe("proportionDifference", () => {
  it.each(newcombeTableII)("%i/%i − %i/%i matches Newcombe 1998, Table II (method 10)", (x1, n1, x2, n2, difference, low, high) => {
    const result = proportionDifference(x1, n1, x2, n2)!;
    expect(result.difference).toBeCloseTo(difference, 4);
    expect(result.low).toBeCloseTo(low, 4);
    expect(result.high).toBeCloseTo(high, 4);
  });

  it("is null when either group is empty", () => {
    expect(proportionDifference(0, 0, 3, 10)).toBeNull();
  });
});

describe("changeVerdict", () => {
  it("calls a change only when the interval of the difference excludes zero", () => {
    expect(changeVerdict(proportionDifference(56, 70, 48, 80)!)).toBe("up");
    expect(changeVerdict(proportionDifference(48, 80, 56, 70)!)).toBe("down");
    // 5/56 against 0/29: the interval (−3.8 to +19.3 points) includes no change
    expect(changeVerdict(proportionDifference(5, 56, 0, 29)!)).toBe("no clear change");
  });

  it("reads 0.5 points on about a thousand attempts a quarter as no clear change", () => {
    // 300/1000 against 295/1000: a difference of 0.5 points is far inside chance variation
    expect(changeVerdict(proportionDifference(300, 1000, 295, 1000)!)).toBe("no clear change");
  });
});
