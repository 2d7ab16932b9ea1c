// An action's scope in words, the same on the pages, in the CLI and in the funder report.
import type { ActionRow } from "./schemas/actions";
import { actionWords, dimensionNames, patientTypeNames } from "./vocabulary";

/** "Whole network", "Site NORTH", "Instructor A1", with " · Infant" when one patient type is chosen. */
export function scopeLabel(action: Pick<ActionRow, "siteCode" | "instructorCode" | "profile">): string {
  const where = action.instructorCode
    ? `${dimensionNames.instructor} ${action.instructorCode}`
    : action.siteCode
      ? `${dimensionNames.site} ${action.siteCode}`
      : actionWords.network;
  return action.profile ? `${where} · ${patientTypeNames[action.profile]}` : where;
}
