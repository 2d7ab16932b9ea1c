// Case-mix adjustment by indirect standardisation: each unit's observed successes are set against the
// successes expected had every stratum gone at the network's rate for that stratum (common practice in
// comparing providers; see Spiegelhalter, Stat Med 2005;24:1185, section 3). For unit i with n_is attempts
// in stratum s and p_s the network rate there:
//   O = Σ passed_is,  E = Σ n_is·p_s,  V = Σ n_is·p_s·(1 − p_s),  z = (O − E) / √V.
// With a single stratum this is the crude comparison against the network rate.
//
// For drawing on a funnel, a unit is placed at the adjusted rate p + (O − E)/n and at the "effective" number
// of attempts n·p(1 − p)·n / V, which is where plain binomial limits around p give exactly the z above.

/** One stratum of one unit (or of the network). */
export interface StratumCount {
  stratum: string;
  n: number;
  passed: number;
}

export interface StandardisedUnit {
  n: number;
  observed: number;
  expected: number;
  variance: number;
  /** (O − E) / √V; null when V is 0 (no attempts, or every stratum the unit used passes always or never). */
  z: number | null;
  /** network rate + (O − E) / n, within [0, 1]; null without attempts. */
  adjustedRate: number | null;
  /** n·p(1 − p)·n / V; null when V is 0. */
  effectiveN: number | null;
}

export interface Standardisation<K> {
  /** Σ passed / Σ n over every unit; null without attempts. */
  networkRate: number | null;
  /** p_s for each stratum with attempts. */
  stratumRates: Map<string, number>;
  units: Map<K, StandardisedUnit>;
}

function checkCount(cell: StratumCount, where: string) {
  if (!Number.isInteger(cell.n) || cell.n < 0 || !Number.isInteger(cell.passed) || cell.passed < 0 || cell.passed > cell.n) {
    throw new RangeError(
      `indirectStandardisation: ${where}, stratum "${cell.stratum}" has ${cell.passed} of ${cell.n}; both must be whole numbers with 0 ≤ passed ≤ n`,
    );
  }
}

/** Standardises every unit against stratum rates taken from all units together (the network). */
export function indirectStandardisation<K>(cells: ReadonlyMap<K, readonly StratumCount[]>): Standardisation<K> {
  const totals = new Map<string, { n: number; passed: number }>();
  let networkN = 0;
  let networkPassed = 0;
  for (const [unit, list] of cells) {
    for (const cell of list) {
      checkCount(cell, `unit ${String(unit)}`);
      const total = totals.get(cell.stratum) ?? { n: 0, passed: 0 };
      total.n += cell.n;
      total.passed += cell.passed;
      totals.set(cell.stratum, total);
      networkN += cell.n;
      networkPassed += cell.passed;
    }
  }
  const stratumRates = new Map([...totals].filter(([, t]) => t.n > 0).map(([stratum, t]) => [stratum, t.passed / t.n]));
  const networkRate = networkN === 0 ? null : networkPassed / networkN;

  const units = new Map<K, StandardisedUnit>();
  for (const [unit, list] of cells) {
    let n = 0;
    let observed = 0;
    let expected = 0;
    let variance = 0;
    for (const cell of list) {
      if (cell.n === 0) continue;
      const p = stratumRates.get(cell.stratum)!;
      n += cell.n;
      observed += cell.passed;
      expected += cell.n * p;
      variance += cell.n * p * (1 - p);
    }
    const z = variance > 0 ? (observed - expected) / Math.sqrt(variance) : null;
    const adjustedRate = n === 0 || networkRate === null ? null : Math.min(1, Math.max(0, networkRate + (observed - expected) / n));
    const effectiveN = variance > 0 && networkRate !== null ? (n * n * networkRate * (1 - networkRate)) / variance : null;
    units.set(unit, { n, observed, expected, variance, z, adjustedRate, effectiveN });
  }
  return { networkRate, stratumRates, units };
}
