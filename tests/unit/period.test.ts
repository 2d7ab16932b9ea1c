// Quarters, years and ranges. Calendar quarters are January–March, April–June, July–September and
// October–December (common practice; the Gregorian calendar's month lengths and leap years from memory).
import { describe, expect, it } from "vitest";
import {
  comparisonPeriods,
  defaultPeriod,
  formatQuarter,
  isQuarter,
  nextQuarter,
  parsePeriod,
  parseQuarter,
  periodIsRunning,
  periodKindOf,
  periodLabel,
  periodMonths,
  periodOf,
  previousPeriod,
  previousQuarter,
  quarterAtIndex,
  quarterDates,
  quarterIndex,
  quarterLabel,
  quarterOf,
  quarterOfLocalDate,
  quartersBetween,
  quartersOf,
  quarterSpan,
  rangeLabel,
  sameQuarterLastYear,
  shiftQuarter,
  trailingQuarters,
  trendQuarters,
  yearsOf,
} from "../../shared/period";

describe("quarters", () => {
  it("parses and formats, naming the expected form when the text is not a quarter", () => {
    expect(parseQuarter("2026-Q3")).toEqual({ year: 2026, q: 3 });
    expect(formatQuarter({ year: 2026, q: 1 })).toBe("2026-Q1");
    expect(isQuarter("2026-Q5")).toBe(false);
    expect(() => parseQuarter("2026Q3")).toThrow(/use the form 2026-Q3/);
  });

  it("puts each month in its calendar quarter, at both edges of every quarter", () => {
    expect(["2026-01-01", "2026-03-31", "2026-04-01", "2026-06-30", "2026-07-01", "2026-09-30", "2026-10-01", "2026-12-31"].map(quarterOf)).toEqual([
      "2026-Q1",
      "2026-Q1",
      "2026-Q2",
      "2026-Q2",
      "2026-Q3",
      "2026-Q3",
      "2026-Q4",
      "2026-Q4",
    ]);
    expect(() => quarterOf("2026-13-01")).toThrow(/no month 13/);
    expect(() => quarterOf("1 July 2026")).toThrow(/use the form 2026-07-14/);
    expect(quarterOfLocalDate(new Date(2026, 11, 1))).toBe("2026-Q4");
    expect(quarterOfLocalDate(new Date(2026, 2, 31, 23, 59))).toBe("2026-Q1");
  });

  it("gives the first and last day of a quarter, leap years included", () => {
    expect(quarterDates("2024-Q1")).toEqual({ first: "2024-01-01", last: "2024-03-31" });
    expect(quarterDates("2026-Q2")).toEqual({ first: "2026-04-01", last: "2026-06-30" });
    expect(quarterDates("2026-Q4")).toEqual({ first: "2026-10-01", last: "2026-12-31" });
  });

  it("steps across year ends in both directions", () => {
    expect(previousQuarter("2026-Q1")).toBe("2025-Q4");
    expect(nextQuarter("2026-Q4")).toBe("2027-Q1");
    expect(sameQuarterLastYear("2026-Q3")).toBe("2025-Q3");
    expect(shiftQuarter("2026-Q2", -9)).toBe("2024-Q1");
    expect(shiftQuarter("2026-Q2", 11)).toBe("2029-Q1");
    expect(quarterAtIndex(quarterIndex("2026-Q4") + 1)).toBe("2027-Q1");
  });

  it("lists and counts the quarters of a span", () => {
    expect(quartersBetween("2025-Q3", "2026-Q2")).toEqual(["2025-Q3", "2025-Q4", "2026-Q1", "2026-Q2"]);
    expect(quartersBetween("2026-Q2", "2026-Q1")).toEqual([]);
    expect(quarterSpan("2025-Q3", "2026-Q2")).toBe(4);
    expect(quarterSpan("2016-Q1", "2025-Q4")).toBe(40);
    expect(() => quartersBetween("2026-Q1", "2026")).toThrow(RangeError);
  });
});

