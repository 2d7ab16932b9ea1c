// The demo's calendar for a given "today": the quarters of history, the last day a class can have, and how
// the scenario's dates (written for its reference day) move to this calendar.
import { quarterAtIndex, quarterDates, quarterIndex, quarterOf } from "../../shared/period";
import { addDays, daysBetween, parseDay } from "./calendar";

export interface Timeline {
  today: string;
  /** Classes run up to yesterday: a class today could carry start times still ahead of the clock. */
  lastClassDay: string;
  /** Quarter indexes (shared/period.ts quarterIndex) from oldest to the current quarter. */
  quarters: number[];
  firstDay: string;
  /** A scenario date moved to this calendar. */
  shiftDate(referenceDate: string): string;
  /** A scenario quarter ("2026-Q1") moved to this calendar, as a quarter index. */
  shiftQuarter(referenceQuarter: string): number;
}

export function buildTimeline(today: string, referenceToday: string, historyQuarters: number): Timeline {
  parseDay(today); // validates
  const dayShift = daysBetween(referenceToday, today);
  const current = quarterIndex(quarterOf(today));
  const quarterShift = current - quarterIndex(quarterOf(referenceToday));
  const quarters = Array.from({ length: historyQuarters }, (_, i) => current - historyQuarters + 1 + i);
  return {
    today,
    lastClassDay: addDays(today, -1),
    quarters,
    firstDay: quarterDates(quarterAtIndex(quarters[0])).first,
    shiftDate: (referenceDate) => addDays(referenceDate, dayShift),
    shiftQuarter: (referenceQuarter) => quarterIndex(referenceQuarter) + quarterShift,
  };
}
