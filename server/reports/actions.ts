// The improvement actions a funder report lists when the coordinator chooses to include them: those started
// by the end of the period, with their aim, scope, start and status in words. The owner is left out (funders
// are not told who does what), and so is any action aimed at one instructor, whose scope or title would point
// at a person. The report names no site, so a site's action reads "One site".
import { quarterDates, quartersOf, type ReportPeriod } from "../../shared/period";
import type { ReportAction } from "../../shared/schemas/report";
import type { ActionRow } from "../../shared/schemas/actions";
import { actionStatusNames, actionWords, aimFigureName, patientTypeNames } from "../../shared/vocabulary";
import { allActions } from "../actions/service";
import type { Db } from "../db/client";

function funderScope(action: ActionRow): string {
  const where = action.siteId === null ? actionWords.network : "One site";
  return action.profile ? `${where} · ${patientTypeNames[action.profile]}` : where;
}

export function reportActions(db: Db, period: ReportPeriod): ReportAction[] {
  const quarters = quartersOf(period);
  const lastDay = quarterDates(quarters[quarters.length - 1]).last;
  return (
    allActions(db)
      .filter((action) => action.instructorId === null && action.startDate <= lastDay)
      // oldest start first, as a story of what was done
      .reverse()
      .map((action) => ({
        title: action.title,
        aim: aimFigureName(action.aim),
        scope: funderScope(action),
        startDate: action.startDate,
        status: actionStatusNames[action.status],
      }))
  );
}
