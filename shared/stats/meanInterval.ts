// The mean of paired differences with its standard error and 95 % interval: the bias of one method against
// another, mean d ± 1.96·s/√n (Bland & Altman, Lancet 1986;1:307–310, section "Precision of estimated
// limits of agreement" gives the standard error of the mean difference as √(s²/n)).
import { Z_95 } from "./wilson";

export interface MeanInterval {
  n: number;
  mean: number | null;
  /** Sample standard deviation (n − 1) over √n; null with fewer than two values. */
  se: number | null;
  ci95: [number, number] | null;
}

export function meanWithInterval(values: readonly number[], z: number = Z_95): MeanInterval {
  const n = values.length;
  if (n === 0) return { n, mean: null, se: null, ci95: null };
  const mean = values.reduce((sum, v) => sum + v, 0) / n;
  if (n < 2) return { n, mean, se: null, ci95: null };
  const variance = values.reduce((sum, v) => sum + (v - mean) ** 2, 0) / (n - 1);
  const se = Math.sqrt(variance / n);
  return { n, mean, se, ci95: [mean - z * se, mean + z * se] };
}
