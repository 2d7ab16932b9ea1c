import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  hiddenReasonOf,
  hidesOthers,
  isSafeGroup,
  measureShows,
  releaseGrid,
  releaseMeasure,
  releaseShows,
  wholeGroupShown,
  type FamilyCell,
  type GridCell,
} from "../../../shared/suppression";
import { LEVELS } from "../../../server/insight/release";

const MIN = 5;

/**
 * Every value a hidden cell of one quarter could take for a reader who sees the quarter's total, its shown
 * cells and the labels ("fewer than 5" = 1…4, a zero reads "no data"; "not shown" = at least 5). Brute
 * force, independent of the code under test.
 */
function possibleValues(values: number[], hidden: boolean[], index: number): number[] {
  const members = hidden.flatMap((isHidden, i) => (isHidden ? [i] : []));
  const remainder = members.reduce((sum, i) => sum + values[i], 0);
  const range = (i: number): [number, number] => (values[i] < MIN ? [1, MIN - 1] : [MIN, remainder]);
  const found = new Set<number>();
  const chosen: number[] = [];
  const walk = (k: number, sum: number) => {
    if (sum > remainder) return;
    if (k === members.length) {
      if (sum === remainder) found.add(chosen[members.indexOf(index)]);
      return;
    }
    const [low, high] = range(members[k]);
    for (let v = low; v <= high; v++) {
      chosen[k] = v;
      walk(k + 1, sum + v);
    }
  };
  walk(0, 0);
  return [...found];
}

const CATEGORIES = ["a", "b", "c", "d", "e", "f"];

/** One breakdown over the given quarters' counts, categories a, b, c, … */
function cellsOf(byQuarter: Record<string, number[]>): FamilyCell[] {
  return Object.entries(byQuarter).flatMap(([quarter, counts]) => counts.map((count, i) => ({ quarter, category: CATEGORIES[i], count })));
}

const YEAR = ["2026-Q1", "2026-Q2", "2026-Q3", "2026-Q4"];

describe("releaseMeasure (the funder report family)", () => {
  it("pools a small cell with its quarter's smallest other cell, and hides the year's counts of both", () => {
    const release = releaseMeasure({ course: cellsOf({ "2026-Q1": [30, 12, 3], "2026-Q2": [20, 6, 6] }) }, MIN);
    const shows = (quarters: string[], category: string | null) => measureShows(release, quarters, "course", category);
    expect(["a", "b", "c"].map((c) => shows(["2026-Q1"], c))).toEqual([true, false, false]);
    expect(["a", "b", "c"].map((c) => shows(["2026-Q2"], c))).toEqual([true, true, true]);
    // the year's b and c less 2026-Q2's would be 2026-Q1's hidden cells
    expect(["a", "b", "c"].map((c) => shows(YEAR, c))).toEqual([true, false, false]);
    expect(shows(["2026-Q1"], null) && shows(YEAR, null)).toBe(true);
  });

  it("withholds a quarter whose own total is small, and every count of its year, leaving the other quarters alone", () => {
    const release = releaseMeasure({ total: cellsOf({ "2026-Q1": [40], "2026-Q2": [9], "2026-Q3": [3], "2026-Q4": [0] }) }, MIN);
    const shows = (quarters: string[]) => measureShows(release, quarters, "total", null);
    expect(YEAR.map((q) => shows([q]))).toEqual([true, true, false, true]);
    // the year less 2026-Q1, Q2 and Q4 would be 2026-Q3's 3
    expect(shows(YEAR)).toBe(false);
    expect(shows(["2025-Q3"])).toBe(true);
  });

  it("decides each quarter from its own cells, so a quarter added later changes no earlier quarter", () => {
    const before = releaseMeasure({ course: cellsOf({ "2026-Q1": [30, 12, 3], "2026-Q2": [20, 6, 6] }) }, MIN);
    const after = releaseMeasure({ course: cellsOf({ "2026-Q1": [30, 12, 3], "2026-Q2": [20, 6, 6], "2026-Q3": [2, 0, 1] }) }, MIN);
    for (const quarter of ["2026-Q1", "2026-Q2"]) {
      for (const category of [null, "a", "b", "c"]) {
        expect(measureShows(after, [quarter], "course", category)).toBe(measureShows(before, [quarter], "course", category));
      }
    }
  });

  it("withholds the quarter when one breakdown cannot pool its small cells, in every breakdown of the measure", () => {
    // 4 + 4 = 8 with both "fewer than 5" pins each at 4
    const release = releaseMeasure(
      { first: cellsOf({ "2026-Q1": [4, 4], "2026-Q2": [20, 20] }), second: cellsOf({ "2026-Q1": [8, 0], "2026-Q2": [30, 10] }) },
      MIN,
    );
    expect(measureShows(release, ["2026-Q1"], "first", null)).toBe(false);
    expect(measureShows(release, ["2026-Q1"], "second", "a")).toBe(false);
    expect(measureShows(release, ["2026-Q2"], "second", "a")).toBe(true);
  });

  it("labels a hidden count by its own size: 1–4 'small', anything else 'protects-other'", () => {
    expect([1, 4, 5, 0, 40].map((n) => hiddenReasonOf(n, MIN))).toEqual(["small", "small", "protects-other", "protects-other", "protects-other"]);
  });

  it("property: every quarter cell of 1 to 4 is hidden, a zero never is, and no hidden cell is pinned by the quarter's total", () => {
    fc.assert(
      fc.property(fc.array(fc.nat({ max: 25 }), { minLength: 1, maxLength: 5 }), (values) => {
        const release = releaseMeasure({ only: cellsOf({ "2026-Q1": values, "2026-Q2": values.map(() => 50) }) }, MIN);
        const totalShown = measureShows(release, ["2026-Q1"], "only", null);
        const hidden = values.map((_, i) => !measureShows(release, ["2026-Q1"], "only", CATEGORIES[i]));
        values.forEach((value, i) => {
          if (value > 0 && value < MIN) expect(hidden[i]).toBe(true);
          if (value === 0 && totalShown) expect(hidden[i]).toBe(false);
          if (!hidden[i] || !totalShown) return;
          const options = possibleValues(values, hidden, i);
          expect(options).toContain(value);
          expect(options.length).toBeGreaterThan(1);
        });
      }),
      { numRuns: 300 },
    );
  });

  it("property: with every cell 0 or at least 5, nothing is hidden", () => {
    fc.assert(
      fc.property(fc.array(fc.oneof(fc.constant(0), fc.integer({ min: MIN, max: 60 })), { minLength: 1, maxLength: 6 }), (values) => {
        const release = releaseMeasure({ only: cellsOf({ "2026-Q1": values, "2026-Q3": [...values].reverse() }) }, MIN);
        expect(release.withheld.size).toBe(0);
        expect(release.quarterPools.only).toEqual([]);
      }),
    );
  });
});

