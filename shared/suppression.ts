// Small-cell suppression: the one module that decides what instructors and funders may not see, for the
// pages' API and the funder report alike. Pure: numbers in, decisions out.
//
// Primary suppression: a count below the network's smallest group shown (policy.suppressionMinCount) is
// hidden, and so is every rate made from fewer than that many. The pages count only other people's attempts
// (a viewer knows their own) and show an empty group (nothing of anyone's reveals nothing); the report
// hides every count below the threshold.
// Complementary suppression: in a breakdown whose total is shown, total minus the shown cells equals the sum
// of the hidden cells. One hidden cell would be given away at once, and even several can be pinned down
// (two hidden cells of a breakdown with threshold 5 whose remainder is 8 must both be 4). So while any hidden
// cell can be worked out exactly, the smallest shown cell is hidden too; when none is left, the total goes.
// A reader knows a "small" cell lies in 0 … min − 1 and a cell hidden to protect another is at least min, so
// the check below uses exactly that knowledge.
import type { HiddenReason } from "./schemas/report";

export interface BreakdownSuppression {
  cells: (HiddenReason | null)[];
  total: HiddenReason | null;
}

/** Primary rule for one count: hidden when below the threshold. */
export function isSmall(count: number, minCount: number): boolean {
  return minCount > 1 && count < minCount;
}

/**
 * Decides which cells of a breakdown to hide. `totalShown` says whether the report shows the total (or
 * anything that gives it away, such as shares of the total); without it, only the primary rule applies.
 */
export function suppressBreakdown(values: readonly number[], minCount: number, totalShown = true): BreakdownSuppression {
  for (const value of values) {
    if (!Number.isInteger(value) || value < 0) throw new RangeError(`suppressBreakdown: counts must be whole numbers ≥ 0 (got ${value})`);
  }
  const cells: (HiddenReason | null)[] = values.map((value) => (isSmall(value, minCount) ? "small" : null));
  const total = values.reduce((sum, value) => sum + value, 0);
  let totalReason: HiddenReason | null = isSmall(total, minCount) ? "small" : null;
  if (!totalShown || totalReason) return { cells, total: totalReason };

  while (anyHiddenCellPinned(values, cells, minCount)) {
    const next = smallestShownCell(values, cells);
    if (next === -1) {
      // every cell is hidden and the total still pins them: hide the total as well
      totalReason = "protects-other";
      break;
    }
    cells[next] = "protects-other";
  }
  return { cells, total: totalReason };
}

/** The shown cell with the smallest value; among equal values the last one, so hidden rows stay together at a sorted table's end. */
function smallestShownCell(values: readonly number[], cells: readonly (HiddenReason | null)[]): number {
  let best = -1;
  values.forEach((value, index) => {
    if (cells[index] !== null) return;
    if (best === -1 || value <= values[best]) best = index;
  });
  return best;
}

/**
 * True when total minus the shown cells, together with what the labels say about each hidden cell, leaves
 * exactly one possible value for some hidden cell.
 */
export function anyHiddenCellPinned(
  values: readonly number[],
  cells: readonly (HiddenReason | null)[],
  minCount: number,
): boolean {
  const hidden = values.map((value, index) => ({ value, reason: cells[index] })).filter((cell) => cell.reason !== null);
  if (hidden.length === 0) return false;
  const remainder = hidden.reduce((sum, cell) => sum + cell.value, 0);
  const bounds = hidden.map((cell) => knownBounds(cell.reason!, minCount));
  return bounds.some(([low, high], index) => {
    const others = bounds.filter((_, other) => other !== index);
    const othersLow = others.reduce((sum, [otherLow]) => sum + otherLow, 0);
    const othersHigh = others.reduce((sum, [, otherHigh]) => sum + otherHigh, 0);
    const feasibleLow = Math.max(low, remainder - othersHigh);
    const feasibleHigh = Math.min(high, remainder - othersLow);
    return feasibleLow === feasibleHigh;
  });
}

/** What a reader knows about a hidden cell from its label alone. */
function knownBounds(reason: HiddenReason, minCount: number): [number, number] {
  return reason === "small" ? [0, minCount - 1] : [minCount, Number.POSITIVE_INFINITY];
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
      const complements = group
        .filter((unit) => unit.safe && unit.attempts > 0)
        .sort((a, b) => a.attempts - b.attempts || (a.cells[0] < b.cells[0] ? -1 : 1));
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

/** Whether an answer over the cells `selects` picks may be shown: it takes each pool whole and no withheld cell. */
export function releaseShows(release: Release, selects: (coords: readonly (string | number)[]) => boolean): boolean {
  return release.guarded.every(({ coords, released }) => {
    const taken = coords.filter(selects).length;
    return taken === 0 || (released && taken === coords.length);
  });
}