describe("labels", () => {
  it("writes a quarter one way everywhere, and ranges and years around it", () => {
    expect(quarterLabel("2026-Q3")).toBe("2026 Q3");
    expect(rangeLabel({ from: "2026-Q3", to: "2026-Q3" })).toBe("2026 Q3");
    expect(rangeLabel({ from: "2025-Q4", to: "2026-Q3" })).toBe("2025 Q4 to 2026 Q3");
    expect(periodLabel("2026-Q3")).toBe("2026 Q3");
    expect(periodLabel("2026")).toBe("2026 (whole year)");
  });

  it("names the months a report period covers", () => {
    expect(periodMonths(parsePeriod("2026-Q3")!)).toBe("July–September 2026");
    expect(periodMonths(parsePeriod("2026")!)).toBe("January–December 2026");
  });
});

describe("years and report periods", () => {
  it("reads a quarter or a year, forgiving case and spaces, and refuses anything else", () => {
    expect(parsePeriod(" 2026-q3 ")).toEqual({ id: "2026-Q3", kind: "quarter", year: 2026, quarter: 3 });
    expect(parsePeriod("2026")).toEqual({ id: "2026", kind: "year", year: 2026, quarter: null });
    expect(parsePeriod("2026-Q5")).toBeNull();
    expect(parsePeriod("1999")).toBeNull();
    expect(periodKindOf("2026")).toBe("year");
    expect(periodKindOf("2026-Q1")).toBe("quarter");
  });

  it("covers a year with its four quarters and compares it with the year before", () => {
    const year = parsePeriod("2026")!;
    expect(quartersOf(year)).toEqual(["2026-Q1", "2026-Q2", "2026-Q3", "2026-Q4"]);
    expect(comparisonPeriods(year)).toEqual([{ label: "the previous year", period: { id: "2025", kind: "year", year: 2025, quarter: null } }]);
    expect(trailingQuarters(year, 3)).toEqual(["2026-Q2", "2026-Q3", "2026-Q4"]);
  });

  it("compares a first quarter with the last quarter of the year before and with a year earlier", () => {
    expect(comparisonPeriods(parsePeriod("2026-Q1")!)).toEqual([
      { label: "the previous quarter", period: { id: "2025-Q4", kind: "quarter", year: 2025, quarter: 4 } },
      { label: "the same quarter last year", period: { id: "2025-Q1", kind: "quarter", year: 2025, quarter: 1 } },
    ]);
    expect(trailingQuarters(parsePeriod("2026-Q1")!, 3)).toEqual(["2025-Q3", "2025-Q4", "2026-Q1"]);
  });

  it("opens on the newest quarter that has ended, and lists years with data", () => {
    const quarters = ["2026-Q4", "2026-Q3", "2026-Q2", "2025-Q4"];
    expect(defaultPeriod(quarters, new Date(2026, 11, 1))).toBe("2026-Q3");
    expect(defaultPeriod(["2026-Q4"], new Date(2026, 11, 1))).toBe("2026-Q4");
    expect(defaultPeriod([], new Date(2026, 11, 1))).toBeNull();
    expect(yearsOf(quarters)).toEqual(["2026", "2025"]);
  });

  it("says whether a quarter or year is still running", () => {
    const today = new Date(2026, 7, 15);
    expect(periodIsRunning("2026-Q3", today)).toBe(true);
    expect(periodIsRunning("2026-Q2", today)).toBe(false);
    expect(periodIsRunning("2026", today)).toBe(true);
    expect(periodIsRunning("2025", today)).toBe(false);
  });
});

describe("ranges", () => {
  it("takes the previous period of a single quarter across a year end", () => {
    expect(previousPeriod(periodOf("2026-Q1", "2026-Q1"))).toEqual({ from: "2025-Q4", to: "2025-Q4", quarters: ["2025-Q4"] });
  });

  it("takes the previous period of a range as the same number of quarters just before it", () => {
    expect(previousPeriod(periodOf("2025-Q4", "2026-Q2"))).toEqual({ from: "2025-Q1", to: "2025-Q3", quarters: ["2025-Q1", "2025-Q2", "2025-Q3"] });
  });

  it("shows a range's own quarters as its trend, and the last eight quarters up to a single quarter", () => {
    const range = periodOf("2025-Q4", "2026-Q2");
    expect(trendQuarters(range)).toBe(range);
    expect(trendQuarters(periodOf("2026-Q2", "2026-Q2")).quarters).toEqual(quartersBetween("2024-Q3", "2026-Q2"));
    expect(trendQuarters(periodOf("2026-Q2", "2026-Q2"), 3)).toEqual({ from: "2025-Q4", to: "2026-Q2", quarters: ["2025-Q4", "2026-Q1", "2026-Q2"] });
  });
});
