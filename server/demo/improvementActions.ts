// The demo's improvement actions (scenario.ts), recorded as the quality lead would record them, with their
// dates moved by whole quarters to the seeded calendar so each stays in step with the story it tells.
import { quarterIndex } from "../../shared/period";
import type { CurrentUser } from "../../shared/schemas/auth";
import { addNote, createAction } from "../actions/service";
import type { Db } from "../db/client";
import type { Timeline } from "./timeline";
import type { DemoScenario } from "./scenario";

/** A date moved by whole quarters, keeping its place in the quarter (the day is kept within the month's length). */
export function shiftByQuarters(date: string, quarters: number): string {
  const [year, month, day] = date.split("-").map(Number);
  const months = year * 12 + (month - 1) + quarters * 3;
  const newYear = Math.floor(months / 12);
  const newMonth = (months % 12) + 1;
  const lastDay = new Date(Date.UTC(newYear, newMonth, 0)).getUTCDate();
  return `${newYear}-${String(newMonth).padStart(2, "0")}-${String(Math.min(day, lastDay)).padStart(2, "0")}`;
}

export function recordDemoActions(db: Db, scenario: DemoScenario, timeline: Timeline, qualityLead: CurrentUser, siteIds: ReadonlyMap<string, number>): void {
  const quarterShift = timeline.shiftQuarter(scenario.refresher.quarter) - quarterIndex(scenario.refresher.quarter);
  const owner = qualityLead.displayName;
  for (const planned of scenario.improvementActions) {
    const action = createAction(db, qualityLead, {
      title: planned.title,
      aim: planned.aim,
      target: planned.target,
      siteId: planned.site === null ? null : (siteIds.get(planned.site) ?? null),
      instructorId: null,
      profile: planned.profile,
      startDate: shiftByQuarters(planned.startDate, quarterShift),
      owner,
      status: planned.status,
    });
    for (const note of planned.notes) addNote(db, qualityLead, action.id, { date: shiftByQuarters(note.date, quarterShift), text: note.text });
  }
}
