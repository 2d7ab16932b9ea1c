// Small-cell suppression: the one module that decides what instructors and funders may not see, for the
// pages' API and the funder report alike. Pure: numbers in, decisions out.
//
// Primary suppression: a count of 1 to min − 1 (policy.suppressionMinCount) describes a small group. The pages
// count only other people's attempts (a viewer knows their own); an empty group reveals nothing anywhere.
// Complementary suppression is never decided answer by answer, because two answers that are each safe can be
// subtracted: the pages judge one released grid for every answer (releaseGrid), and the funder report judges
// every count of every quarter's and year's report together (releaseMeasure).
import type { HiddenReason } from "./schemas/report";

/** Primary rule for one count: below the threshold. */
export function isSmall(count: number, minCount: number): boolean {
  return minCount > 1 && count < minCount;
}

/** The pages' primary rule: a group holding some, but fewer than the threshold, of other people's attempts. */
export function hidesOthers(othersN: number, minCount: number): boolean {
  return othersN > 0 && othersN < minCount;
}

// ---------------------------------------------------------------------------------------------------------
// The pages' released grid (docs/decisions/006-disclosure-control.md). For viewers who do not see everyone,
// every figure is a sum over the cells of one fixed grid (quarter × site × patient type × feedback display ×
// manikin). The grid is judged once, for all answers together: cells are gathered into release units, each
// safe on its own, and an answer is shown only when it takes every unit it touches whole. Any shown answer is
// then a sum of whole units, so any combination of shown answers (their differences included) is a sum of
// whole safe units too, and no unsafe cell or unsafe union of cells can be worked out from them.

export interface ReleaseRule {
  /** Fewest attempts of others in a group shown (policy.suppressionMinCount). */
  minCount: number;
  /** Fewest other instructors whose attempts a group shown holds (policy.suppressionMinInstructors). */
  minInstructors: number;
}

/** One cell of the grid: its coordinates, one per dimension, and others' attempts in it by instructor. */
export interface GridCell {
  coords: readonly (string | number)[];
  /** Attempts per instructor other than the viewer; zero counts are left out. */
  others: ReadonlyMap<number, number>;
}

/** A group is safe when it holds none of others' attempts, or at least minCount from at least minInstructors of them. */
export function isSafeGroup(attempts: number, instructors: number, rule: ReleaseRule): boolean {
  return attempts === 0 || ((attempts >= rule.minCount || rule.minCount <= 1) && instructors >= rule.minInstructors);
}

interface Unit {
  cells: string[];
  coords: readonly (string | number)[];
  attempts: number;
  instructors: Set<number>;
  safe: boolean;
}

export interface Release {
  /** Units an answer must take whole (pools of several cells) or leave alone (cells never released). */
  guarded: { coords: readonly (readonly (string | number)[])[]; released: boolean }[];
}

export const cellKey = (coords: readonly (string | number)[]) => coords.join("|");

function unitOf(cells: Unit[], rule: ReleaseRule): Unit {
  const instructors = new Set<number>();
  for (const cell of cells) for (const id of cell.instructors) instructors.add(id);
  const attempts = cells.reduce((sum, cell) => sum + cell.attempts, 0);
  return { cells: cells.flatMap((cell) => cell.cells), coords: cells[0].coords, attempts, instructors, safe: isSafeGroup(attempts, instructors.size, rule) };
}

/**
 * Gathers the grid's cells into release units. `levels` run from the finest group to the whole grid, each the
 * dimensions a group shares (each level's dimensions a subset of the one before): within a group, the unsafe
 * units are pooled; a pool still unsafe takes the group's smallest safe units until it is safe; a group that
 * is unsafe even as a whole goes up to the next level as one unit. What is unsafe after the last level is
 * never released.
 */
