// Periods as Quarterbeat names them, for server, client and CLI alike:
// - a quarter, "2026-Q3" = July–September 2026. Statistics, reports and imports group by these strings, so
//   they sort correctly as text. People read it as "2026 Q3" (quarterLabel), the one label used everywhere.
// - a year, "2026", which reports cover as its four quarters.
// - a range of quarters { from, to, quarters }, which the insight pages filter on.

export interface Quarter {
  year: number;
  q: 1 | 2 | 3 | 4;
}

/** A run of whole quarters, both ends included, oldest first. */
export interface QuarterRange {
  from: string;
  to: string;
  quarters: string[];
}

export type PeriodKind = "quarter" | "year";

/** A report's period: one quarter or one calendar year. */
export interface ReportPeriod {
  id: string;
  kind: PeriodKind;
  year: number;
  /** 1–4 for a quarter, null for a year */
  quarter: number | null;
}

const QUARTER_RE = /^(\d{4})-Q([1-4])$/;
const YEAR_RE = /^\d{4}$/;
const DATE_RE = /^(\d{4})-(\d{2})-(\d{2})$/;
/** A report period as the API and CLI accept it (after trimming and upper-casing): 2026-Q3 or 2026. */
export const REPORT_PERIOD_RE = /^(20\d\d)(?:-Q([1-4]))?$/;

// ---- quarters -------------------------------------------------------------------------------------------

export function isQuarter(text: string): boolean {
  return QUARTER_RE.test(text);
}

/** "2026-Q3" → { year: 2026, q: 3 }; throws a RangeError naming the expected form. */
export function parseQuarter(text: string): Quarter {
  const match = QUARTER_RE.exec(text);
  if (!match) throw new RangeError(`"${text}" is not a quarter; use the form 2026-Q3`);
  return { year: Number(match[1]), q: Number(match[2]) as Quarter["q"] };
}

export function formatQuarter({ year, q }: Quarter): string {
  return `${String(year).padStart(4, "0")}-Q${q}`;
}

/** A quarter as a running number (year · 4 + quarter − 1), for stepping and counting. */
export function quarterIndex(quarter: string): number {
  const { year, q } = parseQuarter(quarter);
  return year * 4 + q - 1;
}

export function quarterAtIndex(index: number): string {
  return formatQuarter({ year: Math.floor(index / 4), q: ((index % 4) + 1) as Quarter["q"] });
}

/** The quarter of a calendar date "YYYY-MM-DD" (only the year and month are read). */
export function quarterOf(date: string): string {
  const match = DATE_RE.exec(date);
  if (!match) throw new RangeError(`"${date}" is not a date; use the form 2026-07-14`);
  const month = Number(match[2]);
  if (month < 1 || month > 12) throw new RangeError(`"${date}" has no month ${match[2]}`);
  return `${match[1]}-Q${Math.ceil(month / 3)}`;
}

/** The first quarter that begins on or after a date: the first whole quarter after a change made that day. */
export function firstQuarterFrom(date: string): string {
  const quarter = quarterOf(date);
  return quarterDates(quarter).first === date ? quarter : nextQuarter(quarter);
}

/** The quarter a moment falls in on the local calendar (the viewer's own "today"). */
export function quarterOfLocalDate(date: Date): string {
  return formatQuarter({ year: date.getFullYear(), q: (Math.floor(date.getMonth() / 3) + 1) as Quarter["q"] });
}

/** The quarter `by` quarters later (earlier when negative). */
export function shiftQuarter(quarter: string, by: number): string {
  return quarterAtIndex(quarterIndex(quarter) + by);
}

export function previousQuarter(quarter: string): string {
  return shiftQuarter(quarter, -1);
}

export function nextQuarter(quarter: string): string {
  return shiftQuarter(quarter, 1);
}

export function sameQuarterLastYear(quarter: string): string {
  return shiftQuarter(quarter, -4);
}

/** Every quarter from `from` to `to`, both included, oldest first; empty when `from` is after `to`. */
export function quartersBetween(from: string, to: string): string[] {
  const first = quarterIndex(from);
  const last = quarterIndex(to);
  const list: string[] = [];
  for (let index = first; index <= last; index++) list.push(quarterAtIndex(index));
  return list;
}

/** How many quarters `from` to `to` spans, both included (0 or less when `from` is after `to`). */
export function quarterSpan(from: string, to: string): number {
  return quarterIndex(to) - quarterIndex(from) + 1;
}

/** First and last day of a quarter, "YYYY-MM-DD". */
export function quarterDates(quarter: string): { first: string; last: string } {
  const { year, q } = parseQuarter(quarter);
  const firstMonth = (q - 1) * 3 + 1;
  const lastMonth = firstMonth + 2;
  const lastDay = new Date(Date.UTC(year, lastMonth, 0)).getUTCDate();
  const pad = (n: number) => String(n).padStart(2, "0");
  return { first: `${year}-${pad(firstMonth)}-01`, last: `${year}-${pad(lastMonth)}-${pad(lastDay)}` };
}

