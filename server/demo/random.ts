// A small seeded random number generator, so the demo network comes out byte for byte the same for the same
// seed. mulberry32 (Tommy Ettinger, 2017): one 32-bit state word, fast, good enough for invented data and
// never used for anything secret.

/** FNV-1a hash of a label, to give each part of the generator its own stream. */
function hashLabel(label: string): number {
  let hash = 0x811c9dc5;
  for (let i = 0; i < label.length; i++) {
    hash ^= label.charCodeAt(i);
    hash = Math.imul(hash, 0x01000193);
  }
  return hash >>> 0;
}

export class Random {
  private state: number;
  /** Second normal deviate of the last Box–Muller pair, used by the next call. */
  private spareNormal: number | null = null;

  constructor(seed: number) {
    this.state = seed | 0;
  }

  /**
   * An independent stream for one part of the generator (fleet, schedule, attempts, …): changing how many
   * numbers one part draws then leaves the other parts' numbers alone.
   */
  static forPart(seed: number, part: string): Random {
    return new Random((seed ^ hashLabel(part)) >>> 0);
  }

  /** Raw 32-bit output (unsigned): one mulberry32 step. */
  nextUint32(): number {
    this.state = (this.state + 0x6d2b79f5) | 0;
    let z = this.state;
    z = Math.imul(z ^ (z >>> 15), z | 1);
    z ^= z + Math.imul(z ^ (z >>> 7), z | 61);
    return (z ^ (z >>> 14)) >>> 0;
  }

  /** Uniform in [0, 1). */
  next(): number {
    return this.nextUint32() / 4294967296;
  }

  /** Uniform in [min, max). */
  uniform(min: number, max: number): number {
    return min + (max - min) * this.next();
  }

  /** Whole number from min to max, both included. */
  int(min: number, max: number): number {
    return min + Math.floor(this.next() * (max - min + 1));
  }

  chance(probability: number): boolean {
    return this.next() < probability;
  }

  /** Normal deviate (Box–Muller; each pair of uniforms gives two deviates). */
  normal(mean = 0, sd = 1): number {
    if (this.spareNormal !== null) {
      const z = this.spareNormal;
      this.spareNormal = null;
      return mean + sd * z;
    }
    const radius = Math.sqrt(-2 * Math.log(1 - this.next())); // 1 − u is in (0, 1]: log(0) would be -Infinity
    const angle = 2 * Math.PI * this.next();
    this.spareNormal = radius * Math.sin(angle);
    return mean + sd * radius * Math.cos(angle);
  }

  /** Poisson count (Knuth's product method; fine for the small means used here). */
  poisson(mean: number): number {
    const limit = Math.exp(-mean);
    let count = 0;
    let product = this.next();
    while (product > limit) {
      count++;
      product *= this.next();
    }
    return count;
  }

  pick<T>(items: readonly T[]): T {
    if (items.length === 0) throw new RangeError("Cannot pick from an empty list");
    return items[Math.floor(this.next() * items.length)];
  }

  /** Picks an item with probability proportional to its weight. */
  weighted<T>(items: readonly T[], weightOf: (item: T) => number): T {
    const total = items.reduce((sum, item) => sum + weightOf(item), 0);
    let target = this.next() * total;
    for (const item of items) {
      target -= weightOf(item);
      if (target < 0) return item;
    }
    return items[items.length - 1];
  }

  /** A shuffled copy (Fisher–Yates). */
  shuffled<T>(items: readonly T[]): T[] {
    const copy = [...items];
    for (let i = copy.length - 1; i > 0; i--) {
      const j = Math.floor(this.next() * (i + 1));
      [copy[i], copy[j]] = [copy[j], copy[i]];
    }
    return copy;
  }
}
