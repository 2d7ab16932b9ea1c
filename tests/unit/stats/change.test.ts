import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { changeFrom } from "../../../shared/stats";

describe("changeFrom", () => {
  it("gives absolute and relative change", () => {
    // hand-computed
    expect(changeFrom(12, 10)).toEqual({ absolute: 2, relative: 0.2 });
    expect(changeFrom(8, 10)).toEqual({ absolute: -2, relative: -0.2 });
    expect(changeFrom(-5, -10)).toEqual({ absolute: 5, relative: 0.5 }); // a rise reads as positive
  });

  it("leaves relative change null when previous is 0 or missing", () => {
    expect(changeFrom(5, 0)).toEqual({ absolute: 5, relative: null });
    expect(changeFrom(5, null)).toEqual({ absolute: null, relative: null });
    expect(changeFrom(5, undefined)).toEqual({ absolute: null, relative: null });
    expect(changeFrom(null, 5)).toEqual({ absolute: null, relative: null });
  });

  it("never produces NaN, whatever the inputs", () => {
    const anyNumber = fc.oneof(fc.double(), fc.constant(null), fc.constant(undefined));
    fc.assert(
      fc.property(anyNumber, anyNumber, (current, previous) => {
        const { absolute, relative } = changeFrom(current, previous);
        expect(Number.isNaN(absolute)).toBe(false);
        expect(Number.isNaN(relative)).toBe(false);
      }),
      { numRuns: 500 },
    );
  });
});
