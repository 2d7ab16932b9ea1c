// Who is looking, and therefore which groups they may see in full. Coordinators and quality leads see every
// group. An instructor sees their own rows in full and everyone else's only as aggregates of at least
// policy.suppressionMinCount attempts; a funder sees aggregates of at least that size and nothing else.
import type { CurrentUser } from "../../shared/schemas/auth";
import type { Db } from "../db/client";
import { currentPolicy } from "../policy/service";
import { cached } from "./cache";

export interface Viewer {
  user: CurrentUser;
  /** Coordinator or quality lead: every row, no suppression. */
  seesEveryone: boolean;
  /** The instructor an instructor account is linked to; null for every other account. */
  ownInstructorId: number | null;
  suppressionMinCount: number;
}

export function viewerOf(db: Db, user: CurrentUser): Viewer {
  return {
    user,
    seesEveryone: user.role === "coordinator" || user.role === "quality_lead",
    ownInstructorId: user.role === "instructor" ? user.instructorId : null,
    suppressionMinCount: cached(db, "suppressionMinCount", () => currentPolicy(db).policy.suppressionMinCount),
  };
}

/** Part of cache keys: answers differ only by role and, for an instructor, by who they are. */
export function viewerKey(viewer: Viewer): string {
  return `${viewer.user.role}:${viewer.ownInstructorId ?? ""}:${viewer.suppressionMinCount}`;
}

/**
 * Whether a group of n attempts must be hidden from this viewer (an empty group reveals nothing and is shown). `ownRowsOnly` says the group holds nothing
 * but the viewer's own rows (an instructor filtering on themselves), which they always see in full.
 */
export function hidesGroup(viewer: Viewer, n: number, ownRowsOnly = false): boolean {
  if (viewer.seesEveryone || ownRowsOnly) return false;
  return n > 0 && n < viewer.suppressionMinCount;
}
