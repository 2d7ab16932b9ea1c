import { Router } from "express";
import { newInstructorSchema, newSiteSchema, updateInstructorSchema, updateSiteSchema } from "../../shared/schemas/sites";
import type { Db } from "../db/client";
import { allow } from "../auth/guard";
import { parseId, parseWith } from "../http/validate";
import { createInstructor, createSite, listInstructors, listSites, updateInstructor, updateSite } from "./service";

export function siteRoutes(db: Db): Router {
  const router = Router();

  router.get("/sites", allow("readDirectory"), (_req, res) => {
    res.json({ sites: listSites(db) });
  });
  router.post("/sites", allow("manageSites"), (req, res) => {
    res.status(201).json({ site: createSite(db, parseWith(newSiteSchema, req.body, "The new site")) });
  });
  router.patch("/sites/:id", allow("manageSites"), (req, res) => {
    res.json({ site: updateSite(db, parseId(req.params.id), parseWith(updateSiteSchema, req.body, "The change")) });
  });

  router.get("/instructors", allow("readDirectory"), (_req, res) => {
    res.json({ instructors: listInstructors(db) });
  });
  router.post("/instructors", allow("manageSites"), (req, res) => {
    res.status(201).json({ instructor: createInstructor(db, parseWith(newInstructorSchema, req.body, "The new instructor")) });
  });
  router.patch("/instructors/:id", allow("manageSites"), (req, res) => {
    const changes = parseWith(updateInstructorSchema, req.body, "The change");
    res.json({ instructor: updateInstructor(db, parseId(req.params.id), changes) });
  });

  return router;
}
