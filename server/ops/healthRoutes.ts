// Public health routes: mounted before sign-in and CSRF so that monitors and load balancers need no session.
import { Router } from "express";
import type { Db } from "../db/client";
import { readHealth, readiness } from "./health";

export function healthRoutes(db: Db, startedAt = Date.now()): Router {
  const router = Router();
  // Liveness: the process answers. It reports the database's state but stays 200, so that a monitor restarting
  // unhealthy processes does not restart a server whose only trouble is the disk; readiness is the gate.
  router.get("/health", (_req, res) => {
    res.set("cache-control", "no-store").json(readHealth(db, startedAt));
  });
  router.get("/health/ready", (_req, res) => {
    const health = readHealth(db, startedAt);
    const { ready, reason } = readiness(health);
    res
      .set("cache-control", "no-store")
      .status(ready ? 200 : 503)
      .json({ ready, reason, ...health });
  });
  return router;
}
