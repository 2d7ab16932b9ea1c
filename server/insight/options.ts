// What the filter bar may offer this viewer: quarters with data for everyone; sites, patient types and
// errors for everyone who sees network pages; instructors and manikins for drill-down roles (an instructor
// gets only themselves and their site's manikins; a funder none of these).
import { eq } from "drizzle-orm";
import { feedbackModes } from "../../shared/domain";
import { can } from "../../shared/permissions";
import type { OptionsAnswer } from "../../shared/schemas/insight";
import { patientTypes } from "../../shared/scoring/policy";
import { attemptErrorNames } from "../../shared/scoring/scoreAttempt";
import type { Db } from "../db/client";
import { instructors, manikins, sites } from "../db/schema";
import { quartersWithData } from "./quarters";
import type { Viewer } from "./viewer";
import { errorLabels } from "../../shared/vocabulary";

export function filterOptions(db: Db, viewer: Viewer): OptionsAnswer {
  const quarters = quartersWithData(db);
  if (!can(viewer.user, "readNetwork")) {
    return { quarters, sites: [], patientTypes: [], feedbackModes: [], errors: [], instructors: [], manikins: [] };
  }
  const instructorColumns = { id: instructors.id, code: instructors.code, name: instructors.name, siteId: instructors.siteId };
  const own = viewer.ownInstructorId;
  return {
    quarters,
    sites: db.select({ id: sites.id, code: sites.code, name: sites.name }).from(sites).orderBy(sites.code).all(),
    patientTypes: [...patientTypes],
    feedbackModes: [...feedbackModes],
    errors: attemptErrorNames.map((name) => ({ name, label: errorLabels[name] })),
    instructors: viewer.seesEveryone
      ? db.select(instructorColumns).from(instructors).orderBy(instructors.code).all()
      : own === null
        ? []
        : db.select(instructorColumns).from(instructors).where(eq(instructors.id, own)).all(),
    manikins: manikinsOffered(db, viewer),
  };
}

/** The manikins the filter bar offers this viewer; the filters accept no other (./filters). */
export function manikinsOffered(db: Db, viewer: Viewer): OptionsAnswer["manikins"] {
  const manikinColumns = { id: manikins.id, assetId: manikins.assetId, patientType: manikins.patientType, siteId: manikins.siteId };
  if (viewer.seesEveryone) return db.select(manikinColumns).from(manikins).orderBy(manikins.assetId).all();
  if (!can(viewer.user, "readNetwork") || viewer.user.siteId === null) return [];
  return db.select(manikinColumns).from(manikins).where(eq(manikins.siteId, viewer.user.siteId)).orderBy(manikins.assetId).all();
}