// ---- labels ---------------------------------------------------------------------------------------------

/** "2026-Q3" → "2026 Q3", how people say it. */
export function quarterLabel(quarter: string): string {
  return quarter.replace("-", " ");
}

/** "2026 Q3" for a single quarter, "2025 Q4 to 2026 Q3" for a longer range. */
export function rangeLabel(range: Pick<QuarterRange, "from" | "to">): string {
  return range.from === range.to ? quarterLabel(range.from) : `${quarterLabel(range.from)} to ${quarterLabel(range.to)}`;
}

/** A report period's name: "2026 Q3", or "2026 (whole year)". */
export function periodLabel(period: string): string {
  return isQuarter(period) ? quarterLabel(period) : `${period} (whole year)`;
}

const MONTH_SPANS = ["January–March", "April–June", "July–September", "October–December"];

/** The months a report period covers, for the report's prose: "July–September 2026", "January–December 2026". */
export function periodMonths(period: ReportPeriod): string {
  return period.quarter ? `${MONTH_SPANS[period.quarter - 1]} ${period.year}` : `January–December ${period.year}`;
}

// ---- years and report periods ---------------------------------------------------------------------------

export function isYear(text: string): boolean {
  return YEAR_RE.test(text);
}

/** Years that have at least one of the quarters, newest first. */
export function yearsOf(quarters: readonly string[]): string[] {
  return [...new Set(quarters.map((q) => q.slice(0, 4)))].sort().reverse();
}

export function periodKindOf(period: string): PeriodKind {
  return isYear(period) ? "year" : "quarter";
}

/** A report period from text such as "2026-Q3", " 2026-q3 " or "2026"; null when it names neither. */
export function parsePeriod(text: string): ReportPeriod | null {
  const match = REPORT_PERIOD_RE.exec(text.trim().toUpperCase());
  if (!match) return null;
  const year = Number(match[1]);
  return match[2] ? { id: `${match[1]}-Q${match[2]}`, kind: "quarter", year, quarter: Number(match[2]) } : { id: match[1], kind: "year", year, quarter: null };
}

function quarterPeriod(quarter: string): ReportPeriod {
  const { year, q } = parseQuarter(quarter);
  return { id: quarter, kind: "quarter", year, quarter: q };
}

function yearPeriod(year: number): ReportPeriod {
  return { id: String(year), kind: "year", year, quarter: null };
}

/** The quarters a period covers, oldest first. */
export function quartersOf(period: ReportPeriod): string[] {
  return period.kind === "quarter" ? [period.id] : quartersBetween(`${period.year}-Q1`, `${period.year}-Q4`);
}

/** The `count` quarters ending with the period's last quarter, oldest first. */
export function trailingQuarters(period: ReportPeriod, count: number): string[] {
  const covered = quartersOf(period);
  const last = covered[covered.length - 1];
  return quartersBetween(shiftQuarter(last, -(count - 1)), last);
}

/** The periods a report compares with: previous quarter and same quarter a year earlier, or the previous year. */
export function comparisonPeriods(period: ReportPeriod): { label: string; period: ReportPeriod }[] {
  if (period.kind === "year") return [{ label: "the previous year", period: yearPeriod(period.year - 1) }];
  return [
    { label: "the previous quarter", period: quarterPeriod(previousQuarter(period.id)) },
    { label: "the same quarter last year", period: quarterPeriod(sameQuarterLastYear(period.id)) },
  ];
}

/** True while the period has not ended on the viewer's calendar: its figures can still change. */
export function periodIsRunning(period: string, today: Date = new Date()): boolean {
  const running = quarterOfLocalDate(today);
  return periodKindOf(period) === "year" ? period === running.slice(0, 4) : period === running;
}

/**
 * The period a report page opens on: the newest quarter that has ended (the running one is still filling
 * up), or the newest quarter of all when only the running one has data.
 */
export function defaultPeriod(quarters: readonly string[], today: Date = new Date()): string | null {
  const running = quarterOfLocalDate(today);
  const sorted = [...quarters].sort().reverse();
  return sorted.find((q) => q < running) ?? sorted[0] ?? null;
}

// ---- ranges ---------------------------------------------------------------------------------------------

export function periodOf(from: string, to: string): QuarterRange {
  return { from, to, quarters: quartersBetween(from, to) };
}

/** The range of the same length just before `range` (the quarter before a single quarter). */
export function previousPeriod(range: QuarterRange): QuarterRange {
  return periodOf(shiftQuarter(range.from, -range.quarters.length), previousQuarter(range.from));
}

/** The quarters a trend shows: every quarter of a range, or the last `count` quarters up to a single quarter. */
export function trendQuarters(range: QuarterRange, count = 8): QuarterRange {
  return range.quarters.length > 1 ? range : periodOf(shiftQuarter(range.to, -(count - 1)), range.to);
}
