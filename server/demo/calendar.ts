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
