// An action's aim by month in its scope, split at its start: the run chart of the action detail page. Months
// are finer than the grid instructors' figures are released in (server/insight/release.ts), so only readers
// of every instructor's rows see the chart, and an instructor sees it for an action on their own attempts.
import type { ActionRow } from "../../shared/schemas/actions";
import type { MonthlyRunChart } from "../../shared/schemas/runChart";
import type { Db } from "../db/client";
import type { Viewer } from "../insight/viewer";
import { monthlyRunChart } from "../metrics/monthlyRunChart";
import { evaluationWindow } from "./evaluation";

export function actionMonthlyChart(db: Db, viewer: Viewer, action: ActionRow): MonthlyRunChart | null {
  const ownScope = viewer.ownInstructorId !== null && action.instructorId === viewer.ownInstructorId;
  if (!viewer.seesEveryone && !ownScope) return null;
  const { from, to } = evaluationWindow(db, action.startDate);
  return monthlyRunChart(
    db,
    { from, to, siteId: action.siteId, instructorId: action.instructorId, profile: action.profile, aim: action.aim },
    { splitAt: action.startDate },
  );
}