describe("the pages' rules", () => {
  it("hide a group holding 1 to 4 of others' attempts, never an empty one", () => {
    expect([0, 1, 4, 5, 12].map((n) => hidesOthers(n, MIN))).toEqual([false, true, true, false, false]);
  });
});

describe("the released grid", () => {
  const rule = { minCount: MIN, minInstructors: 3 };
  /** cells over (quarter, site, feedback): attempts by instructor */
  const cell = (quarter: string, site: string, feedback: string, byInstructor: Record<number, number>): GridCell => ({
    coords: [quarter, site, feedback],
    others: new Map(Object.entries(byInstructor).map(([id, n]) => [Number(id), n])),
  });
  const levels = [[0, 1], [0]];
  const where = (quarter: string, site?: string, feedback?: string) => (coords: readonly (string | number)[]) =>
    coords[0] === quarter && (site === undefined || coords[1] === site) && (feedback === undefined || coords[2] === feedback);

  it("calls a group safe with at least the threshold of attempts from at least the fewest instructors, or none at all", () => {
    expect(isSafeGroup(0, 0, rule)).toBe(true);
    expect(isSafeGroup(5, 3, rule)).toBe(true);
    expect(isSafeGroup(4, 3, rule)).toBe(false);
    // eleven attempts, all one colleague's: a "group" of one person
    expect(isSafeGroup(11, 1, rule)).toBe(false);
  });

  it("hides an answer that would cut a pool, so a hidden cell is never a difference of two shown answers", () => {
    // site L: live 13 attempts from three instructors; hidden 3 attempts of one colleague
    const release = releaseGrid(
      [cell("Q4", "L", "live", { 1: 5, 2: 4, 3: 4 }), cell("Q4", "L", "hidden", { 2: 3 }), cell("Q4", "M", "live", { 4: 6, 5: 6, 6: 6 })],
      levels,
      rule,
    );
    expect(releaseShows(release, where("Q4", "L"))).toBe(true);
    expect(releaseShows(release, where("Q4"))).toBe(true);
    // live at L alone would give the hidden 3 away as (site L) − (site L, live)
    expect(releaseShows(release, where("Q4", "L", "live"))).toBe(false);
    expect(releaseShows(release, where("Q4", "L", "hidden"))).toBe(false);
    expect(releaseShows(release, where("Q4", "M", "live"))).toBe(true);
  });

  it("pools across sites when a site cannot protect a small cell on its own, and withholds what nothing can protect", () => {
    const release = releaseGrid(
      [cell("Q1", "L", "live", { 1: 2 }), cell("Q1", "M", "live", { 2: 2 }), cell("Q1", "N", "live", { 3: 2 }), cell("Q2", "L", "live", { 1: 2 })],
      levels,
      rule,
    );
    // Q1: three colleagues' 2 + 2 + 2 pooled over the quarter: the quarter is shown, no site is
    expect(releaseShows(release, where("Q1"))).toBe(true);
    expect(releaseShows(release, where("Q1", "L"))).toBe(false);
    // Q2 holds 2 attempts of one colleague and nothing to pool with: withheld from every answer that takes it
    expect(releaseShows(release, where("Q2"))).toBe(false);
    expect(releaseShows(release, (coords) => coords[0] === "Q1" || coords[0] === "Q2")).toBe(false);
  });

  it("takes a safe pool whole as the complement of a small cell at a coarser level", () => {
    // L live (three colleagues) is safe on its own; L hidden (one colleague, 4) needs a complement, and the
    // only one is the live cell: the site is shown, neither display alone
    const release = releaseGrid([cell("Q1", "L", "live", { 1: 2, 2: 2, 3: 2 }), cell("Q1", "L", "hidden", { 1: 4 })], levels, rule);
    expect(releaseShows(release, where("Q1", "L"))).toBe(true);
    expect(releaseShows(release, where("Q1", "L", "live"))).toBe(false);
    expect(releaseShows(release, where("Q1", "L", "hidden"))).toBe(false);
  });

  it("shows an answer over whole quarters exactly when each quarter's others form a safe group, as judging the grid does", () => {
    // cells over the pages' grid (quarter, site, patient type, display, manikin), up to three quarters, with
    // the pages' levels: the shortcut the pages take for answers without a narrowing filter must agree
    const gridCell = fc.record({
      quarter: fc.constantFrom("Q1", "Q2", "Q3"),
      site: fc.constantFrom(1, 2, 3),
      profile: fc.constantFrom("adult", "child", "infant"),
      feedback: fc.constantFrom("live", "hidden"),
      manikin: fc.constantFrom(0, 1, 2),
      others: fc.dictionary(fc.constantFrom("1", "2", "3", "4", "5"), fc.nat({ max: 6 }), { maxKeys: 3 }),
    });
    // the shortcut holds because the pages' last level is the quarter alone
    expect(LEVELS.at(-1)).toEqual([0]);
    fc.assert(
      fc.property(
        fc.uniqueArray(gridCell, { selector: (c) => [c.quarter, c.site, c.profile, c.feedback, c.manikin].join("|"), maxLength: 25 }),
        fc.integer({ min: 1, max: 12 }),
        fc.integer({ min: 1, max: 4 }),
        (cells, minCount, minInstructors) => {
          const rule = { minCount, minInstructors };
          const grid: GridCell[] = cells.map((c) => ({
            coords: [c.quarter, c.site, c.profile, c.feedback, c.manikin],
            others: new Map(
              Object.entries(c.others)
                .filter(([, n]) => n > 0)
                .map(([id, n]) => [Number(id), n]),
            ),
          }));
          const release = releaseGrid(grid, LEVELS, rule);
          const shortcut = (quarters: string[]) =>
            quarters.every((quarter) => {
              const inQuarter = grid.filter((c) => c.coords[0] === quarter);
              const attempts = inQuarter.reduce((sum, c) => sum + [...c.others.values()].reduce((a, b) => a + b, 0), 0);
              const instructors = new Set(inQuarter.flatMap((c) => [...c.others.keys()])).size;
              return wholeGroupShown(attempts, instructors, rule);
            });
          for (const quarters of [["Q1"], ["Q2"], ["Q1", "Q2"], ["Q1", "Q2", "Q3"]]) {
            expect(releaseShows(release, (coords) => quarters.includes(coords[0] as string))).toBe(shortcut(quarters));
          }
        },
      ),
      { numRuns: 500 },
    );
  });
});
