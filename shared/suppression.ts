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

/**
 * The pages' complementary rule, for groups that add up to a total shown beside them (the quarters of a
 * range, the feedback modes of a period): if the hidden groups together hold fewer than the threshold of
 * others' attempts, the total minus the shown groups would reveal them, so the smallest shown groups are
 * hidden too until the hidden ones hold enough. Returns the new hidden flags.
 */
export function withComplementaryHiding(othersN: readonly number[], hidden: readonly boolean[], minCount: number): boolean[] {
  const result = [...hidden];
  const hiddenSum = () => othersN.reduce((sum, n, i) => sum + (result[i] ? n : 0), 0);
  while (hidesOthers(hiddenSum(), minCount)) {
    const candidates = othersN.map((n, i) => ({ n, i })).filter(({ n, i }) => !result[i] && n > 0);
    if (candidates.length === 0) break;
    candidates.sort((a, b) => a.n - b.n);
    result[candidates[0].i] = true;
  }
  return result;
}
