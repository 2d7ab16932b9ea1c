// Report periods on the page: a quarter ("2026-Q3") or a whole year ("2026"), chosen from the quarters that
// have data.

export type PeriodKind = "quarter" | "year";

export function periodKindOf(period: string): PeriodKind {
  return /^\d{4}$/.test(period) ? "year" : "quarter";
}

/** The quarter a date falls in, e.g. 2026-12-01 → "2026-Q4". */
export function quarterOfDate(date: Date): string {
  return `${date.getFullYear()}-Q${Math.floor(date.getMonth() / 3) + 1}`;
}

/** Years that have at least one quarter with data, newest first. */
export function yearsOf(quarters: readonly string[]): string[] {
  return [...new Set(quarters.map((q) => q.slice(0, 4)))].sort().reverse();
}

/**
 * The period the page opens on: the newest quarter that has ended (the running one is still filling up),
 * or the newest quarter of all when only the running one has data.
 */
export function defaultPeriod(quarters: readonly string[], today: Date = new Date()): string | null {
  const running = quarterOfDate(today);
  const sorted = [...quarters].sort().reverse();
  return sorted.find((q) => q < running) ?? sorted[0] ?? null;
}

/** "2026-Q3" → "Q3 2026"; "2026" → "2026 (whole year)". */
export function periodName(period: string): string {
  const match = /^(\d{4})-Q([1-4])$/.exec(period);
  if (match) return `Q${match[2]} ${match[1]}`;
  return `${period} (whole year)`;
}

/** True while the period has not ended: its figures can still change. */
export function periodIsRunning(period: string, today: Date = new Date()): boolean {
  const running = quarterOfDate(today);
  return periodKindOf(period) === "year" ? period === running.slice(0, 4) : period === running;
}
