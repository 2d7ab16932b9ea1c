// How far instructors' pass/fail agrees with the measurement, beyond kappa itself: its 95 % interval, the
// prevalence- and bias-adjusted kappa, and whether the two kinds of disagreement are balanced.
// Table layout as in kappa.ts: rows are rater A (pass, fail), columns rater B (pass, fail).
import { binomialCdf } from "./binomial";
import { cohensKappa, type KappaTable } from "./kappa";
import { Z_95 } from "./wilson";

/**
 * 95 % interval of kappa from its large-sample standard error (Fleiss, Cohen & Everitt, Psychological
 * Bulletin 1969;72:323–327); null when kappa is undefined or the table has fewer than two items.
 */
export function kappaInterval(table: KappaTable, z: number = Z_95): [number, number] | null {
  const { n, kappa, pe } = cohensKappa(table);
  if (kappa === null || pe === null || n < 2) return null;
  const p = table.map((row) => row.map((cell) => cell / n));
  const rowTotal = [p[0][0] + p[0][1], p[1][0] + p[1][1]];
  const colTotal = [p[0][0] + p[1][0], p[0][1] + p[1][1]];
  let diagonal = 0;
  for (let i = 0; i < 2; i += 1) diagonal += p[i][i] * (1 - (rowTotal[i] + colTotal[i]) * (1 - kappa)) ** 2;
  let offDiagonal = 0;
  for (let i = 0; i < 2; i += 1) {
    for (let j = 0; j < 2; j += 1) if (i !== j) offDiagonal += p[i][j] * (colTotal[i] + rowTotal[j]) ** 2;
  }
  const variance = (diagonal + (1 - kappa) ** 2 * offDiagonal - (kappa - pe * (1 - kappa)) ** 2) / (n * (1 - pe) ** 2);
  const se = Math.sqrt(Math.max(0, variance));
  return [Math.max(-1, kappa - z * se), Math.min(1, kappa + z * se)];
}

/** Prevalence- and bias-adjusted kappa, 2·p0 − 1 (Byrt, Bishop & Carlin 1993); null for an empty table. */
export function pabak(table: KappaTable): number | null {
  const { p0 } = cohensKappa(table);
  return p0 === null ? null : 2 * p0 - 1;
}

/**
 * Exact two-sided McNemar p for the two kinds of disagreement (A pass / B fail against A fail / B pass):
 * under balance each disagreement is a fair coin, so p = 2·P(X ≤ min) with X ~ Binomial(b + c, 0.5).
 */
export function mcnemarExactP(table: KappaTable): number {
  const b = table[0][1];
  const c = table[1][0];
  if (b + c === 0) return 1;
  return Math.min(1, 2 * binomialCdf(Math.min(b, c), b + c, 0.5));
}
