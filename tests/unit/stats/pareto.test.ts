import { describe, expect, it } from "vitest";
import { pareto } from "../../../shared/stats";

describe("pareto", () => {
  it("sorts by count with shares and cumulative shares", () => {
    // hand-computed: total 10
    expect(pareto({ "too shallow": 3, "incomplete recoil": 5, "too slow": 2 })).toEqual([
      { name: "incomplete recoil", count: 5, share: 0.5, cumulativeShare: 0.5 },
      { name: "too shallow", count: 3, share: 0.3, cumulativeShare: 0.8 },
      { name: "too slow", count: 2, share: 0.2, cumulativeShare: 1 },
    ]);
  });

  it("breaks ties by name and ends the cumulative share at exactly 1", () => {
    const rows = pareto({ c: 1, b: 1, a: 1, d: 4 });
    expect(rows.map((row) => row.name)).toEqual(["d", "a", "b", "c"]);
    expect(rows.map((row) => row.cumulativeShare)).toEqual([4 / 7, 5 / 7, 6 / 7, 1]); // hand-computed
    // ten shares of 0.1 add up to 0.9999999999999999 in floating point; the last row must still be 1
    const tenths = pareto(Object.fromEntries("abcdefghij".split("").map((name) => [name, 1])));
    expect(tenths.at(-1)!.cumulativeShare).toBe(1);
  });

  it("handles empty input and zero totals without NaN", () => {
    expect(pareto({})).toEqual([]);
    expect(pareto({ a: 0, b: 0 })).toEqual([
      { name: "a", count: 0, share: 0, cumulativeShare: 0 },
      { name: "b", count: 0, share: 0, cumulativeShare: 0 },
    ]);
  });

  it("rejects negative or non-finite counts with the category name", () => {
    expect(() => pareto({ late: -1 })).toThrow(/"late"/);
    expect(() => pareto({ late: Number.NaN })).toThrow(/"late"/);
  });
});
