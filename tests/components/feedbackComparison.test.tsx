// The sentence under the live-against-hidden chart uses the one test of a difference (Newcombe's hybrid score).
import { describe, expect, it } from "vitest";
import { describeFeedback, type FeedbackGroup } from "../../src/features/insight/charts/FeedbackComparisonChart";

const group = (mode: "live" | "hidden", successes: number, n: number): FeedbackGroup => ({
  mode,
  attempts: n,
  passRate: { successes, n, rate: successes / n, low: null, high: null, suppressed: false },
  medianScore: null,
  suppressed: false,
});

describe("describeFeedback", () => {
  it("calls a gap clear only when the difference's interval excludes zero", () => {
    // 56/70 against 48/80: interval +5.2 to +33.4 points (Newcombe 1998, Table II, method 10)
    expect(describeFeedback([group("live", 56, 70), group("hidden", 48, 80)], 5)).toContain("lies wholly above zero: learners do clearly better");
    // 5/56 against 0/29: interval −3.8 to +19.3 points, includes zero (same table)
    expect(describeFeedback([group("live", 5, 56), group("hidden", 0, 29)], 5)).toContain("includes no difference: the gap may be chance");
  });
});
