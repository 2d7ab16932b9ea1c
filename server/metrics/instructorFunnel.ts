// Instructors against the network, the figure behind the instructors' funnel, "My standing" and
// `quarterbeat funnel`: each instructor's passes against those expected (indirect standardisation by patient
// type × feedback display, or one stratum when not adjusted), the z-scores, the winsorised dispersion φ
// (Spiegelhalter 2005) and each instructor's position against limits widened by √φ when overdispersed.
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
import { talliesByInstructorStratum, type StratumKey, type SummaryScope, type Tally } from "./summaries";

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
function instructorStrata(byStratum: ReadonlyMap<number, ReadonlyMap<StratumKey, Tally>>, adjust: AdjustMode): Map<number, StratumCount[]> {
  return new Map(
    [...byStratum].map(([instructorId, strata]) => [
      instructorId,
      [...strata].map(([stratum, tally]) => ({ stratum: adjust === "none" ? "all" : stratum, n: tally.n, passed: tally.passed })),
    ]),
  );
}

/** Every instructor with attempts in scope (the scope names no instructor), standardised and placed; `byStratum` when the caller has read it already. */
export function instructorFunnel(
  db: Db,
  scope: SummaryScope,
  adjust: AdjustMode,
  byStratum: ReadonlyMap<number, ReadonlyMap<StratumKey, Tally>> = talliesByInstructorStratum(db, { ...scope, instructorId: null }),
): InstructorFunnel {
  const standardised = indirectStandardisation(instructorStrata(byStratum, adjust));
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
