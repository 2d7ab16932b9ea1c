import { describe, expect, it } from "vitest";
import { cohensKappa, kappaTableFromPairs } from "../../../shared/stats";

describe("cohensKappa", () => {
  it("[[40, 9], [6, 45]]", () => {
    // Gerstman, Epidemiology Kept Simple, Example 10.1: p0 0.85, pe 0.50, kappa 0.6995
    const result = cohensKappa([
      [40, 9],
      [6, 45],
    ]);
    expect(result.n).toBe(100);
    expect(result.p0).toBeCloseTo(0.85, 12);
    expect(result.pe).toBeCloseTo(0.5, 2);
    expect(result.pe).toBeCloseTo(0.5008, 12); // computed: (49·46 + 51·54) / 100²
    expect(result.kappa).toBeCloseTo(0.6995, 4);
  });

  it("[[80, 10], [5, 5]]", () => {
    // Gerstman, Epidemiology Kept Simple, Example 10.2: kappa 0.3182
    expect(
      cohensKappa([
        [80, 10],
        [5, 5],
      ]).kappa,
    ).toBeCloseTo(0.3182, 4);
  });

  it("is 1 for perfect agreement and null when chance agreement is already perfect", () => {
    // computed from the definition
    expect(
      cohensKappa([
        [7, 0],
        [0, 3],
      ]).kappa,
    ).toBeCloseTo(1, 12);
    const allYes = cohensKappa([
      [10, 0],
      [0, 0],
    ]);
    expect(allYes).toEqual({ n: 10, p0: 1, pe: 1, kappa: null });
  });

  it("gives nulls for an empty table", () => {
    expect(
      cohensKappa([
        [0, 0],
        [0, 0],
      ]),
    ).toEqual({ n: 0, p0: null, pe: null, kappa: null });
  });
});

describe("kappaTableFromPairs", () => {
  it("counts [rater A, rater B] pairs into the table", () => {
    const table = kappaTableFromPairs([
      [true, true],
      [true, true],
      [true, false],
      [false, true],
      [false, true],
      [false, true],
      [false, false],
    ]);
    expect(table).toEqual([
      [2, 1],
      [3, 1],
    ]);
    expect(kappaTableFromPairs([])).toEqual([
      [0, 0],
      [0, 0],
    ]);
  });
});
