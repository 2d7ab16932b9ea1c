import { describe, expect, it } from "vitest";
import { formatQuarter, isQuarter, nextQuarter, parseQuarter, previousQuarter, quarterDates, quarterOf, quartersBetween, sameQuarterLastYear } from "../../../shared/quarter";

describe("quarters", () => {
  it("parses and formats", () => {
    expect(parseQuarter("2026-Q3")).toEqual({ year: 2026, q: 3 });
    expect(formatQuarter({ year: 2026, q: 1 })).toBe("2026-Q1");
    expect(isQuarter("2026-Q5")).toBe(false);
    expect(() => parseQuarter("2026Q3")).toThrow(/use the form 2026-Q3/);
  });

  it("puts each month in its calendar quarter", () => {
    expect(["2026-01-01", "2026-03-31", "2026-04-01", "2026-06-30", "2026-07-01", "2026-09-30", "2026-10-01", "2026-12-31"].map(quarterOf)).toEqual([
      "2026-Q1", "2026-Q1", "2026-Q2", "2026-Q2", "2026-Q3", "2026-Q3", "2026-Q4", "2026-Q4",
    ]);
    expect(() => quarterOf("2026-13-01")).toThrow(/no month 13/);
  });

  it("steps across year ends and lists ranges", () => {
    expect(previousQuarter("2026-Q1")).toBe("2025-Q4");
    expect(nextQuarter("2026-Q4")).toBe("2027-Q1");
    expect(sameQuarterLastYear("2026-Q3")).toBe("2025-Q3");
    expect(quartersBetween("2025-Q3", "2026-Q2")).toEqual(["2025-Q3", "2025-Q4", "2026-Q1", "2026-Q2"]);
    expect(quartersBetween("2026-Q2", "2026-Q1")).toEqual([]);
    expect(quarterDates("2024-Q1")).toEqual({ first: "2024-01-01", last: "2024-03-31" });
    expect(quarterDates("2026-Q4")).toEqual({ first: "2026-10-01", last: "2026-12-31" });
  });
});
