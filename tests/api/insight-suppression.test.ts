// Complementary suppression: groups that add up to a shown total are hidden together when the hidden ones
// would otherwise be revealed by subtraction (threshold 5, the default smallest group).
import { describe, expect, it } from "vitest";
import { hidesGroup, withComplementaryHiding, type Viewer } from "../../server/insight/viewer";

const user = { id: 1, email: "i@x.example", displayName: "I", instructorId: 7, siteId: 1, lengthUnit: "mm" as const };
const instructor: Viewer = { user: { ...user, role: "instructor" }, seesEveryone: false, ownInstructorId: 7, suppressionMinCount: 5 };
const quality: Viewer = { user: { ...user, role: "quality_lead", instructorId: null }, seesEveryone: true, ownInstructorId: null, suppressionMinCount: 5 };

describe("hidesGroup", () => {
  it("hides 1 to 4 attempts of others, never 0 or 5 and more, and nothing from a quality lead", () => {
    expect([0, 1, 4, 5, 100].map((n) => hidesGroup(instructor, n))).toEqual([false, true, true, false, false]);
    expect(hidesGroup(quality, 1)).toBe(false);
  });
});

describe("withComplementaryHiding", () => {
  const hide = (counts: number[]) => withComplementaryHiding(instructor, counts, counts.map((n) => hidesGroup(instructor, n)));

  it("hides the smallest other group too when one hidden group alone would be revealed", () => {
    // total 3 + 20 + 8 shown: 3 hidden alone = total − 20 − 8; hiding 8 as well leaves only 3 + 8 = 11 to find
    expect(hide([3, 20, 8])).toEqual([true, false, true]);
  });

  it("hides both of two groups when one is small", () => {
    expect(hide([2, 30])).toEqual([true, true]);
  });

  it("leaves the groups alone when the hidden ones already hold enough together", () => {
    // 3 + 4 = 7 ≥ 5: their sum can be worked out, but no group under 5 can
    expect(hide([3, 4, 50])).toEqual([true, true, false]);
  });

  it("leaves empty groups and groups with nothing hidden alone", () => {
    expect(hide([0, 12, 9])).toEqual([false, false, false]);
    expect(hide([0, 3, 0])).toEqual([false, true, false]);
  });

  it("changes nothing for a viewer who sees every group", () => {
    expect(withComplementaryHiding(quality, [2, 30], [false, false])).toEqual([false, false]);
  });
});
