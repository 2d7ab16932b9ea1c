// Run-chart rules for a non-random shift (Anhøj & Olesen, "Run charts revisited", PLoS One 2014;9:e113825):
// with n useful points (those not on the median), a run of consecutive points on one side of the median
// longer than round(log2(n) + 3), or fewer crossings of the median than the 5th percentile of
// Binomial(n − 1, 0.5), signals that the process has shifted.
import { binomialCdf } from "./binomial";
import { median } from "./quantiles";

export interface RunChartLimits {
  /** A run longer than this signals a shift. */
  longestRun: number;
  /** Fewer crossings than this signal a shift. */
  fewestCrossings: number;
}

export function runChartLimits(useful: number): RunChartLimits {
  const longestRun = Math.round(Math.log2(useful) + 3);
  // the 5th percentile: the smallest c with P(X ≤ c) ≥ 0.05 for X ~ Binomial(n − 1, 0.5)
  let fewestCrossings = 0;
  while (fewestCrossings < useful - 1 && binomialCdf(fewestCrossings, useful - 1, 0.5) < 0.05) fewestCrossings += 1;
  return { longestRun, fewestCrossings };
}

export interface RunChartSignals extends RunChartLimits {
  median: number;
  /** Points not on the median. */
  useful: number;
  run: number;
  crossings: number;
  /** True when the longest run is too long or the crossings too few. */
  shift: boolean;
}

/** The rules applied to a series, around its own median or a baseline's; null for fewer than two useful points. */
export function runChartSignals(values: readonly number[], centre: number | null = median(values)): RunChartSignals | null {
  if (centre === null) return null;
  const sides = values.filter((value) => value !== centre).map((value) => (value > centre ? 1 : -1));
  if (sides.length < 2) return null;
  let run = 1;
  let longest = 1;
  let crossings = 0;
  for (let i = 1; i < sides.length; i += 1) {
    if (sides[i] === sides[i - 1]) run += 1;
    else {
      crossings += 1;
      run = 1;
    }
    longest = Math.max(longest, run);
  }
  const limits = runChartLimits(sides.length);
  return { median: centre, useful: sides.length, run: longest, crossings, ...limits, shift: longest > limits.longestRun || crossings < limits.fewestCrossings };
}
