// Turns the filters of a request into ids and a period, applying what the viewer may filter on:
// funders see network figures only (no site, instructor or manikin filter); an instructor may name only
// themselves as the instructor and only the manikins the options offer them (their own site's), since the
// released grid judges no others for them. Codes that name nothing are refused with the field named.
import { eq } from "drizzle-orm";
import type { SQLiteColumn } from "drizzle-orm/sqlite-core";
import type { FeedbackMode } from "../../shared/domain";
import type { InsightFilters } from "../../shared/filters";
import { can } from "../../shared/permissions";
import { periodOf, quarterOf, quarterSpan } from "../../shared/period";
import type { Period } from "../../shared/schemas/insight";
import type { PatientType } from "../../shared/scoring/policy";
import type { Db } from "../db/client";
import { instructors, manikins, sites } from "../db/schema";
import { AppError, forbidden } from "../errors";
import { manikinsOffered } from "./options";
import { quartersWithData } from "./quarters";
import type { Viewer } from "./viewer";

/** Longest period a request may ask for: ten years of quarters. */
export const MAX_PERIOD_QUARTERS = 40;

export interface ResolvedFilters {
  period: Period;
  siteId: number | null;
  profile: PatientType | null;
  feedback: FeedbackMode | null;
  instructorId: number | null;
  manikinId: number | null;
}

function invalid(field: string, message: string): AppError {
  return new AppError("invalid", 422, "The filters are not valid.", [{ path: field, message }]);
}

type RefTable = typeof sites | typeof instructors | typeof manikins;

/** A code (or asset id) first, then a numeric id. */
function resolveRef(db: Db, table: RefTable, codeColumn: SQLiteColumn, ref: string, field: string): number {
  const byCode = db.select({ id: table.id }).from(table).where(eq(codeColumn, ref)).get();
  if (byCode) return byCode.id;
  if (/^\d{1,9}$/.test(ref)) {
    const byId = db
      .select({ id: table.id })
      .from(table)
      .where(eq(table.id, Number(ref)))
      .get();
    if (byId) return byId.id;
  }
  throw invalid(field, `Nothing has the code or id "${ref}"`);
}

export function resolvePeriod(db: Db, filters: Pick<InsightFilters, "quarter" | "from" | "to">): Period {
  const known = quartersWithData(db); // newest first
  const latest = known[0] ?? quarterOf(new Date().toISOString().slice(0, 10));
  const earliest = known[known.length - 1] ?? latest;
  let from: string;
  let to: string;
  if (filters.quarter) {
    from = to = filters.quarter;
  } else if (filters.from || filters.to) {
    from = filters.from ?? (earliest < filters.to! ? earliest : filters.to!);
    to = filters.to ?? (latest > from ? latest : from);
  } else {
    from = to = latest;
  }
  if (quarterSpan(from, to) > MAX_PERIOD_QUARTERS) throw invalid("from", `A period may span at most ${MAX_PERIOD_QUARTERS} quarters`);
  return periodOf(from, to);
}

export function resolveFilters(db: Db, filters: InsightFilters, viewer: Viewer): ResolvedFilters {
  if (!can(viewer.user, "readNetwork") && (filters.site || filters.instructor || filters.manikin)) {
    throw forbidden("Funders see network figures only: site, instructor and manikin filters are not available.");
  }
  let instructorId: number | null = null;
  if (filters.instructor) {
    if (viewer.seesEveryone) {
      instructorId = resolveRef(db, instructors, instructors.code, filters.instructor, "instructor");
    } else {
      // an instructor may narrow to themselves only; anything else is refused without saying whether it exists
      const own = viewer.ownInstructorId;
      const ownCode = own === null ? undefined : db.select({ code: instructors.code }).from(instructors).where(eq(instructors.id, own)).get()?.code;
      if (own === null || (filters.instructor !== ownCode && filters.instructor !== String(own))) {
        throw forbidden("You can filter on yourself only.");
      }
      instructorId = own;
    }
  }
  return {
    period: resolvePeriod(db, filters),
    siteId: filters.site ? resolveRef(db, sites, sites.code, filters.site, "site") : null,
    profile: filters.profile ?? null,
    feedback: filters.feedback ?? null,
    instructorId,
    manikinId: filters.manikin ? resolveManikin(db, filters.manikin, viewer) : null,
  };
}

/** A manikin by asset id or id; a viewer who does not see everyone may name only one the options offer them. */
function resolveManikin(db: Db, ref: string, viewer: Viewer): number {
  if (viewer.seesEveryone) return resolveRef(db, manikins, manikins.assetId, ref, "manikin");
  // refused alike whether it exists elsewhere or not at all
  const offered = manikinsOffered(db, viewer).find((m) => m.assetId === ref || String(m.id) === ref);
  if (!offered) throw forbidden("You can filter on the manikins of your own site only.");
  return offered.id;
}

/** Stable text for cache keys. */
export function filtersKey(filters: ResolvedFilters): string {
  const { period, ...rest } = filters;
  return JSON.stringify([period.from, period.to, rest]);
}