export function releaseGrid(cells: readonly GridCell[], levels: readonly (readonly number[])[], rule: ReleaseRule): Release {
  let units: Unit[] = cells.map((cell) => {
    const attempts = [...cell.others.values()].reduce((sum, n) => sum + n, 0);
    const instructors = new Set(cell.others.keys());
    return { cells: [cellKey(cell.coords)], coords: cell.coords, attempts, instructors, safe: isSafeGroup(attempts, instructors.size, rule) };
  });
  for (const dims of levels) {
    const groups = new Map<string, Unit[]>();
    for (const unit of units) {
      const key = dims.map((d) => unit.coords[d]).join("|");
      const group = groups.get(key);
      if (group) group.push(unit);
      else groups.set(key, [unit]);
    }
    const next: Unit[] = [];
    for (const key of [...groups.keys()].sort()) {
      const group = groups.get(key)!;
      const unsafe = group.filter((unit) => !unit.safe);
      if (unsafe.length === 0) {
        next.push(...group);
        continue;
      }
      // smallest first; among equal ones the first in cell order, so the same data always pools the same way
      const complements = group.filter((unit) => unit.safe && unit.attempts > 0).sort((a, b) => a.attempts - b.attempts || (a.cells[0] < b.cells[0] ? -1 : 1));
      const members = [...unsafe];
      let pool = unitOf(members, rule);
      while (!pool.safe && complements.length > 0) {
        members.push(complements.shift()!);
        pool = unitOf(members, rule);
      }
      next.push(pool, ...group.filter((unit) => !members.includes(unit)));
    }
    // a pool stays a unit: a coarser level may take it whole as a complement
    units = next;
  }
  const coordsOf = new Map(cells.map((cell) => [cellKey(cell.coords), cell.coords]));
  return {
    guarded: units
      .filter((unit) => !unit.safe || unit.cells.length > 1)
      .map((unit) => ({ coords: unit.cells.map((key) => coordsOf.get(key)!), released: unit.safe })),
  };
}

/**
 * Whether an answer that takes every cell of one group of the last level is shown, read off the group's others'
 * attempts and instructors as a whole, without judging the grid. The last level pools a group's unsafe units
 * with its safe ones until the pool is safe, so some of its cells stay withheld exactly when the whole group is
 * not a safe group; otherwise every unit of it is released and an answer taking all of them takes each whole.
 */
export function wholeGroupShown(attempts: number, instructors: number, rule: ReleaseRule): boolean {
  return isSafeGroup(attempts, instructors, rule);
}

/** Whether an answer over the cells `selects` picks may be shown: it takes each pool whole and no withheld cell. */
export function releaseShows(release: Release, selects: (coords: readonly (string | number)[]) => boolean): boolean {
  return release.guarded.every(({ coords, released }) => {
    const taken = coords.filter(selects).length;
    return taken === 0 || (released && taken === coords.length);
  });
}

// ---------------------------------------------------------------------------------------------------------
// The funder report family (docs/decisions/007-report-disclosure.md). Every report, quarter or year, shows
// counts over one quarter or one calendar year: totals and breakdowns (patient type, display, course, error,
// retention group). A count of one measure is therefore a sum of cells quarter × category, and the family is
// judged once over all of them, as the pages' grid is: within each quarter the small cells of a breakdown are
// pooled with that quarter's smallest other cells; a quarter whose own total is small (or that cannot pool its
// small cells) is withheld whole. A count is shown only when it takes every pool whole and no withheld
// quarter, so no difference of shown counts, within one report or across reports, is a small cell. Each
// quarter is judged on its own cells alone, so a quarter's decision does not change when later quarters
// arrive, and versions released earlier stay consistent with later ones.

/** One cell of a measure: its count in one quarter and one category of a breakdown. */
export interface FamilyCell {
  quarter: string;
  category: string;
  count: number;
}

/**
 * The cells of one measure (attempts, classes, learners, …), each breakdown released of it listed over the same
 * quarter totals. A measure released only as totals has one breakdown with one category.
 */
export type MeasureCells = Readonly<Record<string, readonly FamilyCell[]>>;

interface QuarterPool {
  quarter: string;
  categories: Set<string>;
}

/** Which counts of one measure the family may show. */
export interface MeasureRelease {
  /** Pools inside one quarter, per breakdown: a count taking some of a pool's categories but not all is hidden. */
  quarterPools: Readonly<Record<string, readonly QuarterPool[]>>;
  /** Quarters too small to protect (their total, or a breakdown's small cells): every count taking any of their cells is hidden. */
  withheld: ReadonlySet<string>;
}

/** A count a reader sees hidden lies in 1 … min − 1 ("fewer than min") or is at least min ("not shown"); zero reads "no data". */
export function hiddenReasonOf(value: number, minCount: number): HiddenReason {
  return value > 0 && isSmall(value, minCount) ? "small" : "protects-other";
}

