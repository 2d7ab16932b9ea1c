// GET /api/equipment: coordinators and quality leads see the whole fleet; an instructor sees their own site.
import { Router, type Request } from "express";
import { insightFiltersSchema } from "../../shared/filters";
import { can } from "../../shared/permissions";
import type { Db } from "../db/client";
import { allow, signedInUser } from "../auth/guard";
import { forbidden } from "../errors";
import { parseWith } from "../http/validate";
import { filtersKey, resolveFilters } from "../insight/filters";
import { sendAnswer } from "../offThread/pool";
import { viewerKey, viewerOf } from "../insight/viewer";

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
    const { viewer, filters } = equipmentContext(req);
    const asOf = new Date().toISOString().slice(0, 10);
    return sendAnswer(db, res, `equipment|${asOf}|${viewerKey(viewer)}|${filtersKey(filters)}`, "fleet", [viewer, filters, asOf]);
  });

  router.get("/equipment/drift", allow("readEquipment"), (req, res) => {
    const { viewer, filters } = equipmentContext(req);
    return sendAnswer(db, res, `equipment-drift|${viewerKey(viewer)}|${filtersKey(filters)}`, "drift", [viewer, filters]);
  });

  // A manikin filter in the query is ignored: the path names the manikin.
  router.get("/equipment/manikins/:assetId", allow("readEquipment"), (req, res) => {
    const { viewer, filters } = equipmentContext(req);
    const assetId = String(req.params.assetId);
    const asOf = new Date().toISOString().slice(0, 10);
    return sendAnswer(db, res, `equipment-manikin|${assetId}|${asOf}|${viewerKey(viewer)}|${filtersKey(filters)}`, "manikin", [viewer, filters, assetId, asOf]);
  });

  return router;
}
