// GET /api/equipment: coordinators and quality leads see the whole fleet; an instructor sees their own site.
import { eq } from "drizzle-orm";
import { Router, type Request } from "express";
import { insightFiltersSchema } from "../../shared/filters";
import { can } from "../../shared/permissions";
import type { Db } from "../db/client";
import { manikins } from "../db/schema";
import { allow, rowScope, signedInUser } from "../auth/guard";
import { forbidden } from "../errors";
import { parseWith } from "../http/validate";
import { filtersKey, resolveFilters } from "../insight/filters";
import { sendCached } from "../insight/cache";
import { mayShow } from "../insight/release";
import { viewerKey, viewerOf } from "../insight/viewer";
import { currentPolicy } from "../policy/service";
import { driftRule, manikinDriftReport } from "../metrics/manikinDrift";
import { manikinRecord } from "./manikinRecord";
import { equipmentReport } from "./service";

export function equipmentRoutes(db: Db): Router {
  const router = Router();

  /** The filters, narrowed to the user's own site for "own" reach. */
  function equipmentContext(req: Request) {
    const user = signedInUser(req);
    const viewer = viewerOf(db, user);
    const filters = resolveFilters(db, parseWith(insightFiltersSchema, req.query, "The filters"), viewer);
    if (!can(user, "readEquipment", "any")) {
      if (filters.siteId !== null && filters.siteId !== user.siteId) throw forbidden("You can see the equipment of your own site only.");
      filters.siteId = user.siteId ?? -1;
    }
    return { user, viewer, filters };
  }

  router.get("/equipment", allow("readEquipment"), (req, res) => {
    const { user, viewer, filters } = equipmentContext(req);
    const asOf = new Date().toISOString().slice(0, 10);
    const onlyInstructorId = rowScope(user, "readEquipment").instructorId;
    // a manikin's use in a quarter is a figure over others' attempts: shown as the insight pages' grid allows
    const usageShown = (manikinId: number, quarter: string) =>
      mayShow(db, viewer, { from: quarter, to: quarter, siteId: null, profile: null, feedback: null, instructorId: null, manikinId });
    sendCached(db, res, `equipment|${asOf}|${viewerKey(viewer)}|${filtersKey(filters)}`, () =>
      equipmentReport(db, currentPolicy(db).policy.equipment, { filters, onlyInstructorId, asOf, usageShown }),
    );
  });

  // Per-device comparison within classes: a site's manikins (an instructor's own site) over the period.
  // An instructor sees the offsets of their site's manikins but not which of others' classes lie behind them.
  router.get("/equipment/drift", allow("readEquipment"), (req, res) => {
    const { user, viewer, filters } = equipmentContext(req);
    const rule = driftRule(currentPolicy(db).policy.equipment);
    const showClasses = can(user, "readEquipment", "any");
    // a manikin filter narrows the rows shown; the manikin is still compared with all of its peers
    const onlyManikin = filters.manikinId === null ? null : (db.select({ assetId: manikins.assetId }).from(manikins).where(eq(manikins.id, filters.manikinId)).get()?.assetId ?? null);
    sendCached(db, res, `equipment-drift|${viewerKey(viewer)}|${filtersKey(filters)}`, () => ({
      period: filters.period,
      rule,
      manikins: manikinDriftReport(db, { from: filters.period.from, to: filters.period.to, siteId: filters.siteId, options: rule })
        .filter((m) => filters.profile === null || m.profile === filters.profile)
        .filter((m) => onlyManikin === null || m.manikin === onlyManikin)
        .map((m) => (showClasses ? m : { ...m, differences: m.differences.map((d) => ({ ...d, classId: null })) })),
    }));
  });

  // One manikin's record; an instructor opens only their own site's manikins. The period filters apply; a
  // manikin filter in the query is ignored, the path names the manikin.
  router.get("/equipment/manikins/:assetId", allow("readEquipment"), (req, res) => {
    const { user, viewer, filters } = equipmentContext(req);
    const assetId = String(req.params.assetId);
    const asOf = new Date().toISOString().slice(0, 10);
    const onlyInstructorId = rowScope(user, "readEquipment").instructorId;
    const seesFleet = can(user, "readEquipment", "any");
    const usageShown = (manikinId: number, quarter: string) =>
      mayShow(db, viewer, { from: quarter, to: quarter, siteId: null, profile: null, feedback: null, instructorId: null, manikinId });
    sendCached(db, res, `equipment-manikin|${assetId}|${asOf}|${viewerKey(viewer)}|${filtersKey(filters)}`, () =>
      manikinRecord(db, currentPolicy(db).policy.equipment, assetId, { filters, onlyInstructorId, asOf, usageShown }, {
        onlySiteId: seesFleet ? null : filters.siteId,
        showClasses: seesFleet,
      }),
    );
  });

  return router;
}
