// The released grid for viewers who do not see everyone (instructors, funders): which answers they may be
// shown, decided once per database state over one grid of cells (shared/suppression, releaseGrid), so that no
// two shown answers can be subtracted to reveal a small group (docs/decisions/006-disclosure-control.md).
import { can } from "../../shared/permissions";
import { releaseGrid, releaseShows, wholeGroupShown, type GridCell, type Release, type ReleaseRule } from "../../shared/suppression";
import type { Db } from "../db/client";
import { countsByQuarterAndInstructor, instructorCellCounts, quartersWithAttempts, type Dimension, type SummaryScope } from "../metrics/summaries";
import { cached } from "./cache";
import type { Viewer } from "./viewer";

/**
 * The grid: every dimension the pages let these viewers narrow a network figure by. A page that offers them
 * a new dimension adds it here (and to `selects`), or its answers would split cells the grid never judged.
 */
const GRID = ["quarter", "siteId", "profile", "feedback", "manikinId"] as const satisfies readonly Dimension[];

/**
 * Where unsafe cells are pooled, finest first (indices into GRID): the manikins of one cell, then the sites
 * of one quarter, patient type and display (so network-wide breakdowns stay whole), then the patient types
 * of one quarter and display, then the quarter. Pools never span quarters: what a quarter cannot protect is
 * withheld, so every other quarter stays shown on its own and only ranges that take the withheld cells hide.
 */
export const LEVELS: readonly (readonly number[])[] = [[0, 1, 2, 3], [0, 2, 3], [0, 3], [0]];

/** What a figure counts: attempts, or the attempts that carry an instructor's result (the agreement table). */
export type ReleaseMeasure = "attempts" | "judged";

/** Grid dimensions a viewer's filters cannot name; a funder has no site or manikin filter. */
const SITE = 1;
const MANIKIN = 4;
const WHOLE = "*";

/**
 * Whether the viewer may narrow by site and manikin. Without those filters their grid is coarser (every
 * site and manikin of a cell as one), so fewer cells are small and fewer figures hide.
 */
function narrowsBySite(viewer: Viewer): boolean {
  return can(viewer.user, "readNetwork");
}

/**
 * The release of one quarter's cells. Every level of LEVELS keeps the quarter, so pools never span quarters and
 * each quarter's release is decided from its own cells alone: an answer reads the quarters it covers, not the grid.
 */
function releaseFor(db: Db, viewer: Viewer, measure: ReleaseMeasure, quarter: string): Release {
  const own = viewer.ownInstructorId;
  const rule = ruleOf(viewer);
  const bySite = narrowsBySite(viewer);
  return cached(db, `release|${quarter}|${measure}|${own ?? ""}|${bySite}|${rule.minCount}|${rule.minInstructors}`, () => {
    const cells = new Map<string, { coords: (string | number)[]; others: Map<number, number> }>();
    for (const row of instructorCellCounts(db, quarter)) {
      const coords = GRID.map((dimension) => row[dimension]);
      if (!bySite) coords[SITE] = coords[MANIKIN] = WHOLE;
      const instructorId = row.instructorId;
      const key = coords.join("|");
      let cell = cells.get(key);
      if (!cell) cells.set(key, (cell = { coords, others: new Map() }));
      const count = measure === "attempts" ? row.n : row.judged;
      // the viewer's own attempts protect nobody: they know them
      if (instructorId !== own && count > 0) cell.others.set(instructorId, (cell.others.get(instructorId) ?? 0) + count);
    }
    return releaseGrid([...cells.values()] as GridCell[], LEVELS, rule);
  });
}

function ruleOf(viewer: Viewer): ReleaseRule {
  return { minCount: viewer.suppressionMinCount, minInstructors: viewer.suppressionMinInstructors };
}

/** Whether a scope takes every cell of the quarters it covers (it names no site, patient type, display or manikin). */
function takesWholeQuarters(scope: SummaryScope): boolean {
  return scope.siteId === null && scope.profile === null && scope.feedback === null && scope.manikinId === null;
}

/**
 * Whether every quarter of a scope that takes whole quarters is shown: each quarter is a group of the last
 * level, so it is shown exactly when others' attempts in it form a safe group (wholeGroupShown), read from each
 * instructor's attempts (or judged attempts) per quarter instead of judging each quarter's grid.
 */
function wholeQuartersShown(db: Db, viewer: Viewer, scope: SummaryScope, measure: ReleaseMeasure, quarters: readonly string[]): boolean {
  const others = new Map<string, { attempts: number; instructors: number }>();
  for (const { quarter, instructorId, count } of countsByQuarterAndInstructor(db, scope.from, scope.to, measure)) {
    if (instructorId === viewer.ownInstructorId) continue;
    const sum = others.get(quarter) ?? { attempts: 0, instructors: 0 };
    sum.attempts += count;
    sum.instructors += 1;
    others.set(quarter, sum);
  }
  const rule = ruleOf(viewer);
  return quarters.every((quarter) => {
    const { attempts, instructors } = others.get(quarter) ?? { attempts: 0, instructors: 0 };
    return wholeGroupShown(attempts, instructors, rule);
  });
}

/** The grid cells a scope takes (coordinates in GRID order). */
function selects(scope: SummaryScope) {
  return ([quarter, siteId, profile, feedback, manikinId]: readonly (string | number)[]) =>
    quarter >= scope.from &&
    quarter <= scope.to &&
    (scope.siteId === null || siteId === scope.siteId) &&
    (scope.profile === null || profile === scope.profile) &&
    (scope.feedback === null || feedback === scope.feedback) &&
    (scope.manikinId === null || manikinId === scope.manikinId);
}

/**
 * Whether the viewer may see a figure over `scope`. Those who see everyone always may; an instructor always
 * sees their own attempts alone; anyone else only an answer that takes every pool of the grid whole.
 */
export function mayShow(db: Db, viewer: Viewer, scope: SummaryScope, measure: ReleaseMeasure = "attempts"): boolean {
  if (viewer.seesEveryone) return true;
  if (scope.instructorId !== null) return scope.instructorId === viewer.ownInstructorId;
  // a filter the viewer's grid does not hold is never theirs (the filters refuse it before this)
  if (!narrowsBySite(viewer) && (scope.siteId !== null || scope.manikinId !== null)) return false;
  const quarters = quartersWithAttempts(db).filter((quarter) => quarter >= scope.from && quarter <= scope.to);
  if (takesWholeQuarters(scope)) return wholeQuartersShown(db, viewer, scope, measure, quarters);
  const shows = selects(scope);
  return quarters.every((quarter) => releaseShows(releaseFor(db, viewer, measure, quarter), shows));
}
