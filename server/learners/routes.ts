// GET /api/learners/retention (those who see every instructor) and GET /api/learners/calibration (an
// instructor their own, coordinators and quality leads everyone's).
import { Router, type Request } from "express";
import { insightFiltersSchema } from "../../shared/filters";
import type { Db } from "../db/client";
import { allow, signedInUser } from "../auth/guard";
import { parseWith } from "../http/validate";
import { sendCached } from "../insight/cache";
import { filtersKey, resolveFilters } from "../insight/filters";
import { viewerKey, viewerOf } from "../insight/viewer";
import { calibrationAnswer, retentionAnswer } from "./service";

export function learnerRoutes(db: Db): Router {
  const router = Router();

  function context(req: Request, route: string) {
    const viewer = viewerOf(db, signedInUser(req));
    const filters = resolveFilters(db, parseWith(insightFiltersSchema, req.query, "The filters"), viewer);
    return { viewer, filters, key: `${route}|${viewerKey(viewer)}|${filtersKey(filters)}` };
  }

  router.get("/learners/retention", allow("drillDown"), (req, res) => {
    const { filters, key } = context(req, "retention");
    sendCached(db, res, key, () => retentionAnswer(db, filters.period, filters.profile));
  });

  router.get("/learners/calibration", allow("readCalibration"), (req, res) => {
    const { viewer, filters, key } = context(req, "calibration");
    sendCached(db, res, key, () => calibrationAnswer(db, viewer, filters.period));
  });

  return router;
}
