// Who is looking, and therefore which groups they may see in full. Coordinators and quality leads see every
// group. An instructor sees their own rows in full and everyone else's only as the released grid allows
// (./release: groups of at least policy.suppressionMinCount attempts from at least
// policy.suppressionMinInstructors other instructors, judged over every answer at once); a funder likewise.
import { can, reachOf } from "../../shared/permissions";
import type { CurrentUser } from "../../shared/schemas/auth";
import { hidesOthers } from "../../shared/suppression";
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
  suppressionMinInstructors: number;
}

export function viewerOf(db: Db, user: CurrentUser): Viewer {
  return {
    user,
    seesEveryone: can(user, "readAttempts", "any"),
    ownInstructorId: reachOf(user.role, "readAttempts") === "own" ? user.instructorId : null,
    ...cached(db, "suppressionRule", () => {
      const { suppressionMinCount, suppressionMinInstructors } = currentPolicy(db).policy;
      return { suppressionMinCount, suppressionMinInstructors };
    }),
  };
}

/** Part of cache keys: answers differ only by role and, for an instructor, by who they are. */
export function viewerKey(viewer: Viewer): string {
  return `${viewer.user.role}:${viewer.ownInstructorId ?? ""}:${viewer.suppressionMinCount}:${viewer.suppressionMinInstructors}`;
}

/**
 * The primary rule alone, for counts that are not attempts of the grid (learners, class logs): hidden when
 * `othersN`, the group's count not the viewer's own, holds some but fewer than the threshold.
 */
export function hidesGroup(viewer: Viewer, othersN: number): boolean {
  return !viewer.seesEveryone && hidesOthers(othersN, viewer.suppressionMinCount);
}
