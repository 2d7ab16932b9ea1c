import { describe, expect, it } from "vitest";
import { compareRates, differencePoints } from "../../../server/reports/compare";
import { contentDisposition } from "../../../server/reports/download";
import { countFigure, formatCount, perHundredFigure, rateFigure } from "../../../server/reports/figures";
import { kappaWords } from "../../../server/reports/narrative";

describe("compareRates", () => {
  it("calls 61/100 against 68/100 about the same: each lies inside the other's Wilson interval", () => {
    // Wilson 95 %: 61/100 → 0.512–0.700 and 68/100 → 0.583–0.763 (Newcombe 1998 method 3, computed by hand)
    expect(compareRates(rateFigure(68, 100, 5), rateFigure(61, 100, 5))).toBe("about the same");
  });

  it("calls the same 7-point step a rise once the samples are large", () => {
    // 680/1000 → 0.651–0.708 does not hold 0.61, so the rise is more than the intervals' noise
    expect(compareRates(rateFigure(680, 1000, 5), rateFigure(610, 1000, 5))).toBe("higher");
    expect(compareRates(rateFigure(610, 1000, 5), rateFigure(680, 1000, 5))).toBe("lower");
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
  });

  it("hides a rate made from fewer than the threshold, and an events-per-100 figure when either part is small", () => {
    expect(rateFigure(2, 4, 5)).toMatchObject({ value: null, text: "fewer than 5", intervalText: "" });
    expect(perHundredFigure(4, 200, 5).text).toBe("fewer than 5");
    expect(perHundredFigure(12, 4, 5).text).toBe("fewer than 5");
    expect(perHundredFigure(12, 200, 5).text).toBe("6.0");
    expect(perHundredFigure(null, 200, 5).text).toBe("not recorded");
  });
});

describe("kappaWords", () => {
  it("uses the Landis and Koch bands (Biometrics 1977;33:159–174, from memory)", () => {
    expect([-0.1, 0.1, 0.3, 0.5, 0.7, 0.9].map(kappaWords)).toEqual([
      "poorer than chance",
      "slight",
      "fair",
      "moderate",
      "substantial",
      "almost perfect",
    ]);
  });
});

describe("contentDisposition", () => {
  it("keeps the header safe whatever the name holds", () => {
    expect(contentDisposition('a"b\r\n.pdf')).toBe(`attachment; filename="a_b__.pdf"; filename*=UTF-8''a%22b%0D%0A.pdf`);
    expect(contentDisposition("Bericht-März.pdf")).toBe(`attachment; filename="Bericht-M_rz.pdf"; filename*=UTF-8''Bericht-M%C3%A4rz.pdf`);
  });
});
