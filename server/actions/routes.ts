// Improvement actions: list, read with evaluation, record and change (quality leads and coordinators),
// dated notes, and the marks trend charts draw.
import { Router } from "express";
import { insightFiltersSchema } from "../../shared/filters";
import { can } from "../../shared/permissions";
import { newActionNoteSchema, newActionSchema, updateActionSchema } from "../../shared/schemas/actions";
import type { Db } from "../db/client";
import { allow, signedInUser } from "../auth/guard";
import { parseId, parseWith } from "../http/validate";
import { resolveFilters } from "../insight/filters";
import { viewerOf } from "../insight/viewer";
import { withVerdicts } from "./actionList";
import { evaluationFor } from "./evaluation";
import { actionMarks } from "./marks";
import { actionMonthlyChart } from "./monthly";
import { addNote, createAction, deleteAction, deleteNote, getAction, listActions, listNotes, updateAction } from "./service";

export function actionRoutes(db: Db): Router {
  const router = Router();

  router.get("/actions", allow("readActions"), (req, res) => {
    const user = signedInUser(req);
    const viewer = viewerOf(db, user);
    res.json({ actions: withVerdicts(listActions(db, user), (action) => evaluationFor(db, viewer, action)), mayManage: can(user, "manageActions") });
  });

  // before /actions/:id, so "marks" is not taken for an id
  router.get("/actions/marks", allow("readActions"), (req, res) => {
    const user = signedInUser(req);
    const filters = resolveFilters(db, parseWith(insightFiltersSchema, req.query, "The filters"), viewerOf(db, user));
    res.json({ marks: actionMarks(db, user, filters) });
  });

  router.get("/actions/:id", allow("readActions"), (req, res) => {
    const user = signedInUser(req);
    const action = getAction(db, user, parseId(req.params.id));
    res.json({ action, notes: listNotes(db, action.id), evaluation: evaluationFor(db, viewerOf(db, user), action), mayManage: can(user, "manageActions") });
  });

  router.get("/actions/:id/monthly", allow("readActions"), (req, res) => {
    const user = signedInUser(req);
    const action = getAction(db, user, parseId(req.params.id));
    res.json({ chart: actionMonthlyChart(db, viewerOf(db, user), action) });
  });

  router.post("/actions", allow("manageActions"), (req, res) => {
    res.status(201).json({ action: createAction(db, signedInUser(req), parseWith(newActionSchema, req.body, "The improvement action")) });
  });

  router.patch("/actions/:id", allow("manageActions"), (req, res) => {
    const id = parseId(req.params.id);
    res.json({ action: updateAction(db, signedInUser(req), id, parseWith(updateActionSchema, req.body, "The change")) });
  });

  router.delete("/actions/:id", allow("manageActions"), (req, res) => {
    deleteAction(db, signedInUser(req), parseId(req.params.id));
    res.status(204).end();
  });

  router.post("/actions/:id/notes", allow("manageActions"), (req, res) => {
    const id = parseId(req.params.id);
    res.status(201).json({ note: addNote(db, signedInUser(req), id, parseWith(newActionNoteSchema, req.body, "The note")) });
  });

  router.delete("/actions/:id/notes/:noteId", allow("manageActions"), (req, res) => {
    deleteNote(db, signedInUser(req), parseId(req.params.id), parseId(req.params.noteId));
    res.status(204).end();
  });

  return router;
}
