// Calendar arithmetic on plain YYYY-MM-DD strings in UTC, so the generator never depends on the machine's
// time zone.

const DAY_MS = 86_400_000;

export function parseDay(date: string): number {
  if (!/^\d{4}-\d{2}-\d{2}$/.test(date)) throw new RangeError(`Expected a date as YYYY-MM-DD, got "${date}"`);
  const ms = Date.parse(`${date}T00:00:00Z`);
  if (Number.isNaN(ms) || formatDay(ms) !== date) throw new RangeError(`"${date}" is not a calendar date`);
  return ms;
}

export function formatDay(ms: number): string {
  return new Date(ms).toISOString().slice(0, 10);
}

export function addDays(date: string, days: number): string {
  return formatDay(parseDay(date) + days * DAY_MS);
}

export function daysBetween(from: string, to: string): number {
  return Math.round((parseDay(to) - parseDay(from)) / DAY_MS);
}

/** 0 = Sunday … 6 = Saturday. */
export function weekday(date: string): number {
  return new Date(parseDay(date)).getUTCDay();
}

/** A quarter as a running number (year · 4 + quarter − 1), which makes stepping and comparing simple. */
export function quarterIndexOf(date: string): number {
  const year = Number(date.slice(0, 4));
  const month = Number(date.slice(5, 7));
  return year * 4 + Math.floor((month - 1) / 3);
}

/** "2026-Q3" */
export function quarterLabel(index: number): string {
  return `${Math.floor(index / 4)}-Q${(index % 4) + 1}`;
}

export function quarterIndexFromLabel(label: string): number {
  const match = /^(\d{4})-Q([1-4])$/.exec(label);
  if (!match) throw new RangeError(`Expected a quarter such as 2026-Q1, got "${label}"`);
  return Number(match[1]) * 4 + Number(match[2]) - 1;
}

export function quarterStart(index: number): string {
  const year = Math.floor(index / 4);
  const month = (index % 4) * 3 + 1;
  return `${year}-${String(month).padStart(2, "0")}-01`;
}

/** Last day of the quarter. */
export function quarterEnd(index: number): string {
  return addDays(quarterStart(index + 1), -1);
}
