// What the retention and calibration pages answer. Retention is a network figure for those who see
// everyone. Calibration is private: an instructor gets their own row and, of everyone else, only anonymous
// shares (never a group below the small-group threshold); coordinators and quality leads get every row.
import type { PatientType } from "../../shared/scoring/policy";
import type { Period } from "../../shared/schemas/insight";
import type { CalibrationAnswer, CalibrationRow, RetentionAnswer } from "../../shared/schemas/learners";
import type { Db } from "../db/client";
import { hidesGroup, type Viewer } from "../insight/viewer";
import { calibrationDetail } from "../metrics/calibration";
import { retention } from "../metrics/retention";

export function retentionAnswer(db: Db, period: Period, profile: PatientType | null): RetentionAnswer {
  return { period, profile, ...retention(db, period.from, period.to, profile) };
}

export function calibrationAnswer(db: Db, viewer: Viewer, period: Period): CalibrationAnswer {
  const detail = calibrationDetail(db, period.from, period.to);
  const byLeniency = detail.filter((r) => r.lenient_share !== null).sort((a, b) => b.lenient_share! - a.lenient_share!);
  const rows: CalibrationRow[] = detail.map(({ instructorId, name, instructor, ...figures }) => ({
    instructor: { id: instructorId, code: instructor, name },
    ...figures,
    // ties share the better place
    lenient_rank: figures.lenient_share === null ? null : byLeniency.findIndex((r) => r.lenient_share === figures.lenient_share) + 1,
  }));
  if (viewer.seesEveryone) return { period, ranked: byLeniency.length, rows, others: [], othersHidden: 0 };
  const own = rows.filter((r) => r.instructor.id === viewer.ownInstructorId);
  const others = rows.filter((r) => r.instructor.id !== viewer.ownInstructorId);
  const shown = others.filter((r) => !hidesGroup(viewer, r.judged));
  return {
    period,
    ranked: byLeniency.length,
    rows: own,
    others: shown
      .map((r) => ({ lenient_share: r.lenient_share, strict_share: r.strict_share, kappa: r.kappa }))
      .sort((a, b) => (b.lenient_share ?? -1) - (a.lenient_share ?? -1)),
    othersHidden: others.length - shown.length,
  };
}
