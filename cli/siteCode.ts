// The --site <code> option several commands take: the site's id, or a usage error naming the unknown code.
import { eq } from "drizzle-orm";
import type { Db } from "../server/db/client";
import { sites } from "../server/db/schema";
import { UsageError } from "./errors";

export function siteIdOfCode(db: Db, code: string | undefined): number | null {
  if (code === undefined) return null;
  const site = db.select({ id: sites.id }).from(sites).where(eq(sites.code, code)).get();
  if (!site) throw new UsageError(`No site has the code "${code}".`, "Use a site code from the Sites page, e.g. --site WRM.");
  return site.id;
}
