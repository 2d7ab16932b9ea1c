// GET /api/system: the installation's state for coordinators (ops/systemReport.ts, which the CLI calls too).
import { Router } from "express";
import { allow } from "../auth/guard";
import type { Db } from "../db/client";
import { systemReport, type SystemReportOptions } from "./systemReport";

export function systemRoutes(db: Db, options: SystemReportOptions): Router {
  const router = Router();
  router.get("/system", allow("readSystem"), (_req, res) => {
    res.set("cache-control", "no-store").json(systemReport(db, options));
  });
  return router;
}
