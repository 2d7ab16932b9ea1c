// The equipment answers from plain arguments (the viewer, the filters narrowed to what they may see, the day),
// so the routes can have them computed off the event loop (server/offThread): the fleet, the per-device
// depth comparison and one manikin's record.
import { eq } from "drizzle-orm";
import { can } from "../../shared/permissions";
import type { Db } from "../db/client";
import { manikins } from "../db/schema";
import type { ResolvedFilters } from "../insight/filters";
import { mayShow } from "../insight/release";
import type { Viewer } from "../insight/viewer";
import { driftRule, manikinDriftReport } from "../metrics/manikinDrift";
import { currentPolicy } from "../policy/service";
import { rowScope } from "../auth/guard";
import { manikinRecord } from "./manikinRecord";
import { equipmentReport } from "./service";

/** A manikin's use in a quarter is a figure over others' attempts: shown as the insight pages' grid allows. */
function usageShownTo(db: Db, viewer: Viewer) {
  return (manikinId: number, quarter: string) =>
    mayShow(db, viewer, { from: quarter, to: quarter, siteId: null, profile: null, feedback: null, instructorId: null, manikinId });
}

export function fleetAnswer(db: Db, viewer: Viewer, filters: ResolvedFilters, asOf: string) {
  const onlyInstructorId = rowScope(viewer.user, "readEquipment").instructorId;
  return equipmentReport(db, currentPolicy(db).policy.equipment, { filters, onlyInstructorId, asOf, usageShown: usageShownTo(db, viewer) });
}

/**
 * Per-device comparison within classes: a site's manikins (an instructor's own site) over the period. An
 * instructor sees the offsets of their site's manikins but not which of others' classes lie behind them. A
 * manikin filter narrows the rows shown; the manikin is still compared with all of its peers.
 */
export function driftAnswer(db: Db, viewer: Viewer, filters: ResolvedFilters) {
  const rule = driftRule(currentPolicy(db).policy.equipment);
  const showClasses = can(viewer.user, "readEquipment", "any");
  const onlyManikin =
    filters.manikinId === null
      ? null
      : (db.select({ assetId: manikins.assetId }).from(manikins).where(eq(manikins.id, filters.manikinId)).get()?.assetId ?? null);
  return {
    period: filters.period,
    rule,
    manikins: manikinDriftReport(db, { from: filters.period.from, to: filters.period.to, siteId: filters.siteId, options: rule })
      .filter((m) => filters.profile === null || m.profile === filters.profile)
      .filter((m) => onlyManikin === null || m.manikin === onlyManikin)
      .map((m) => (showClasses ? m : { ...m, differences: m.differences.map((d) => ({ ...d, classId: null })) })),
  };
}

/** One manikin's record; an instructor opens only their own site's manikins (the filters name that site). */
export function manikinAnswer(db: Db, viewer: Viewer, filters: ResolvedFilters, assetId: string, asOf: string) {
  const onlyInstructorId = rowScope(viewer.user, "readEquipment").instructorId;
  const seesFleet = can(viewer.user, "readEquipment", "any");
  return manikinRecord(
    db,
    currentPolicy(db).policy.equipment,
    assetId,
    { filters, onlyInstructorId, asOf, usageShown: usageShownTo(db, viewer) },
    {
      onlySiteId: seesFleet ? null : filters.siteId,
      showClasses: seesFleet,
    },
  );
}
