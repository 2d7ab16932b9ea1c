// GET /api/equipment: coordinators and quality leads see the whole fleet; an instructor sees their own site.
import { Router } from "express";
import { insightFiltersSchema } from "../../shared/filters";
import { can } from "../../shared/permissions";
import type { Db } from "../db/client";
import { allow, rowScope, signedInUser } from "../auth/guard";
import { forbidden } from "../errors";
import { parseWith } from "../http/validate";
import { filtersKey, resolveFilters } from "../insight/filters";
import { sendCached } from "../insight/cache";
import { mayShow } from "../insight/release";
import { viewerKey, viewerOf } from "../insight/viewer";
import { currentPolicy } from "../policy/service";
import { equipmentReport } from "./service";

export function equipmentRoutes(db: Db): Router {
  const router = Router();

  router.get("/equipment", allow("readEquipment"), (req, res) => {
    const user = signedInUser(req);
    const viewer = viewerOf(db, user);
    const filters = resolveFilters(db, parseWith(insightFiltersSchema, req.query, "The filters"), viewer);
    if (!can(user, "readEquipment", "any")) {
      // "own" reach: the user's own site's equipment
      if (filters.siteId !== null && filters.siteId !== user.siteId) throw forbidden("You can see the equipment of your own site only.");
      filters.siteId = user.siteId ?? -1;
    }
    const asOf = new Date().toISOString().slice(0, 10);
    const onlyInstructorId = rowScope(user, "readEquipment").instructorId;
    // a manikin's use in a quarter is a figure over others' attempts: shown as the insight pages' grid allows
    const usageShown = (manikinId: number, quarter: string) =>
      mayShow(db, viewer, { from: quarter, to: quarter, siteId: null, profile: null, feedback: null, instructorId: null, manikinId });
    sendCached(db, res, `equipment|${asOf}|${viewerKey(viewer)}|${filtersKey(filters)}`, () =>
      equipmentReport(db, currentPolicy(db).policy.equipment, { filters, onlyInstructorId, asOf, usageShown }),
    );
  });

  return router;
}
