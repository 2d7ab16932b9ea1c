// p-chart (control chart for a proportion) with 3-sigma limits, as in Montgomery,
// Introduction to Statistical Quality Control: centre p̄ = Σcount / Σn and, per sample i,
// limits p̄ ± 3 · sqrt(p̄ (1 − p̄) / n_i), so samples of different sizes get their own limits.
// "count" is whatever is being charted (passes or failures); the maths does not care which.
// Limits are clamped to [0, 1]; a point is outside when strictly beyond a limit.

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
  /** Σcount / Σn; null when there are no attempts at all. */
  centre: number | null;
  points: PChartPoint[];
}

const SIGMA_MULTIPLE = 3;

export function pChart(samples: readonly PChartSample[]): PChart {
  let totalN = 0;
  let totalCount = 0;
  samples.forEach((sample, index) => {
    if (!Number.isInteger(sample.n) || sample.n < 0) {
      throw new RangeError(`pChart: sample ${index + 1} has n ${sample.n}; it must be a whole number ≥ 0`);
    }
    if (!Number.isInteger(sample.count) || sample.count < 0 || sample.count > sample.n) {
      throw new RangeError(
        `pChart: sample ${index + 1} has count ${sample.count}; it must be a whole number from 0 to n = ${sample.n}`,
      );
    }
    totalN += sample.n;
    totalCount += sample.count;
  });

  const centre = totalN === 0 ? null : totalCount / totalN;
  const points = samples.map(({ n, count }): PChartPoint => {
    if (centre === null || n === 0) {
      return { n, count, p: n === 0 ? null : count / n, lcl: null, ucl: null, outside: false };
    }
    const p = count / n;
    const halfWidth = SIGMA_MULTIPLE * Math.sqrt((centre * (1 - centre)) / n);
    const lcl = Math.max(0, centre - halfWidth);
    const ucl = Math.min(1, centre + halfWidth);
    return { n, count, p, lcl, ucl, outside: p < lcl || p > ucl };
  });
  return { centre, points };
}
