// p-chart (control chart for a proportion) with 3-sigma limits, as in Montgomery,
// Introduction to Statistical Quality Control: centre p̄ = Σcount / Σn and, per sample i,
// limits p̄ ± 3 · sqrt(p̄ (1 − p̄) / n_i), so samples of different sizes get their own limits.
// "count" is whatever is being charted (passes or failures); the maths does not care which.
// Limits are clamped to [0, 1]; a point is outside when strictly beyond a limit.
//
// The centre and limits may come from a stated baseline (Montgomery's phase I) instead of the charted
// samples, so the samples being judged never move their own centre line. With large samples the binomial
// sigma is too small for real variation between periods and nearly every point falls outside; Laney's p′
// chart (Laney, "Improved control charts for attributes", Quality Engineering 2002;14:531–537) multiplies
// the sigma by σ_z, the spread of the baseline's z-scores z_i = (p_i − p̄)/σ_i estimated from their average
// moving range: σ_z = MR̄ / 1.128 (d2 for ranges of two).

export interface PChartSample {
  n: number;
  count: number;
}

export interface PChartPoint {
  n: number;
  count: number;
  /** count / n; null for a sample with n = 0. */
  p: number | null;
  /** Null when the sample or the whole chart has no attempts. */
  lcl: number | null;
  ucl: number | null;
  outside: boolean;
}

export interface PChart {
  /** Σcount / Σn over the baseline (the samples themselves without one); null when it has no attempts. */
  centre: number | null;
  /** Laney's σ_z when asked for and the baseline has two samples or more to estimate it; else null. */
  sigmaZ: number | null;
  points: PChartPoint[];
}

export interface PChartOptions {
  /** The samples the centre and limits come from; the charted samples when absent. */
  baseline?: readonly PChartSample[];
  /** Widen the limits by Laney's σ_z. */
  laney?: boolean;
}

const SIGMA_MULTIPLE = 3;
/** d2 for moving ranges of two consecutive values (Montgomery, appendix table VI). */
const D2_FOR_TWO = 1.128;

function checkSamples(samples: readonly PChartSample[], what: string) {
  samples.forEach((sample, index) => {
    if (!Number.isInteger(sample.n) || sample.n < 0) {
      throw new RangeError(`pChart: ${what} ${index + 1} has n ${sample.n}; it must be a whole number ≥ 0`);
    }
    if (!Number.isInteger(sample.count) || sample.count < 0 || sample.count > sample.n) {
      throw new RangeError(`pChart: ${what} ${index + 1} has count ${sample.count}; it must be a whole number from 0 to n = ${sample.n}`);
    }
  });
}

/** MR̄ / 1.128 over the z-scores of the baseline samples that have attempts; null with fewer than two. */
function laneySigmaZ(baseline: readonly PChartSample[], centre: number): number | null {
  if (centre === 0 || centre === 1) return null;
  const z = baseline.filter((s) => s.n > 0).map((s) => (s.count / s.n - centre) / Math.sqrt((centre * (1 - centre)) / s.n));
  if (z.length < 2) return null;
  let ranges = 0;
  for (let i = 1; i < z.length; i += 1) ranges += Math.abs(z[i] - z[i - 1]);
  return ranges / (z.length - 1) / D2_FOR_TWO;
}

export function pChart(samples: readonly PChartSample[], options: PChartOptions = {}): PChart {
  checkSamples(samples, "sample");
  const baseline = options.baseline ?? samples;
  if (options.baseline) checkSamples(baseline, "baseline sample");
  let totalN = 0;
  let totalCount = 0;
  for (const sample of baseline) {
    totalN += sample.n;
    totalCount += sample.count;
  }

  const centre = totalN === 0 ? null : totalCount / totalN;
  const sigmaZ = options.laney && centre !== null ? laneySigmaZ(baseline, centre) : null;
  const points = samples.map(({ n, count }): PChartPoint => {
    if (centre === null || n === 0) {
      return { n, count, p: n === 0 ? null : count / n, lcl: null, ucl: null, outside: false };
    }
    const p = count / n;
    const halfWidth = SIGMA_MULTIPLE * Math.sqrt((centre * (1 - centre)) / n) * (sigmaZ ?? 1);
    const lcl = Math.max(0, centre - halfWidth);
    const ucl = Math.min(1, centre + halfWidth);
    return { n, count, p, lcl, ucl, outside: p < lcl || p > ucl };
  });
  return { centre, sigmaZ, points };
}
