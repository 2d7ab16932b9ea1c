// An invented network small enough to compute every report figure by hand. Rows are inserted with drizzle,
// so the report is tested on its own, without the import service.
//
// 2026-Q3: six classes, 48 learners (42 recorded as completed), 40 measured attempts of which 26 passed.
//   attempts by class:  Q3-1 adult live 8 (7 passed) · Q3-2 adult live 8 (6) · Q3-4 adult hidden 8 (4)
//                       Q3-6 adult hidden 8 (5) · Q3-3 child live 6 (3) · Q3-5 infant live 2 (1)
//   the 14 failed attempts, in that order, carry: 8 × too_shallow, 3 × too_shallow + too_fast,
//   2 × incomplete_recoil, 1 × long_pause
//   instructors recorded pass/fail for the 32 adult attempts: pass for all 22 measured passes and for the
//   first 6 measured failures, fail for the other 4
//   every attempt has 200 compressions and uses one of five manikins in turn
// 2026-Q2: one adult class, 20 learners, 20 attempts of which 6 passed.
// 2025-Q3: one adult class, 10 learners, 10 attempts of which 6 passed.
import { attempts, classes, equipmentEvents, manikins } from "../../../server/db/schema";
import type { Db } from "../../../server/db/client";
import { currentPolicy } from "../../../server/policy/service";

function quarterOf(date: string): string {
  return `${date.slice(0, 4)}-Q${Math.ceil(Number(date.slice(5, 7)) / 3)}`;
}

export interface FixturePeople {
  sites: { north: { id: number }; south: { id: number } };
  instructors: { a1: { id: number }; b1: { id: number } };
}

interface ClassSpec {
  id: string;
  date: string;
  site: "north" | "south";
  instructor: "a1" | "b1";
  course: "infant" | "child" | "adult" | "all-ages";
  learners: number;
  passed: number;
  lungs?: number | null;
  mouthpieces?: number | null;
  batteries?: number | null;
}

interface AttemptGroup {
  classId: string;
  profile: "infant" | "child" | "adult";
  feedback: "live" | "hidden";
  attempts: number;
  passed: number;
}

export const Q3_CLASSES: ClassSpec[] = [
  { id: "Q3-1", date: "2026-07-08", site: "north", instructor: "a1", course: "adult", learners: 10, passed: 9, lungs: 1, mouthpieces: 10, batteries: 0 },
  { id: "Q3-2", date: "2026-07-22", site: "south", instructor: "b1", course: "adult", learners: 8, passed: 8, lungs: 0, mouthpieces: 8, batteries: 1 },
  { id: "Q3-3", date: "2026-08-12", site: "north", instructor: "a1", course: "child", learners: 6, passed: 5, lungs: 1, mouthpieces: 6, batteries: 0 },
  { id: "Q3-4", date: "2026-08-26", site: "south", instructor: "b1", course: "adult", learners: 9, passed: 7, lungs: 2, mouthpieces: 9, batteries: 0 },
  { id: "Q3-5", date: "2026-09-09", site: "north", instructor: "a1", course: "infant", learners: 3, passed: 3, lungs: 0, mouthpieces: 3, batteries: 0 },
  { id: "Q3-6", date: "2026-09-23", site: "south", instructor: "b1", course: "adult", learners: 12, passed: 10, lungs: 1, mouthpieces: 12, batteries: 1 },
];

export const Q3_ATTEMPTS: AttemptGroup[] = [
  { classId: "Q3-1", profile: "adult", feedback: "live", attempts: 8, passed: 7 },
  { classId: "Q3-2", profile: "adult", feedback: "live", attempts: 8, passed: 6 },
  { classId: "Q3-4", profile: "adult", feedback: "hidden", attempts: 8, passed: 4 },
  { classId: "Q3-6", profile: "adult", feedback: "hidden", attempts: 8, passed: 5 },
  { classId: "Q3-3", profile: "child", feedback: "live", attempts: 6, passed: 3 },
  { classId: "Q3-5", profile: "infant", feedback: "live", attempts: 2, passed: 1 },
];

/** Error masks of the failed 2026-Q3 attempts in order (bit 0 too_shallow, 3 too_fast, 4 incomplete_recoil, 6 long_pause). */
const FAILED_MASKS = [...Array(8).fill(1), ...Array(3).fill(1 | 8), 16, 16, 64];

