import fc from "fast-check";
import { describe, expect, it } from "vitest";
import type { HiddenReason } from "../../../shared/schemas/report";
import { anyHiddenCellPinned, hidesOthers, isSafeGroup, releaseGrid, releaseShows, suppressBreakdown, type GridCell } from "../../../shared/suppression";

const MIN = 5;

/**
 * Every value a hidden cell could take for a reader who sees the shown cells, the total and the labels
 * ("fewer than 5" = 0…4; "not shown" = at least 5). Brute force, independent of the code under test.
 */
function possibleValues(values: number[], cells: (HiddenReason | null)[], index: number, totalShown: boolean): number[] {
  const hidden = cells.flatMap((reason, i) => (reason ? [i] : []));
  const limit = values.reduce((a, b) => a + b, 0) + MIN + 1;
  const range = (i: number): [number, number] => (cells[i] === "small" ? [0, MIN - 1] : [MIN, limit]);
  if (!totalShown) {
    const [low, high] = range(index);
    return Array.from({ length: high - low + 1 }, (_, k) => low + k);
  }
  const remainder = hidden.reduce((sum, i) => sum + values[i], 0);
  const found = new Set<number>();
  const chosen: number[] = [];
  const walk = (k: number, sum: number) => {
    if (sum > remainder) return;
    if (k === hidden.length) {
      if (sum === remainder) found.add(chosen[hidden.indexOf(index)]);
      return;
    }
    const [low, high] = range(hidden[k]);
    for (let v = low; v <= high; v++) {
      chosen[k] = v;
      walk(k + 1, sum + v);
    }
  };
  walk(0, 0);
  return [...found];
}

describe("suppressBreakdown", () => {
  it("hides a single small cell together with the smallest shown one", () => {
    // total 45 is shown; 45 − 30 − 12 would reveal the 3 if only it were hidden
    const result = suppressBreakdown([30, 12, 3], MIN);
    expect(result.cells).toEqual([null, "protects-other", "small"]);
    expect(result.total).toBeNull();
  });

  it("hides a zero like any other count below the threshold", () => {
    expect(suppressBreakdown([0, 20, 30], MIN).cells).toEqual(["small", "protects-other", null]);
  });

  it("adds a cell when two small cells could be worked out from the remainder (4 + 4 = 8 can only be 4 and 4)", () => {
    const result = suppressBreakdown([4, 4, 50, 60], MIN);
    expect(result.cells).toEqual(["small", "small", "protects-other", null]);
  });

  it("leaves two small cells alone when the remainder does not pin them", () => {
    expect(suppressBreakdown([3, 2, 50, 60], MIN).cells).toEqual(["small", "small", null, null]);
  });

  it("hides nothing when every cell is large enough", () => {
    expect(suppressBreakdown([5, 6, 100], MIN)).toEqual({ cells: [null, null, null], total: null });
  });

  it("hides the total when it is itself below the threshold, with no complementary cell needed", () => {
    expect(suppressBreakdown([1, 2], MIN)).toEqual({ cells: ["small", "small"], total: "small" });
  });

  it("hides the total when even hiding every cell would still give one away", () => {
    // 4 + 4 with the total 8 shown: both must be 4, and there is no shown cell left to hide
    expect(suppressBreakdown([4, 4], MIN)).toEqual({ cells: ["small", "small"], total: "protects-other" });
  });

  it("applies only the primary rule when no total is shown", () => {
    expect(suppressBreakdown([30, 12, 3], MIN, false).cells).toEqual([null, null, "small"]);
  });

  it("among equal candidates hides the last, so hidden rows of a sorted table stay together", () => {
    expect(suppressBreakdown([9, 9, 3], MIN).cells).toEqual([null, "protects-other", "small"]);
  });

  it("refuses counts that are not whole numbers ≥ 0", () => {
    expect(() => suppressBreakdown([1.5], MIN)).toThrow(RangeError);
    expect(() => suppressBreakdown([-1], MIN)).toThrow(RangeError);
  });

  it("property: every cell under the threshold is hidden", () => {
    fc.assert(
      fc.property(fc.array(fc.nat({ max: 40 }), { minLength: 1, maxLength: 6 }), (values) => {
        const { cells } = suppressBreakdown(values, MIN);
        values.forEach((value, i) => {
          if (value < MIN) expect(cells[i]).toBe("small");
        });
      }),
    );
  });

  it("property: no total minus the shown cells reveals a hidden cell", () => {
    fc.assert(
      fc.property(fc.array(fc.nat({ max: 25 }), { minLength: 1, maxLength: 5 }), (values) => {
        const { cells, total } = suppressBreakdown(values, MIN);
        const totalShown = total === null;
        cells.forEach((reason, i) => {
          if (reason === null) return;
          const options = possibleValues(values, cells, i, totalShown);
          expect(options).toContain(values[i]);
          expect(options.length).toBeGreaterThan(1);
        });
        expect(anyHiddenCellPinned(values, cells, MIN) && totalShown).toBe(false);
      }),
      { numRuns: 300 },
    );
  });

  it("property: a cell is hidden to protect another only when a small cell needed it", () => {
    fc.assert(
      fc.property(fc.array(fc.integer({ min: MIN, max: 60 }), { minLength: 1, maxLength: 6 }), (values) => {
        expect(suppressBreakdown(values, MIN).cells.every((c) => c === null)).toBe(true);
      }),
    );
  });

  it("hides nothing with a threshold of 1 (a group of 0 holds nobody)", () => {
    expect(suppressBreakdown([0, 3], 1).cells).toEqual([null, null]);
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
    const release = releaseGrid([cell("Q1", "L", "live", { 1: 2 }), cell("Q1", "M", "live", { 2: 2 }), cell("Q1", "N", "live", { 3: 2 }), cell("Q2", "L", "live", { 1: 2 })], levels, rule);
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
});
