// Instructors against the network, the figure behind the instructors' funnel, "My standing" and
// `quarterbeat funnel`: each instructor's passes against those expected (indirect standardisation by patient
// type × feedback display, or one stratum when not adjusted), the z-scores, the winsorised dispersion φ
// (Spiegelhalter 2005) and each instructor's position against limits widened by √φ when overdispersed.
import { feedbackModes } from "../../shared/domain";
import type { AdjustMode } from "../../shared/filters";
import {
  dispersionOf,
  indirectStandardisation,
  positionOfZ,
  type Dispersion,
  type FunnelPosition,
  type StandardisedUnit,
  type StratumCount,
} from "../../shared/stats";
import type { Db } from "../db/client";
import { talliesByPair, type SummaryScope } from "./summaries";

export interface InstructorFunnelUnit extends StandardisedUnit {
  /** null without attempts. */
  position: FunnelPosition | null;
}

export interface InstructorFunnel {
  adjust: AdjustMode;
  networkRate: number | null;
  dispersion: Dispersion;
  units: Map<number, InstructorFunnelUnit>;
}

/** Each instructor's attempts and passes per stratum (patient type × feedback display, or one stratum). */
export function instructorStrata(db: Db, scope: SummaryScope, adjust: AdjustMode): Map<number, StratumCount[]> {
  const cells = new Map<number, StratumCount[]>();
  // the summaries group by two dimensions at a time: one pass per feedback display
  for (const feedback of scope.feedback === null ? feedbackModes : [scope.feedback]) {
    for (const [key, tally] of talliesByPair(db, { ...scope, feedback }, "instructorId", "profile")) {
      const [instructor, profile] = key.split("|");
      const list = cells.get(Number(instructor)) ?? [];
      list.push({ stratum: adjust === "none" ? "all" : `${profile}|${feedback}`, n: tally.n, passed: tally.passed });
      cells.set(Number(instructor), list);
    }
  }
  return cells;
}

/** Every instructor with attempts in scope (the scope names no instructor), standardised and placed. */
export function instructorFunnel(db: Db, scope: SummaryScope, adjust: AdjustMode): InstructorFunnel {
  const standardised = indirectStandardisation(instructorStrata(db, { ...scope, instructorId: null }, adjust));
  const dispersion = dispersionOf([...standardised.units.values()].flatMap((unit) => (unit.z === null ? [] : [unit.z])));
  const units = new Map(
    [...standardised.units].map(([id, unit]): [number, InstructorFunnelUnit] => [
      id,
      // without variance the unit can only have passed as expected
      { ...unit, position: unit.n === 0 ? null : unit.z === null ? "inside" : positionOfZ(unit.z, dispersion.scale) },
    ]),
  );
  return { adjust, networkRate: standardised.networkRate, dispersion, units };
}
