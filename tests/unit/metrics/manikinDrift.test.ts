// Manikin drift on small networks worked by hand. The offset and its interval are the mean of paired
// differences ± 1.959964·s/√k (Bland & Altman, Lancet 1986;1:307–310: bias and the standard error of the
// mean difference); the flag rule and the one-at-a-time flagging are Quarterbeat's own.
import { describe, expect, it } from "vitest";
import { manikinDrift, type DriftAttempt } from "../../../server/metrics/manikinDrift";
import type { PatientType } from "../../../shared/scoring/policy";

function attempt(classNo: number, manikin: string, depthMm: number, profile: PatientType = "adult"): DriftAttempt {
  return { classId: `C${classNo}`, date: `2026-0${Math.min(9, classNo)}-15`, manikin, profile, depthMm };
}

// Six classes with adult manikins A, B and C. A reads 59 mm (odd classes) or 61 mm (even) as the mean of two
// attempts; B always 55 mm; C always 53 mm.
function threeAdults(): DriftAttempt[] {
  const rows: DriftAttempt[] = [];
  for (let c = 1; c <= 6; c++) {
    const a = c % 2 === 1 ? [58, 60] : [60, 62];
    rows.push(attempt(c, "A", a[0]), attempt(c, "A", a[1]), attempt(c, "B", 55), attempt(c, "C", 53));
  }
  return rows;
}

describe("manikinDrift", () => {
  it("flags the manikin that reads deep, with the offset of the round that flagged it", () => {
    const a = manikinDrift(threeAdults()).find((r) => r.manikin === "A")!;
    // d = 59 − (55 + 53)/2 = 5 and 61 − 54 = 7, alternating: mean 6, s² = 6·1/5 = 1.2, SE = √(1.2/6) = 0.4472136
    expect(a.classes).toBe(6);
    expect(a.offset_mm).toBeCloseTo(6, 10);
    expect(a.se_mm).toBeCloseTo(0.4472136, 7);
    expect(a.ci95![0]).toBeCloseTo(6 - 1.959964 * 0.4472136, 6);
    expect(a.ci95![1]).toBeCloseTo(6 + 1.959964 * 0.4472136, 6);
    expect(a.flag).toBe("check");
    expect(a.flagged_in_round).toBe(1);
    expect(a.differences.map((d) => d.difference_mm)).toEqual([5, 7, 5, 7, 5, 7]);
    expect(a.differences[0]).toMatchObject({ classId: "C1", attempts: 2, peer_attempts: 2 });
  });

  it("compares the others again without the flagged manikin, so its pull does not flag a good one", () => {
    // In round 1, C's peers include A's deep readings: d = 53 − (58 + 60 + 55)/3 = −4.667 and
    // 53 − (60 + 62 + 55)/3 = −6, mean −5.33 with an interval excluding 0 — C would meet the rule. Without A,
    // B − C = 2 in every class: offsets +2 and −2 (below 3 mm), so neither is flagged.
    const rows = manikinDrift(threeAdults());
    const b = rows.find((r) => r.manikin === "B")!;
    const c = rows.find((r) => r.manikin === "C")!;
    expect(c.offset_mm).toBeCloseTo(-2, 10);
    expect(c.ci95).toEqual([-2, -2]);
    expect(c.flag).toBe("ok");
    expect(b.offset_mm).toBeCloseTo(2, 10);
    expect(b.flag).toBe("ok");
    expect(b.flagged_in_round).toBeNull();
    expect(rows.filter((r) => r.flag === "check").map((r) => r.manikin)).toEqual(["A"]);
  });

  it("leaves a large offset unflagged while its interval includes 0", () => {
    // G − H = 10, −4, 10, −4, 10: mean 4.4, s² = (3·5.6² + 2·8.4²)/4 = 58.8, SE = √(58.8/5) = 3.4293,
    // interval 4.4 ± 6.72 includes 0
    const rows: DriftAttempt[] = [];
    [60, 46, 60, 46, 60].forEach((g, i) => rows.push(attempt(i + 1, "G", g, "child"), attempt(i + 1, "H", 50, "child")));
    const [g, h] = manikinDrift(rows);
    expect(g.manikin).toBe("G");
    expect(g.offset_mm).toBeCloseTo(4.4, 10);
    expect(g.se_mm).toBeCloseTo(3.4293, 4);
    expect(g.flag).toBe("ok");
    expect(h.offset_mm).toBeCloseTo(-4.4, 10);
    expect(h.flag).toBe("ok");
  });

  it("says too few classes below the minimum, compares only the same patient type and skips unpaired manikins", () => {
    const rows = [
      // two paired infant classes: D 40 mm against E 43 mm
      attempt(1, "D", 40, "infant"),
      attempt(1, "E", 43, "infant"),
      attempt(2, "D", 40, "infant"),
      attempt(2, "E", 43, "infant"),
      // an adult manikin in the same class pairs with nobody
      attempt(1, "F", 70, "adult"),
    ];
    const result = manikinDrift(rows);
    expect(result.map((r) => r.manikin)).toEqual(["D", "E"]);
    expect(result[0]).toMatchObject({ classes: 2, offset_mm: -3, flag: "too few classes", flagged_in_round: null });
  });

  it("takes the minimum classes and offset as settings", () => {
    const rows: DriftAttempt[] = [];
    for (let c = 1; c <= 3; c++) rows.push(attempt(c, "D", 40 + c / 10, "infant"), attempt(c, "E", 43, "infant"));
    // D − E = −2.9, −2.8, −2.7: mean −2.8, interval excludes 0
    expect(manikinDrift(rows)[0].flag).toBe("too few classes");
    expect(manikinDrift(rows, { minClasses: 3, minOffsetMm: 3 })[0].flag).toBe("ok");
    expect(manikinDrift(rows, { minClasses: 3, minOffsetMm: 2.5 })[0].flag).toBe("check");
  });
});
