// Calendar quarters as Quarterbeat names them: "2026-Q3" = July–September 2026. Statistics, reports and
// imports all group by these strings, so they sort correctly as text.

export interface Quarter {
  year: number;
  q: 1 | 2 | 3 | 4;
}

const QUARTER_RE = /^(\d{4})-Q([1-4])$/;
const DATE_RE = /^(\d{4})-(\d{2})-(\d{2})$/;

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

/** The quarter of a calendar date "YYYY-MM-DD" (only the year and month are read). */
export function quarterOf(date: string): string {
  const match = DATE_RE.exec(date);
  if (!match) throw new RangeError(`"${date}" is not a date; use the form 2026-07-14`);
  const month = Number(match[2]);
  if (month < 1 || month > 12) throw new RangeError(`"${date}" has no month ${match[2]}`);
  return `${match[1]}-Q${Math.ceil(month / 3)}`;
}

function shift(quarter: string, quarters: number): string {
  const { year, q } = parseQuarter(quarter);
  const index = year * 4 + (q - 1) + quarters;
  return formatQuarter({ year: Math.floor(index / 4), q: ((index % 4) + 1) as Quarter["q"] });
}

export function previousQuarter(quarter: string): string {
  return shift(quarter, -1);
}

export function nextQuarter(quarter: string): string {
  return shift(quarter, 1);
}

export function sameQuarterLastYear(quarter: string): string {
  return shift(quarter, -4);
}

/** Every quarter from `from` to `to`, both included, oldest first; empty when `from` is after `to`. */
export function quartersBetween(from: string, to: string): string[] {
  const list: string[] = [];
  for (let current = formatQuarter(parseQuarter(from)); current <= to; current = nextQuarter(current)) {
    list.push(current);
  }
  parseQuarter(to);
  return list;
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