export function insertReportFixture(db: Db, people: FixturePeople) {
  const policyVersion = currentPolicy(db).version;
  const manikinIds = ["RF-M1", "RF-M2", "RF-M3", "RF-M4", "RF-M5"].map(
    (assetId) => db.insert(manikins).values({ assetId, patientType: "adult", siteId: people.sites.north.id }).returning({ id: manikins.id }).get().id,
  );

  const classSpecs: ClassSpec[] = [
    ...Q3_CLASSES,
    { id: "Q2-1", date: "2026-05-10", site: "north", instructor: "a1", course: "adult", learners: 20, passed: 18 },
    { id: "LY-1", date: "2025-08-10", site: "south", instructor: "b1", course: "adult", learners: 10, passed: 10 },
  ];
  const classById = new Map(classSpecs.map((c) => [c.id, c]));
  for (const c of classSpecs) {
    db.insert(classes)
      .values({
        id: c.id,
        date: c.date,
        quarter: quarterOf(c.date),
        siteId: people.sites[c.site].id,
        instructorId: people.instructors[c.instructor].id,
        course: c.course,
        learners: c.learners,
        passed: c.passed,
        lungsReplaced: c.lungs ?? null,
        mouthpiecesCleaned: c.mouthpieces ?? null,
        batteriesReplaced: c.batteries ?? null,
      })
      .run();
  }

  const groups: AttemptGroup[] = [
    ...Q3_ATTEMPTS,
    { classId: "Q2-1", profile: "adult", feedback: "live", attempts: 20, passed: 6 },
    { classId: "LY-1", profile: "adult", feedback: "live", attempts: 10, passed: 6 },
  ];
  let serial = 0;
  let failedInQ3 = 0;
  let adultFailedInQ3 = 0;
  for (const group of groups) {
    const c = classById.get(group.classId)!;
    const quarter = quarterOf(c.date);
    for (let i = 0; i < group.attempts; i++) {
      const passed = i < group.passed;
      let errorMask = 0;
      let instructorResult: "pass" | "fail" | null = null;
      if (quarter === "2026-Q3") {
        if (!passed) errorMask = FAILED_MASKS[failedInQ3++];
        if (group.profile === "adult") {
          instructorResult = passed ? "pass" : adultFailedInQ3++ < 6 ? "pass" : "fail";
        }
      } else if (!passed) {
        errorMask = 2;
      }
      serial += 1;
      db.insert(attempts)
        .values({
          id: `RF-A${serial}`,
          classId: c.id,
          learner: `L${String(serial).padStart(4, "0")}`,
          manikinId: manikinIds[serial % manikinIds.length],
          profile: group.profile,
          feedback: group.feedback,
          startedAt: `${c.date}T10:00:00Z`,
          quarter,
          siteId: people.sites[c.site].id,
          instructorId: people.instructors[c.instructor].id,
          durationS: 120,
          compressions: 200,
          rateCpm: 110,
          depthMm: passed ? 54 : 44,
          depthOkPct: passed ? 85 : 40,
          tooShallowPct: passed ? 10 : 55,
          tooDeepPct: 5,
          rateOkPct: 80,
          tooSlowPct: 10,
          tooFastPct: 10,
          recoilOkPct: 90,
          handsOnPct: 75,
          longestPauseS: 4,
          instructorResult,
          source: "summary",
          score: passed ? 85 : 55,
          passed,
          errorMask,
          policyVersion,
        })
        .run();
    }
  }

  // Five services and two faults inside 2026-Q3, one service just after it.
  const events: { date: string; event: "serviced" | "fault" }[] = [
    { date: "2026-07-01", event: "serviced" },
    { date: "2026-07-15", event: "serviced" },
    { date: "2026-08-01", event: "serviced" },
    { date: "2026-08-20", event: "serviced" },
    { date: "2026-09-30", event: "serviced" },
    { date: "2026-08-03", event: "fault" },
    { date: "2026-09-12", event: "fault" },
    { date: "2026-10-01", event: "serviced" },
  ];
  events.forEach((e, i) => {
    db.insert(equipmentEvents)
      .values({ eventKey: `RF-E${i}`, date: e.date, manikinId: manikinIds[i % manikinIds.length], siteId: people.sites.north.id, event: e.event })
      .run();
  });
}
