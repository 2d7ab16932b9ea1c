import { describe, expect, it } from "vitest";
import { indirectStandardisation, type StratumCount } from "../../../shared/stats/caseMix";

// Hand-worked example (common practice for indirect standardisation, worked on paper): two strata, the
// network passing 80 of 100 in A (p_A = 0.8) and 40 of 100 in B (p_B = 0.4). The instructor "mixed" has
// 10 attempts in A (8 passed) and 30 in B (15 passed):
//   O = 23, E = 10·0.8 + 30·0.4 = 20, V = 10·0.8·0.2 + 30·0.4·0.6 = 8.8, z = 3 / √8.8 = 1.011300.
// The rest of the network ("others") makes up the strata: 90 in A with 72 passed, 70 in B with 25 passed.
const cells = new Map<string, StratumCount[]>([
  [
    "mixed",
    [
      { stratum: "A", n: 10, passed: 8 },
      { stratum: "B", n: 30, passed: 15 },
    ],
  ],
  [
    "others",
    [
      { stratum: "A", n: 90, passed: 72 },
      { stratum: "B", n: 70, passed: 25 },
    ],
  ],
]);

describe("indirectStandardisation", () => {
  const result = indirectStandardisation(cells);

  it("takes the stratum rates and the network rate from all units together", () => {
    expect(result.stratumRates.get("A")).toBeCloseTo(0.8, 12);
    expect(result.stratumRates.get("B")).toBeCloseTo(0.4, 12);
    expect(result.networkRate).toBeCloseTo(120 / 200, 12);
  });

  it("gives O, E, V and z of the hand-worked example", () => {
    const unit = result.units.get("mixed")!;
    expect(unit.n).toBe(40);
    expect(unit.observed).toBe(23);
    expect(unit.expected).toBeCloseTo(20, 12);
    expect(unit.variance).toBeCloseTo(8.8, 12);
    expect(unit.z).toBeCloseTo(1.0113, 4);
  });

  it("places the unit where plain binomial limits around the network rate give the same z", () => {
    const unit = result.units.get("mixed")!;
    // adjusted rate 0.6 + 3/40 = 0.675; effective attempts 40²·0.6·0.4 / 8.8 = 43.636…
    expect(unit.adjustedRate).toBeCloseTo(0.675, 12);
    expect(unit.effectiveN).toBeCloseTo(43.6364, 4);
    const zOnFunnel = (unit.adjustedRate! - 0.6) / Math.sqrt((0.6 * 0.4) / unit.effectiveN!);
    expect(zOnFunnel).toBeCloseTo(unit.z!, 10);
  });

  it("is the crude comparison with one stratum", () => {
    const crude = indirectStandardisation(
      new Map([
        ["a", [{ stratum: "all", n: 40, passed: 23 }]],
        ["b", [{ stratum: "all", n: 160, passed: 97 }]],
      ]),
    );
    const unit = crude.units.get("a")!;
    // (23 − 40·0.6) / √(40·0.6·0.4)
    expect(unit.z).toBeCloseTo(-1 / Math.sqrt(9.6), 12);
    expect(unit.adjustedRate).toBeCloseTo(23 / 40, 12);
    expect(unit.effectiveN).toBeCloseTo(40, 10);
  });

  it("gives no z where no variation is possible, and refuses impossible counts", () => {
    const flat = indirectStandardisation(new Map([["a", [{ stratum: "all", n: 5, passed: 5 }]]]));
    expect(flat.units.get("a")!.z).toBeNull();
    expect(() => indirectStandardisation(new Map([["a", [{ stratum: "all", n: 3, passed: 4 }]]]))).toThrow(/unit a, stratum "all" has 4 of 3/);
  });
});
