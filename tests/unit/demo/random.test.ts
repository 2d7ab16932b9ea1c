import { describe, expect, it } from "vitest";
import { addDays, parseDay } from "../../../server/demo/calendar";
import { Random } from "../../../server/demo/random";
import { wholePercentages } from "../../../server/demo/summarize";

describe("seeded random numbers", () => {
  it("produces mulberry32's reference sequence", () => {
    // Computed here by compiling the reference C version of mulberry32 (Tommy Ettinger, 2017; the C text
    // written from memory): state += 0x6D2B79F5; z = (z ^ z >> 15) * (z | 1); z ^= z + (z ^ z >> 7) * (z | 61);
    // return z ^ z >> 14.
    const random = new Random(99);
    expect([1, 2, 3, 4, 5].map(() => random.nextUint32())).toEqual([1118692146, 3456687457, 2323025554, 2964572940, 4890715]);
    const other = new Random(20261201);
    expect([1, 2, 3].map(() => other.nextUint32())).toEqual([1214187109, 1007508439, 461233435]);
  });

  it("repeats for the same seed and differs between seeds and parts", () => {
    const draw = (r: Random) => Array.from({ length: 20 }, () => r.next());
    expect(draw(new Random(7))).toEqual(draw(new Random(7)));
    expect(draw(new Random(7))).not.toEqual(draw(new Random(8)));
    expect(draw(Random.forPart(7, "fleet"))).not.toEqual(draw(Random.forPart(7, "schedule")));
  });

  it("keeps every helper inside its range", () => {
    const random = new Random(1);
    const ints = new Set<number>();
    const outside: number[] = [];
    for (let i = 0; i < 2000; i++) {
      const u = random.next();
      if (!(u >= 0 && u < 1)) outside.push(u);
      ints.add(random.int(3, 6));
    }
    expect(outside).toEqual([]);
    expect([...ints].sort()).toEqual([3, 4, 5, 6]); // both ends reached, nothing outside
    expect(new Random(2).shuffled([1, 2, 3, 4, 5]).sort()).toEqual([1, 2, 3, 4, 5]);
    expect(() => random.pick([])).toThrow(RangeError);
  });

  it("draws normal deviates with the asked mean and spread", () => {
    const random = new Random(3);
    const values = Array.from({ length: 40_000 }, () => random.normal(10, 2));
    const mean = values.reduce((a, b) => a + b, 0) / values.length;
    const sd = Math.sqrt(values.reduce((a, b) => a + (b - mean) ** 2, 0) / (values.length - 1));
    // Standard error of the mean is 2 / sqrt(40000) = 0.01; allow 5 of them.
    expect(Math.abs(mean - 10)).toBeLessThan(0.05);
    expect(Math.abs(sd - 2)).toBeLessThan(0.05);
    // About 95.45 % within two standard deviations (normal distribution, common practice "68-95-99.7").
    const within = values.filter((v) => Math.abs(v - 10) <= 4).length / values.length;
    expect(within).toBeGreaterThan(0.95);
    expect(within).toBeLessThan(0.959);
  });

  it("draws Poisson counts with the asked mean", () => {
    const random = new Random(4);
    const counts = Array.from({ length: 20_000 }, () => random.poisson(0.6));
    const mean = counts.reduce((a, b) => a + b, 0) / counts.length;
    expect(Math.abs(mean - 0.6)).toBeLessThan(0.03);
    // P(0) = e^-0.6 = 0.5488 (Poisson definition, computed).
    expect(Math.abs(counts.filter((c) => c === 0).length / counts.length - 0.5488)).toBeLessThan(0.02);
  });
});

describe("whole percentages that add up to 100", () => {
  it("rounds by largest remainder", () => {
    expect(wholePercentages([100 / 3, 100 / 3, 100 / 3])).toEqual([34, 33, 33]);
    expect(wholePercentages([12.5, 12.5, 75])).toEqual([13, 12, 75]);
    expect(wholePercentages([66.7, 16.65, 16.65])).toEqual([67, 17, 16]);
    expect(wholePercentages([0, 0, 100])).toEqual([0, 0, 100]);
    expect(wholePercentages([99.6, 0.4, 0])).toEqual([100, 0, 0]);
  });

  it("always sums to exactly 100 for shares of n items", () => {
    for (let n = 1; n <= 300; n += 7) {
      for (let a = 0; a <= n; a += 3) {
        const b = Math.floor((n - a) / 2);
        const shares = [a, b, n - a - b].map((k) => (100 * k) / n);
        const whole = wholePercentages(shares);
        expect(whole.reduce((x, y) => x + y, 0)).toBe(100);
        whole.forEach((w, i) => expect(Math.abs(w - shares[i])).toBeLessThan(1));
      }
    }
  });
});

describe("demo calendar", () => {
  it("knows leap years", () => {
    expect(addDays("2024-02-28", 1)).toBe("2024-02-29"); // 2024 is a leap year
    expect(addDays("2025-02-28", 1)).toBe("2025-03-01");
    expect(() => parseDay("2025-02-29")).toThrow(RangeError);
    expect(() => parseDay("1 Dec 2026")).toThrow(RangeError);
  });
});
