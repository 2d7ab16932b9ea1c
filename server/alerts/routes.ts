// The alerts after each import, for the reader: their choice of kinds (GET and PUT /api/me/alerts), the signals
// mailed to them (GET /api/alerts) and, for a coordinator, every user's (GET /api/alerts/all).
import { Router } from "express";
import { alertChoiceSchema } from "../../shared/schemas/alerts";
import type { Db } from "../db/client";
import { allow, signedInUser } from "../auth/guard";
import { parseWith } from "../http/validate";
import { alertChoice, saveAlertChoice } from "./choice";
import { allAlerts, myAlerts } from "./history";

export function alertRoutes(db: Db): Router {
  const router = Router();

  router.get("/me/alerts", allow("receiveImportAlerts"), (req, res) => {
    res.json(alertChoice(db, signedInUser(req)));
  });

  router.put("/me/alerts", allow("receiveImportAlerts"), (req, res) => {
    const { kinds } = parseWith(alertChoiceSchema, req.body, "The alert choice");
    res.json(saveAlertChoice(db, signedInUser(req), kinds));
  });

  router.get("/alerts", allow("receiveImportAlerts"), (req, res) => {
    res.json(myAlerts(db, signedInUser(req).id));
  });

  router.get("/alerts/all", allow("readAllAlerts"), (_req, res) => {
    res.json(allAlerts(db));
  });

  return router;
}
