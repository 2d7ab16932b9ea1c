// An attempt's numbers beside the pass rule: the value written must fall on the same side of the threshold
// as the value itself, and a badge must say which way a share missed.
import { cleanup, render, screen } from "@testing-library/react";
import { afterEach, describe, expect, it } from "vitest";
import type { AttemptDetailAnswer } from "../../shared/schemas/insight";
import { DEFAULT_POLICY } from "../../shared/scoring/policy";
import { AttemptSummary } from "../../src/features/attempts/AttemptSummary";
import { atLeast, atMost, beside } from "../../src/features/attempts/labels";

afterEach(cleanup);

describe("beside", () => {
  it("writes a value with as many decimals as keep it on its side of the threshold", () => {
    expect(beside(69.6, 70, atLeast)).toBe("69.6");
    expect(beside(69.96, 70, atLeast)).toBe("69.96");
    expect(beside(70, 70, atLeast)).toBe("70");
    expect(beside(84.4, 70, atLeast)).toBe("84");
    expect(beside(10.04, 10, atMost, 1)).toBe("10.04");
    expect(beside(8.3, 10, atMost, 1)).toBe("8.3");
  });
});

const metrics: AttemptDetailAnswer["attempt"]["metrics"] = {
  durationS: 120,
  compressions: 230,
  rateCpm: 119.4,
  depthMm: 52,
  depthOkPct: 69.6,
  tooShallowPct: 26.1,
  tooDeepPct: 4.3,
  rateOkPct: 56,
  tooSlowPct: 2,
  tooFastPct: 42,
  recoilOkPct: 91,
  handsOnPct: 78,
  longestPauseS: 4.2,
  pauses: 2,
  pausesOver10s: 0,
};

describe("attempt summary", () => {
  it("shows 69.6 % against a pass mark of 70 % and says a missed share was mostly too shallow or too fast", () => {
    const attempt = { metrics } as AttemptDetailAnswer["attempt"];
    render(<AttemptSummary attempt={attempt} band={null} policy={DEFAULT_POLICY} unit="mm" />);
    const depth = screen.getByRole("heading", { name: "Depth on target" }).closest("section")!;
    expect(depth.textContent).toContain("69.6 %");
    expect(depth.textContent).toContain("Below the pass mark: mostly too shallow");
    const rate = screen.getByRole("heading", { name: "Rate on target" }).closest("section")!;
    expect(rate.textContent).toContain("56 %");
    expect(rate.textContent).toContain("Below the pass mark: mostly too fast");
    const recoil = screen.getByRole("heading", { name: "Full recoil" }).closest("section")!;
    expect(recoil.textContent).toContain("91 %");
    expect(recoil.textContent).toContain("On target");
  });
});
