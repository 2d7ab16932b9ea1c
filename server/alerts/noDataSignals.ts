// Active sites that sent attempts or class logs in the quarter before the newest quarter with data, but none
// in the newest: a site that has gone quiet, or whose files have not arrived yet.
import { eq, max } from "drizzle-orm";
import { previousQuarter } from "../../shared/period";
import type { Db } from "../db/client";
import { attempts, classes, sites } from "../db/schema";

export interface NoDataSignal {
  key: string;
  siteCode: string;
  /** The newest quarter with data, in which the site has none. */
  quarter: string;
  /** The quarter before it, in which the site had some. */
  previous: string;
}

/** The newest quarter any attempt or class log falls in, or null before any import (both columns are indexed). */
export function newestQuarterWithData(db: Db): string | null {
  const [{ attempt }] = db
    .select({ attempt: max(attempts.quarter) })
    .from(attempts)
    .all();
  const [{ classLog }] = db
    .select({ classLog: max(classes.quarter) })
    .from(classes)
    .all();
  if (attempt === null || classLog === null) return attempt ?? classLog;
  return attempt > classLog ? attempt : classLog;
}

function sitesWithData(db: Db, quarter: string): Set<number> {
  const withAttempts = db.selectDistinct({ siteId: attempts.siteId }).from(attempts).where(eq(attempts.quarter, quarter)).all();
  const withClasses = db.selectDistinct({ siteId: classes.siteId }).from(classes).where(eq(classes.quarter, quarter)).all();
  return new Set([...withAttempts, ...withClasses].map((row) => row.siteId));
}

export function noDataSignals(db: Db): NoDataSignal[] {
  const quarter = newestQuarterWithData(db);
  if (quarter === null) return [];
  const previous = previousQuarter(quarter);
  const before = sitesWithData(db, previous);
  const now = sitesWithData(db, quarter);
  return db
    .select({ id: sites.id, code: sites.code })
    .from(sites)
    .where(eq(sites.active, true))
    .orderBy(sites.code)
    .all()
    .filter((site) => before.has(site.id) && !now.has(site.id))
    .map((site) => ({ key: `no-data:${site.code}:${quarter}`, siteCode: site.code, quarter, previous }));
}
