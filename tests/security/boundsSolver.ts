// The attacker's second tool for tests/security/reportDisclosure.test.ts: what the labels add to the sums.
// A hidden count still says something — "fewer than 5" is 1 to 4 (0 to 4 where zero was hidden too), "not
// shown" at least 5 — and counts are whole and never negative. Interval constraint propagation over the
// shown sums and the labelled hidden ones (each sum's cells bounded by the others', repeated until nothing
// tightens; common practice in integer feasibility checks) pins any cell whose lower and upper bound meet.
// It is weaker than solving the integer programme exactly, and catches the pinning a reader does by hand.

export interface BoundedSum {
  cells: readonly string[];
  low: number;
  high: number;
}

/** Bounds of every cell once the sums are propagated; cells start at 0 … ∞. */
export function propagateBounds(cells: readonly string[], sums: readonly BoundedSum[]): Map<string, [number, number]> {
  const bounds = new Map<string, [number, number]>(cells.map((key) => [key, [0, Number.POSITIVE_INFINITY]]));
  for (let round = 0, changed = true; changed && round < 500; round++) {
    changed = false;
    for (const sum of sums) {
      const own = sum.cells.map((key) => bounds.get(key)!);
      const lowTotal = own.reduce((total, [low]) => total + low, 0);
      const unbounded = own.filter(([, high]) => !Number.isFinite(high)).length;
      const finiteHigh = own.reduce((total, [, high]) => total + (Number.isFinite(high) ? high : 0), 0);
      own.forEach(([low, high], i) => {
        const othersHigh = unbounded - (Number.isFinite(high) ? 0 : 1) > 0 ? Number.POSITIVE_INFINITY : finiteHigh - (Number.isFinite(high) ? high : 0);
        const othersLow = lowTotal - low;
        // with an unbounded other cell, or this one unbounded, the sum says nothing new of this cell's floor
        const newLow = Number.isFinite(othersHigh) ? Math.max(low, sum.low - othersHigh) : low;
        const newHigh = Math.min(high, sum.high - othersLow);
        if (newLow > low || newHigh < high) {
          bounds.set(sum.cells[i], [newLow, newHigh]);
          changed = true;
        }
      });
    }
  }
  return bounds;
}
