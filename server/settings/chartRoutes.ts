// The control chart's baseline in the settings: anyone who reads the settings sees it, a coordinator sets it.
import { Router } from "express";
import { saveChartBaselineSchema } from "../../shared/schemas/chartSettings";
import type { Db } from "../db/client";
import { allow } from "../auth/guard";
import { parseWith } from "../http/validate";
import { chartBaseline, saveChartBaseline } from "../insight/chartBaseline";

export function chartSettingsRoutes(db: Db): Router {
  const router = Router();

  router.get("/settings/chart-baseline", allow("readSettings"), (_req, res) => {
    res.json(chartBaseline(db));
  });

  router.put("/settings/chart-baseline", allow("editSettings"), (req, res) => {
    const { baseline } = parseWith(saveChartBaselineSchema, req.body, "The baseline");
    res.json(saveChartBaseline(db, baseline));
  });

  return router;
}
