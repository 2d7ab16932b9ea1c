// The attacker's arithmetic for tests/security/differencing.test.ts. Every figure a viewer is shown is a sum
// over cells of the attempts (quarter × site × patient type × feedback display × manikin); the attacker knows
// which cells each shown figure takes and subtracts their own attempts. What they can work out exactly is the
// row space of the shown figures' cell sets (linear algebra over the rationals, here modulo a large prime,
// common practice for exact rank). This module finds every unsafe group that lies in it.
//
// Cells that every shown figure takes together or leaves together ("atoms") can never be told apart, so the
// row space is spanned by unions of atoms; an atom that holds a safe group cannot be split. Only unsafe atoms
// need the rank test: is the atom's indicator a combination of the shown figures?

export interface TruthCell {
  key: string;
  /** Attempts of people other than the viewer, by instructor. */
  others: Map<number, number>;
}

export interface SafetyRule {
  minCount: number;
  minInstructors: number;
}

const PRIME = 1_000_003;

function isSafe(cells: readonly TruthCell[], rule: SafetyRule): boolean {
  const instructors = new Set<number>();
  let n = 0;
  for (const cell of cells) {
    for (const [id, count] of cell.others) {
      instructors.add(id);
      n += count;
    }
  }
  return n === 0 || (n >= rule.minCount && instructors.size >= rule.minInstructors);
}

/** Modular inverse by Fermat (p prime). */
function inverse(a: number): number {
  let result = 1;
  let base = a % PRIME;
  let exp = PRIME - 2;
  while (exp > 0) {
    if (exp & 1) result = (result * base) % PRIME;
    base = (base * base) % PRIME;
    exp = Math.floor(exp / 2);
  }
  return result;
}

/** Row-echelon basis, each row with a pivot column and the pivot scaled to 1. */
class Basis {
  private rows = new Map<number, number[]>();
  constructor(private readonly width: number) {}

  /** Reduces a vector against the basis; returns it (all zero when it lies in the span). */
  reduce(vector: readonly number[]): number[] {
    const v = [...vector];
    for (let col = 0; col < this.width; col++) {
      if (v[col] === 0) continue;
      const row = this.rows.get(col);
      if (!row) continue;
      const factor = v[col];
      for (let j = col; j < this.width; j++) if (row[j] !== 0) v[j] = (((v[j] - factor * row[j]) % PRIME) + PRIME) % PRIME;
    }
    return v;
  }

  add(vector: readonly number[]): void {
    const v = this.reduce(vector);
    const pivot = v.findIndex((x) => x !== 0);
    if (pivot === -1) return;
    const scale = inverse(v[pivot]);
    const row = v.map((x) => (x * scale) % PRIME);
    // keep the basis fully reduced so reduce() needs one pass in column order
    for (const [col, other] of this.rows) {
      if (other[pivot] === 0) continue;
      const factor = other[pivot];
      for (let j = 0; j < this.width; j++) other[j] = (((other[j] - factor * row[j]) % PRIME) + PRIME) % PRIME;
      this.rows.set(col, other);
    }
    this.rows.set(pivot, row);
  }
}

export interface Derivation {
  /** The cells of an unsafe group that the shown figures pin down exactly. */
  cells: string[];
}

/**
 * Unsafe groups whose totals the shown figures give away: each unsafe atom, and each union of two unsafe
 * atoms that is unsafe as a whole (what a difference of two answers reaches when they differ by two). When
 * no atom is unsafe, every union of atoms is safe, so nothing unsafe can be worked out at all. `shown` lists
 * the cell keys each shown figure takes.
 */
export function derivableUnsafeGroups(cells: readonly TruthCell[], shown: readonly (readonly string[])[], rule: SafetyRule): Derivation[] {
  const sets = [...new Map(shown.map((keys) => [[...keys].sort().join(";"), keys])).values()];
  const signature = new Map<string, number[]>();
  sets.forEach((keys, i) => {
    for (const key of keys) {
      const list = signature.get(key);
      if (list) list.push(i);
      else signature.set(key, [i]);
    }
  });
  const atomsBySignature = new Map<string, TruthCell[]>();
  for (const cell of cells) {
    const sig = signature.get(cell.key);
    if (!sig) continue; // never in a shown figure: nothing is known of it
    const id = sig.join(",");
    const atom = atomsBySignature.get(id);
    if (atom) atom.push(cell);
    else atomsBySignature.set(id, [cell]);
  }
  const atoms = [...atomsBySignature.values()];
  const unsafe = atoms.map((atom, index) => ({ atom, index })).filter(({ atom }) => !isSafe(atom, rule));
  if (unsafe.length === 0) return [];

  const atomOf = new Map<string, number>();
  atoms.forEach((atom, index) => atom.forEach((cell) => atomOf.set(cell.key, index)));
  const basis = new Basis(atoms.length);
  for (const keys of sets) {
    const vector = new Array<number>(atoms.length).fill(0);
    for (const key of keys) {
      const index = atomOf.get(key);
      if (index !== undefined) vector[index] = 1; // every cell of an atom is in the set, so 1 per atom
    }
    basis.add(vector);
  }
  const inSpan = (indices: number[]) => {
    const target = new Array<number>(atoms.length).fill(0);
    for (const i of indices) target[i] = 1;
    return basis.reduce(target).every((x) => x === 0);
  };
  const found: Derivation[] = [];
  for (const { atom, index } of unsafe) if (inSpan([index])) found.push({ cells: atom.map((cell) => cell.key) });
  for (let a = 0; a < unsafe.length; a++) {
    for (let b = a + 1; b < unsafe.length; b++) {
      const union = [...unsafe[a].atom, ...unsafe[b].atom];
      if (!isSafe(union, rule) && inSpan([unsafe[a].index, unsafe[b].index])) found.push({ cells: union.map((cell) => cell.key) });
    }
  }
  return found;
}
