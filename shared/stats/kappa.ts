// Cohen's kappa for two raters giving binary (yes/no) judgements on the same items.
// Table layout: rows are rater A (yes, no), columns are rater B (yes, no):
//   [[both yes, A yes / B no], [A no / B yes, both no]].
// p0 = observed agreement, pe = agreement expected by chance from the raters' marginal rates,
// kappa = (p0 − pe) / (1 − pe).

export type KappaTable = readonly [readonly [number, number], readonly [number, number]];

export interface KappaResult {
  n: number;
  /** Null when the table is empty. */
  p0: number | null;
  pe: number | null;
  /** Null when the table is empty or chance agreement is already perfect (pe = 1). */
  kappa: number | null;
}

export function cohensKappa(table: KappaTable): KappaResult {
  const [[a, b], [c, d]] = table;
  for (const cell of [a, b, c, d]) {
    if (!Number.isFinite(cell) || cell < 0) {
      throw new RangeError(`cohensKappa: table cells must be counts ≥ 0 (got ${cell})`);
    }
  }
  const n = a + b + c + d;
  if (n === 0) return { n, p0: null, pe: null, kappa: null };

  const p0 = (a + d) / n;
  const raterAYes = (a + b) / n;
  const raterBYes = (a + c) / n;
  const pe = raterAYes * raterBYes + (1 - raterAYes) * (1 - raterBYes);
  const kappa = pe === 1 ? null : (p0 - pe) / (1 - pe);
  return { n, p0, pe, kappa };
}

/** Builds the 2×2 table from [rater A, rater B] judgement pairs (true = yes). */
export function kappaTableFromPairs(pairs: readonly (readonly [boolean, boolean])[]): [[number, number], [number, number]] {
  const table: [[number, number], [number, number]] = [
    [0, 0],
    [0, 0],
  ];
  for (const [raterA, raterB] of pairs) {
    table[raterA ? 0 : 1][raterB ? 0 : 1] += 1;
  }
  return table;
}
