// Shifts in the monthly measured pass rate of the network and of each active site: the monthly run chart's
// rules (server/metrics/monthlyRunChart.ts, Anhøj & Olesen 2014) over the newest two years with data, kept when
// the run on one side of the median reaches the newest month. A shift is a reason to look, not proof of a cause.
//
// Months are finer than the released grid, and a site's shift may go to that site's instructors, so a month is
// left out of a series unless it would be shown to any one instructor of it: the month's attempts, and those of
// everyone but its busiest instructor, must each form a group the pages would show (shared/suppression.ts,
// isSafeGroup with the network's suppression rule).
import { quarterOf } from "../../shared/period";
import { isSafeGroup, type ReleaseRule } from "../../shared/suppression";
import { median } from "../../shared/stats";
import type { Db } from "../db/client";
import { monthlyCountsBySiteAndInstructor, runChartRules } from "../metrics/monthlyRunChart";
import { currentPolicy } from "../policy/service";
import { listSites } from "../sites/service";

export interface ShiftSignal {
  key: string;
  /** The site's code, or null for the whole network. */
  siteCode: string | null;
  direction: "above" | "below";
  /** The first month (YYYY-MM) of the run that reaches the newest month. */
  since: string;
  /** The newest month of the series. */
  through: string;
  /** Months in that run (months on the median neither break nor count). */
  months: number;
  /** A run longer than this, or fewer crossings than `crossingsLimit`, signals a shift. */
  runLimit: number;
}

/** Two years of months: enough useful points for the rules without judging a network by its distant past. */
const WINDOW_QUARTERS = 8;

interface MonthRate {
  period: string;
  rate: number;
}

type MonthlyRow = ReturnType<typeof monthlyCountsBySiteAndInstructor>[number];

/** The months a reader of this series may learn about, with their measured pass rate. */
export function shownMonths(rows: readonly Pick<MonthlyRow, "period" | "instructorId" | "n" | "x">[], rule: ReleaseRule): MonthRate[] {
  const months = new Map<string, { n: number; x: number; byInstructor: Map<number, number> }>();
  for (const row of rows) {
    const month = months.get(row.period) ?? { n: 0, x: 0, byInstructor: new Map<number, number>() };
    month.n += row.n;
    month.x += row.x;
    // an instructor teaching at two sites is one person in the network's series
    month.byInstructor.set(row.instructorId, (month.byInstructor.get(row.instructorId) ?? 0) + row.n);
    months.set(row.period, month);
  }
  return [...months.entries()]
    .sort(([a], [b]) => a.localeCompare(b))
    .filter(([, month]) => {
      // the fewest others' attempts any reader has: the busiest instructor's view; a reader with none sees them all
      const largest = Math.max(...month.byInstructor.values());
      const instructors = month.byInstructor.size;
      return isSafeGroup(month.n, instructors, rule) && isSafeGroup(month.n - largest, instructors - 1, rule);
    })
    .map(([period, month]) => ({ period, rate: month.x / month.n }));
}

/** The shift that reaches the newest month of a series, or null. */
export function shiftAtEnd(points: readonly MonthRate[]): Omit<ShiftSignal, "key" | "siteCode"> | null {
  const centre = median(points.map((point) => point.rate));
  const rules = runChartRules(
    points.map((point) => point.rate),
    centre,
  );
  if (!rules.signal || centre === null || rules.longestRunLimit === null) return null;
  const useful = points.filter((point) => point.rate !== centre);
  const last = useful[useful.length - 1];
  const side = (point: MonthRate) => point.rate > centre;
  let start = useful.length - 1;
  while (start > 0 && side(useful[start - 1]) === side(last)) start -= 1;
  const months = useful.length - start;
  // the run at the end is long, or the series crosses its median too seldom and ends on one side of it
  const longRun = months > rules.longestRunLimit;
  const fewCrossings = rules.crossingsLimit !== null && rules.crossings < rules.crossingsLimit;
  if (!longRun && !fewCrossings) return null;
  return {
    direction: side(last) ? "above" : "below",
    since: useful[start].period,
    through: points[points.length - 1].period,
    months,
    runLimit: rules.longestRunLimit,
  };
}

/** `quarters`: those with attempts, newest first. */
export function shiftSignals(db: Db, quarters: readonly string[]): ShiftSignal[] {
  if (quarters.length === 0) return [];
  const newest = quarters[0];
  const window = quarters.slice(0, WINDOW_QUARTERS);
  const { suppressionMinCount, suppressionMinInstructors } = currentPolicy(db).policy;
  const rule: ReleaseRule = { minCount: suppressionMinCount, minInstructors: suppressionMinInstructors };
  const scopes: { siteId: number | null; siteCode: string | null }[] = [
    { siteId: null, siteCode: null },
    ...listSites(db)
      .filter((site) => site.active)
      .map((site) => ({ siteId: site.id, siteCode: site.code })),
  ];
  // one read of the window serves the network's series and every site's
  const rows = monthlyCountsBySiteAndInstructor(db, { from: window[window.length - 1], to: newest, siteId: null, instructorId: null, profile: null });
  return scopes.flatMap(({ siteId, siteCode }): ShiftSignal[] => {
    const points = shownMonths(siteId === null ? rows : rows.filter((row) => row.siteId === siteId), rule);
    // a series whose newest shown month lies before the newest quarter says nothing about now
    if (points.length === 0 || quarterOf(`${points[points.length - 1].period}-01`) !== newest) return [];
    const shift = shiftAtEnd(points);
    if (!shift) return [];
    return [{ key: `shift:${siteCode ?? "network"}:${shift.direction}:${shift.since}`, siteCode, ...shift }];
  });
}
