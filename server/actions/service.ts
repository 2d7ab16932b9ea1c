// Improvement actions and their dated notes: recording, changing, and who may see which. A coordinator or
// quality lead sees every action; an instructor sees those that concern them — the network's, their site's
// and their own — and only reads them.
import { and, asc, desc, eq, sql } from "drizzle-orm";
import { can } from "../../shared/permissions";
import type { ActionChanges, ActionNote, ActionRow, NewAction, NewActionNote } from "../../shared/schemas/actions";
import type { CurrentUser } from "../../shared/schemas/auth";
import type { Db } from "../db/client";
import { actionNotes, improvementActions, instructors, sites } from "../db/schema";
import { AppError, notFound } from "../errors";

function selectActions(db: Db) {
  return db
    .select({
      id: improvementActions.id,
      title: improvementActions.title,
      aim: improvementActions.aim,
      target: improvementActions.target,
      siteId: improvementActions.siteId,
      siteCode: sites.code,
      instructorId: improvementActions.instructorId,
      instructorCode: instructors.code,
      profile: improvementActions.profile,
      startDate: improvementActions.startDate,
      owner: improvementActions.owner,
      status: improvementActions.status,
      createdAt: improvementActions.createdAt,
      updatedAt: improvementActions.updatedAt,
    })
    .from(improvementActions)
    .leftJoin(sites, eq(improvementActions.siteId, sites.id))
    .leftJoin(instructors, eq(improvementActions.instructorId, instructors.id))
    .$dynamic();
}

/** The site an instructor-scoped action concerns: the instructor's. */
export function siteOfInstructor(db: Db, instructorId: number): number | null {
  return db.select({ siteId: instructors.siteId }).from(instructors).where(eq(instructors.id, instructorId)).get()?.siteId ?? null;
}

/** Whether an action concerns this user: always for network-wide readers, else by scope. */
export function concerns(db: Db, user: CurrentUser, action: Pick<ActionRow, "siteId" | "instructorId">): boolean {
  if (can(user, "readActions", "any")) return true;
  if (!can(user, "readActions")) return false;
  if (action.instructorId !== null) return action.instructorId === user.instructorId;
  if (action.siteId !== null) return user.instructorId !== null && action.siteId === siteOfInstructor(db, user.instructorId);
  return true;
}

/** Every action, newest start first: for the command line, which reads the whole database. */
export function allActions(db: Db): ActionRow[] {
  return selectActions(db).orderBy(desc(improvementActions.startDate), desc(improvementActions.id)).all();
}

/** Actions the user may see, newest start first. */
export function listActions(db: Db, user: CurrentUser): ActionRow[] {
  return allActions(db).filter((row) => concerns(db, user, row));
}

/** One action the user may see; one that does not concern them is answered as missing. */
export function getAction(db: Db, user: CurrentUser, id: number): ActionRow {
  const row = selectActions(db).where(eq(improvementActions.id, id)).get();
  if (!row || !concerns(db, user, row)) throw notFound("The improvement action");
  return row;
}

function invalidScope(path: string, message: string): AppError {
  return new AppError("invalid", 422, "The improvement action is not valid.", [{ path, message }]);
}

function assertScopeExists(db: Db, scope: { siteId?: number | null; instructorId?: number | null }) {
  if (scope.siteId != null && !db.select({ id: sites.id }).from(sites).where(eq(sites.id, scope.siteId)).get()) {
    throw invalidScope("siteId", "No site has this id");
  }
  if (scope.instructorId != null && !db.select({ id: instructors.id }).from(instructors).where(eq(instructors.id, scope.instructorId)).get()) {
    throw invalidScope("instructorId", "No instructor has this id");
  }
}

export function createAction(db: Db, user: CurrentUser, input: NewAction): ActionRow {
  assertScopeExists(db, input);
  const { id } = db
    .insert(improvementActions)
    .values({ ...input, createdBy: user.id })
    .returning({ id: improvementActions.id })
    .get();
  return getAction(db, user, id);
}

export function updateAction(db: Db, user: CurrentUser, id: number, changes: ActionChanges): ActionRow {
  const current = getAction(db, user, id);
  // naming one side of the scope alone would leave a site and an instructor set together
  const scope = {
    siteId: changes.siteId !== undefined ? changes.siteId : changes.instructorId != null ? null : current.siteId,
    instructorId: changes.instructorId !== undefined ? changes.instructorId : changes.siteId != null ? null : current.instructorId,
  };
  assertScopeExists(db, scope);
  db.update(improvementActions)
    .set({ ...changes, ...scope, updatedAt: sql`(strftime('%Y-%m-%dT%H:%M:%fZ', 'now'))` })
    .where(eq(improvementActions.id, id))
    .run();
  return getAction(db, user, id);
}

export function deleteAction(db: Db, user: CurrentUser, id: number): void {
  getAction(db, user, id);
  db.delete(improvementActions).where(eq(improvementActions.id, id)).run();
}

export function listNotes(db: Db, actionId: number): ActionNote[] {
  return db
    .select({ id: actionNotes.id, date: actionNotes.date, text: actionNotes.text, createdAt: actionNotes.createdAt })
    .from(actionNotes)
    .where(eq(actionNotes.actionId, actionId))
    .orderBy(asc(actionNotes.date), asc(actionNotes.id))
    .all();
}

export function addNote(db: Db, user: CurrentUser, actionId: number, note: NewActionNote): ActionNote {
  getAction(db, user, actionId);
  const { id } = db
    .insert(actionNotes)
    .values({ ...note, actionId, createdBy: user.id })
    .returning({ id: actionNotes.id })
    .get();
  return listNotes(db, actionId).find((row) => row.id === id)!;
}

export function deleteNote(db: Db, user: CurrentUser, actionId: number, noteId: number): void {
  getAction(db, user, actionId);
  const removed = db
    .delete(actionNotes)
    .where(and(eq(actionNotes.id, noteId), eq(actionNotes.actionId, actionId)))
    .run();
  if (removed.changes === 0) throw notFound("The note");
}