const unsafeCount = (count: number, minCount: number) => count > 0 && isSmall(count, minCount);

/**
 * True when what a reader knows of a pool — its sum, and of each hidden value 1 … min − 1 ("fewer than") or at
 * least min ("not shown") — leaves some member a single possible value.
 */
function poolPins(values: readonly number[], minCount: number): boolean {
  const sum = values.reduce((total, value) => total + value, 0);
  const bounds = values.map((value): [number, number] =>
    hiddenReasonOf(value, minCount) === "small" ? [1, minCount - 1] : [minCount, Number.POSITIVE_INFINITY],
  );
  return bounds.some(([low, high], index) => {
    const others = bounds.filter((_, other) => other !== index);
    const feasibleLow = Math.max(low, sum - others.reduce((total, [, otherHigh]) => total + otherHigh, 0));
    const feasibleHigh = Math.min(high, sum - others.reduce((total, [otherLow]) => total + otherLow, 0));
    return feasibleLow === feasibleHigh;
  });
}

/**
 * The small cells and the pool grown from them: the smallest candidates join, in order, until the pool is safe
 * and pins no member. Null when the candidates run out first.
 */
function growPool(small: readonly FamilyCell[], candidates: readonly FamilyCell[], minCount: number): FamilyCell[] | null {
  const pool = [...small];
  const rest = [...candidates].sort((a, b) => a.count - b.count);
  const unsafe = () =>
    unsafeCount(
      pool.reduce((sum, cell) => sum + cell.count, 0),
      minCount,
    ) ||
    poolPins(
      pool.map((cell) => cell.count),
      minCount,
    );
  while (unsafe()) {
    const next = rest.shift();
    if (next === undefined) return null;
    pool.push(next);
  }
  return pool;
}

/**
 * Judges one measure for the whole family. Pools stay inside one quarter and are made from its cells alone,
 * so each quarter's report keeps its total and its decision never depends on another quarter.
 */
export function releaseMeasure(cells: MeasureCells, minCount: number): MeasureRelease {
  const breakdowns = Object.entries(cells);
  const totals = new Map<string, number>();
  for (const cell of breakdowns[0]?.[1] ?? []) totals.set(cell.quarter, (totals.get(cell.quarter) ?? 0) + cell.count);
  const withheld = new Set([...totals].filter(([, total]) => unsafeCount(total, minCount)).map(([quarter]) => quarter));

  const quarterPools: Record<string, QuarterPool[]> = {};
  for (const [name, list] of breakdowns) {
    quarterPools[name] = [];
    const byQuarter = new Map<string, FamilyCell[]>();
    for (const cell of list) {
      const quarterCells = byQuarter.get(cell.quarter);
      if (quarterCells) quarterCells.push(cell);
      else byQuarter.set(cell.quarter, [cell]);
    }
    for (const [quarter, quarterCells] of byQuarter) {
      const small = quarterCells.filter((cell) => unsafeCount(cell.count, minCount));
      if (small.length === 0 || withheld.has(quarter)) continue;
      const pool = growPool(
        small,
        quarterCells.filter((cell) => cell.count >= minCount),
        minCount,
      );
      // the quarter's total would pin its own small cells: nothing of the quarter can be shown
      if (pool === null) withheld.add(quarter);
      else quarterPools[name].push({ quarter, categories: new Set(pool.map((cell) => cell.category)) });
    }
  }
  for (const name of Object.keys(quarterPools)) quarterPools[name] = quarterPools[name].filter((pool) => !withheld.has(pool.quarter));
  return { quarterPools, withheld };
}

/**
 * Whether the count over `quarters` (one quarter or a year's) of `category` in `breakdown` — or of every
 * category when `category` is null — takes every pool whole and no withheld quarter.
 */
export function measureShows(release: MeasureRelease, quarters: readonly string[], breakdown: string, category: string | null): boolean {
  if (quarters.some((quarter) => release.withheld.has(quarter))) return false;
  if (category === null) return true;
  return !(release.quarterPools[breakdown] ?? []).some((pool) => quarters.includes(pool.quarter) && pool.categories.has(category));
}
