// The primary rule for counts outside the released grid (learners, class logs): threshold 5, the default
// smallest group. The grid itself is tested in tests/unit/stats/suppression.test.ts and
// tests/security/differencing.test.ts.
import { describe, expect, it } from "vitest";
import { hidesGroup, type Viewer } from "../../server/insight/viewer";

const user = { id: 1, email: "i@x.example", displayName: "I", instructorId: 7, siteId: 1, lengthUnit: "mm" as const };
const instructor: Viewer = {
  user: { ...user, role: "instructor" },
  seesEveryone: false,
  ownInstructorId: 7,
  suppressionMinCount: 5,
  suppressionMinInstructors: 3,
};
const quality: Viewer = {
  user: { ...user, role: "quality_lead", instructorId: null },
  seesEveryone: true,
  ownInstructorId: null,
  suppressionMinCount: 5,
  suppressionMinInstructors: 3,
};

describe("hidesGroup", () => {
  it("hides 1 to 4 attempts of others, never 0 or 5 and more, and nothing from a quality lead", () => {
    expect([0, 1, 4, 5, 100].map((n) => hidesGroup(instructor, n))).toEqual([false, true, true, false, false]);
    expect(hidesGroup(quality, 1)).toBe(false);
  });
});
