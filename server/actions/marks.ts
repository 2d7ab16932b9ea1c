// Which improvement actions a trend chart shows as dated marks: those the viewer may see whose scope overlaps
// the chart's filters (a network action touches every chart; a site's touches the network's, that site's and
// its instructors' charts; an instructor's touches the network's, their site's and their own) and whose start
// falls in the chart's quarters.
import { quarterOf } from "../../shared/period";
import type { ActionMark, ActionRow } from "../../shared/schemas/actions";
import type { CurrentUser } from "../../shared/schemas/auth";
import type { Db } from "../db/client";
import type { ResolvedFilters } from "../insight/filters";
import { listActions, siteOfInstructor as siteOf } from "./service";

function touches(db: Db, action: ActionRow, chart: ResolvedFilters): boolean {
  if (action.profile !== null && chart.profile !== null && action.profile !== chart.profile) return false;
  const chartSite = chart.siteId ?? (chart.instructorId !== null ? siteOf(db, chart.instructorId) : null);
  if (action.instructorId !== null) {
    if (chart.instructorId !== null) return chart.instructorId === action.instructorId;
    return chartSite === null || chartSite === siteOf(db, action.instructorId);
  }
  if (action.siteId !== null) return chartSite === null || chartSite === action.siteId;
  return true;
}

export function actionMarks(db: Db, user: CurrentUser, chart: ResolvedFilters): ActionMark[] {
  const { from, to } = chart.period;
  return listActions(db, user)
    .map((action) => ({ action, quarter: quarterOf(action.startDate) }))
    .filter(({ action, quarter }) => quarter >= from && quarter <= to && touches(db, action, chart))
    .map(({ action, quarter }) => ({ id: action.id, title: action.title, startDate: action.startDate, quarter }))
    .sort((a, b) => a.startDate.localeCompare(b.startDate));
}
