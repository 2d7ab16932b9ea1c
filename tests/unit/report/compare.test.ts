import { describe, expect, it } from "vitest";
import { compareRates, differencePoints } from "../../../server/reports/compare";
import { countFigure, formatCount, perHundredFigure, plainCount, rateFigure } from "../../../server/reports/figures";
import { kappaWords } from "../../../server/reports/narrative";

describe("compareRates", () => {
  it("calls 61/100 against 68/100 no clear change: the interval of the difference includes zero", () => {
    // 68/100 − 61/100 = +7 points; hybrid score 95 % interval about −6.2 to +19.8 points (Newcombe 1998, method 10)
    expect(compareRates(rateFigure(68, 100, 5), rateFigure(61, 100, 5))).toBe("no clear change");
  });

  it("agrees with the overview's test where the intervals' overlap would have called a change", () => {
    // 56/70 against 48/80: the interval of the difference is 0.0524 to 0.3339 (Newcombe 1998, Table II): higher
    expect(compareRates(rateFigure(56, 70, 5), rateFigure(48, 80, 5))).toBe("up");
    // 130/500 against 110/500: each rate lies just outside the other's Wilson interval (0.2235–0.3002 and
    // 0.1859–0.2584), which once read as a rise; the difference's interval, −1.3 to +9.3 points, includes zero
    expect(compareRates(rateFigure(130, 500, 5), rateFigure(110, 500, 5))).toBe("no clear change");
  });

  it("calls the same 7-point step a rise once the samples are large", () => {
    // 680/1000 → 0.651–0.708 does not hold 0.61, so the rise is more than the intervals' noise
    expect(compareRates(rateFigure(680, 1000, 5), rateFigure(610, 1000, 5))).toBe("up");
    expect(compareRates(rateFigure(610, 1000, 5), rateFigure(680, 1000, 5))).toBe("down");
    expect(differencePoints(rateFigure(680, 1000, 5), rateFigure(610, 1000, 5))).toBeCloseTo(7, 10);
  });

  it("does not compare with a hidden rate", () => {
    expect(compareRates(rateFigure(3, 4, 5), rateFigure(61, 100, 5))).toBeNull();
    expect(differencePoints(rateFigure(61, 100, 5), rateFigure(3, 4, 5))).toBeNull();
  });
});

describe("figures", () => {
  it("formats counts with a fixed thousands separator", () => {
    expect(formatCount(1234567)).toBe("1,234,567");
    expect(countFigure(4, 5)).toEqual({ value: null, hidden: "small", text: "fewer than 5" });
    expect(countFigure(5, 5)).toEqual({ value: 5, hidden: null, text: "5" });
    // no activity is no small group: it reads "no data", never "fewer than 5"
    expect(countFigure(0, 5)).toEqual({ value: 0, hidden: null, text: "no data" });
    expect(countFigure(40, 5, "protects-other")).toEqual({ value: null, hidden: "protects-other", text: "not shown" });
    expect(plainCount(2)).toEqual({ value: 2, hidden: null, text: "2" });
  });

  it('hides a rate only with its group, reading "hidden" rather than a count', () => {
    expect(rateFigure(2, 4, 5)).toMatchObject({ value: null, hidden: "small", text: "hidden", intervalText: "", n: { text: "fewer than 5" } });
    expect(rateFigure(30, 40, 5, "protects-other")).toMatchObject({ value: null, hidden: "protects-other", text: "hidden", n: { text: "not shown" } });
    expect(rateFigure(0, 0, 5)).toMatchObject({ value: null, hidden: null, text: "no data" });
    // a few events per many learners describe no person: shown; only a small or hidden group of learners hides it
    expect(perHundredFigure(4, 200, 5).text).toBe("2.0");
    expect(perHundredFigure(12, 4, 5)).toEqual({ value: null, hidden: "small", text: "hidden" });
    expect(perHundredFigure(12, 200, 5, "protects-other")).toEqual({ value: null, hidden: "protects-other", text: "hidden" });
    expect(perHundredFigure(12, 200, 5).text).toBe("6.0");
    expect(perHundredFigure(null, 200, 5).text).toBe("not recorded");
  });
});

describe("kappaWords", () => {
  it("uses the Landis and Koch bands (Biometrics 1977;33:159–174, from memory)", () => {
    expect([-0.1, 0.1, 0.3, 0.5, 0.7, 0.9].map(kappaWords)).toEqual(["poorer than chance", "slight", "fair", "moderate", "substantial", "almost perfect"]);
  });
});
