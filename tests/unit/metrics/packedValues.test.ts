// The packed form of per-instructor distributions: packing and reading back, merging, and order statistics
// read off pairs, each against the plain computation over the expanded values.
import { describe, expect, it } from "vitest";
import fc from "fast-check";
import * as ss from "simple-statistics";
import { quantile } from "../../../shared/stats";
import {
  forEachSection,
  mergePairs,
  pack,
  pairsOf,
  quantileOfPairs,
  shareAtLeast,
  sizeOfPairs,
  stratumIndexOf,
  stratumOf,
  subtractPairs,
  type Pairs,
} from "../../../server/metrics/packedValues";

/** Values as recorded: whole percent, tenths, and thirds (a score averaged over three parts). */
const recordedValue = fc.oneof(
  fc.integer({ min: 0, max: 100 }),
  fc.integer({ min: 0, max: 1000 }).map((tenths) => tenths / 10),
  fc.integer({ min: 0, max: 300 }).map((thirds) => thirds / 3),
);

const expand = (pairs: Pairs): number[] => {
  const values: number[] = [];
  for (let i = 0; i < pairs.length; i += 2) for (let c = 0; c < pairs[i + 1]; c++) values.push(pairs[i]);
  return values;
};

describe("packed instructor distributions", () => {
  it("builds ascending pairs with the count of each value", () => {
    expect([...pairsOf([70, 55.5, 70, 100 / 3, 70])]).toEqual([100 / 3, 1, 55.5, 1, 70, 3]);
    expect(sizeOfPairs(pairsOf([1, 1, 2]))).toBe(3);
    expect(pairsOf([]).length).toBe(0);
  });

  it("reads back every section it packed, value for value", () => {
    fc.assert(
      fc.property(
        fc.array(fc.tuple(fc.integer({ min: 0, max: 5 }), fc.array(fc.array(recordedValue, { maxLength: 30 }), { minLength: 5, maxLength: 5 }))),
        (strata) => {
          const byStratum = new Map(strata.map(([stratum, metrics]) => [stratum, metrics.map(pairsOf)]));
          const seen = new Map<number, Pairs[]>();
          // one blob per metric; a blob at an odd offset, as small buffers come out of Node's pool, reads the same
          for (let m = 0; m < 5; m++) {
            const packed = pack(byStratum, m);
            const unaligned = Buffer.alloc(packed.length + 3);
            packed.copy(unaligned, 3);
            forEachSection(unaligned.subarray(3), (stratum, metric, pairs) => {
              expect(metric).toBe(m);
              const list = seen.get(stratum) ?? [];
              list[metric] = Float64Array.from(pairs);
              seen.set(stratum, list);
            });
          }
          expect(seen).toEqual(byStratum);
        },
      ),
    );
  });

  it("merges distributions as if their values had been pooled", () => {
    fc.assert(
      fc.property(fc.array(fc.array(recordedValue, { maxLength: 40 }), { maxLength: 20 }), (lists) => {
        const merged = mergePairs(lists.map(pairsOf));
        expect([...merged]).toEqual([...pairsOf(lists.flat())]);
      }),
    );
  });

  it("takes an earlier running total from a later one, leaving the values between them", () => {
    fc.assert(
      fc.property(fc.array(recordedValue, { maxLength: 60 }), fc.array(recordedValue, { maxLength: 60 }), (earlier, later) => {
        const whole = pairsOf([...earlier, ...later]);
        expect([...subtractPairs(whole, pairsOf(earlier))]).toEqual([...pairsOf(later)]);
      }),
    );
    // a part that is not within the whole is refused, not turned into negative counts
    expect(() => subtractPairs(pairsOf([1, 2]), pairsOf([2, 2]))).toThrow();
    expect(() => subtractPairs(pairsOf([1, 2]), pairsOf([3]))).toThrow();
  });

  it("reads type-7 quantiles and shares off the pairs, equal to the expanded values' to the last bit", () => {
    // type 7 (Hyndman & Fan 1996), shared/stats `quantile` and simple-statistics `quantileSorted` on the expanded values
    fc.assert(
      fc.property(fc.array(recordedValue, { minLength: 1, maxLength: 200 }), fc.double({ min: 0, max: 1, noNaN: true }), (values, p) => {
        const pairs = pairsOf(values);
        expect(quantileOfPairs(pairs, p)).toBe(quantile(values, p));
        expect(quantileOfPairs(pairs, 0.5)).toBeCloseTo(ss.median(values), 9);
        expect(shareAtLeast(pairs, 100)).toBe(values.filter((v) => v >= 100).length / values.length);
        expect(expand(pairs).length).toBe(values.length);
      }),
    );
    expect(quantileOfPairs(pairsOf([]), 0.5)).toBeNull();
    expect(shareAtLeast(pairsOf([]), 100)).toBeNull();
  });

  it("numbers each patient type × feedback display once", () => {
    const seen = new Set<number>();
    for (const profile of ["adult", "child", "infant"]) {
      for (const feedback of ["live", "hidden"]) {
        const index = stratumIndexOf(profile, feedback);
        expect(stratumOf(index)).toEqual({ profile, feedback });
        seen.add(index);
      }
    }
    expect([...seen].sort()).toEqual([0, 1, 2, 3, 4, 5]);
  });
});
