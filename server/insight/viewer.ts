// Who is looking, and therefore which groups they may see in full. Coordinators and quality leads see every
// group. An instructor sees their own rows in full and everyone else's only as aggregates of at least
// policy.suppressionMinCount attempts; a funder sees aggregates of at least that size and nothing else.
import { can, reachOf } from "../../shared/permissions";
import type { CurrentUser } from "../../shared/schemas/auth";
import { hidesOthers, withComplementaryHiding as hideComplements } from "../../shared/suppression";
import type { Db } from "../db/client";
import { currentPolicy } from "../policy/service";
import { cached } from "./cache";

export interface Viewer {
  user: CurrentUser;
  /** Reads every instructor's rows (coordinator, quality lead): nothing suppressed. */
  seesEveryone: boolean;
  /** The instructor whose rows are this user's own (an instructor account's); null for every other account. */
  ownInstructorId: number | null;
  suppressionMinCount: number;
}

export function viewerOf(db: Db, user: CurrentUser): Viewer {
  return {
    user,
    seesEveryone: can(user, "readAttempts", "any"),
    ownInstructorId: reachOf(user.role, "readAttempts") === "own" ? user.instructorId : null,
    suppressionMinCount: cached(db, "suppressionMinCount", () => currentPolicy(db).policy.suppressionMinCount),
  };
}

/** Part of cache keys: answers differ only by role and, for an instructor, by who they are. */
export function viewerKey(viewer: Viewer): string {
  return `${viewer.user.role}:${viewer.ownInstructorId ?? ""}:${viewer.suppressionMinCount}`;
}

/**
 * Whether a group must be hidden from this viewer. `othersN` counts the group's attempts that are not the
 * viewer's own: an instructor knows their own rows, so only the rest protects anyone (a shown total minus
 * their own rows would otherwise reveal a small group of others).
 */
export function hidesGroup(viewer: Viewer, othersN: number): boolean {
  return !viewer.seesEveryone && hidesOthers(othersN, viewer.suppressionMinCount);
}

/** Complementary hiding (shared/suppression) for this viewer; nothing is hidden from those who see everyone. */
export function withComplementaryHiding(viewer: Viewer, othersN: readonly number[], hidden: readonly boolean[]): boolean[] {
  if (viewer.seesEveryone) return [...hidden];
  return hideComplements(othersN, hidden, viewer.suppressionMinCount);
}
