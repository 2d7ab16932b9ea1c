// Sites and instructors of the network: the admin pages, the CLI and the importers share these.
import { eq, sql } from "drizzle-orm";
import type { InstructorRow, NewSite, SiteRow } from "../../shared/schemas/sites";
import type { Db } from "../db/client";
import { instructors, sites } from "../db/schema";
import { conflict, notFound } from "../errors";

export function listSites(db: Db): SiteRow[] {
  return db
    .select({
      id: sites.id,
      code: sites.code,
      name: sites.name,
      active: sites.active,
      // qualified names: inside the subquery a bare `id` would mean the inner table's id
      instructors: sql<number>`(SELECT count(*) FROM instructors i WHERE i.site_id = sites.id)`,
      manikins: sql<number>`(SELECT count(*) FROM manikins m WHERE m.site_id = sites.id)`,
    })
    .from(sites)
    .orderBy(sites.code)
    .all();
}

export function createSite(db: Db, input: NewSite): SiteRow {
  if (db.select().from(sites).where(eq(sites.code, input.code)).get()) {
    throw conflict(`A site with the code ${input.code} already exists.`, [{ path: "code", message: "Already in use" }]);
  }
  const { id } = db.insert(sites).values(input).returning({ id: sites.id }).get();
  return listSites(db).find((s) => s.id === id)!;
}

export function updateSite(db: Db, id: number, changes: { name?: string; active?: boolean }): SiteRow {
  // an empty change leaves the row as it is (an UPDATE with nothing to set is an error in Drizzle)
  if (Object.keys(changes).length > 0) db.update(sites).set(changes).where(eq(sites.id, id)).run();
  const site = listSites(db).find((s) => s.id === id);
  if (!site) throw notFound("The site");
  return site;
}

export function listInstructors(db: Db): InstructorRow[] {
  return db
    .select({
      id: instructors.id,
      code: instructors.code,
      name: instructors.name,
      siteId: instructors.siteId,
      siteCode: sites.code,
      active: instructors.active,
    })
    .from(instructors)
    .leftJoin(sites, eq(instructors.siteId, sites.id))
    .orderBy(instructors.code)
    .all();
}

function assertSiteExists(db: Db, siteId: number | null | undefined) {
  if (siteId == null) return;
  if (!db.select({ id: sites.id }).from(sites).where(eq(sites.id, siteId)).get()) throw notFound("The site");
}

export function createInstructor(db: Db, input: { code: string; name: string; siteId: number | null }): InstructorRow {
  if (db.select().from(instructors).where(eq(instructors.code, input.code)).get()) {
    throw conflict(`An instructor with the code ${input.code} already exists.`, [{ path: "code", message: "Already in use" }]);
  }
  assertSiteExists(db, input.siteId);
  const { id } = db.insert(instructors).values(input).returning({ id: instructors.id }).get();
  return listInstructors(db).find((i) => i.id === id)!;
}

export function updateInstructor(db: Db, id: number, changes: { name?: string; siteId?: number | null; active?: boolean }): InstructorRow {
  assertSiteExists(db, changes.siteId);
  if (Object.keys(changes).length > 0) db.update(instructors).set(changes).where(eq(instructors.id, id)).run();
  const instructor = listInstructors(db).find((i) => i.id === id);
  if (!instructor) throw notFound("The instructor");
  return instructor;
}
