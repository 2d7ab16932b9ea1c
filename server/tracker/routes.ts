import { Router } from "express";
import { quarterOfLocalDate } from "../../shared/period";
import { trackerQuerySchema } from "../../shared/schemas/tracker";
import type { Db } from "../db/client";
import { allow } from "../auth/guard";
import { parseWith } from "../http/validate";
import { quarterTracker } from "./service";

export function trackerRoutes(db: Db): Router {
  const router = Router();
  // without a quarter: the calendar quarter under way, whose files are the ones being collected
  router.get("/tracker", allow("readTracker"), (req, res) => {
    const { quarter } = parseWith(trackerQuerySchema, req.query, "The quarter");
    res.json(quarterTracker(db, quarter ?? quarterOfLocalDate(new Date())));
  });
  return router;
}
