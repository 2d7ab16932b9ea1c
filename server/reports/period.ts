// Report periods: a quarter (2026-Q3) or a year (2026), the quarters they cover and the periods they are
// compared with.
import { periodSchema } from "../../shared/schemas/report";
import { badRequest } from "../errors";

export interface ReportPeriod {
  id: string;
  kind: "quarter" | "year";
  year: number;
  /** 1–4 for a quarter, null for a year */
  quarter: number | null;
}

const monthSpans = ["January–March", "April–June", "July–September", "October–December"];

export function parsePeriod(text: unknown): ReportPeriod {
  const parsed = periodSchema.safeParse(text);
  if (!parsed.success) throw badRequest(`"${String(text)}" is not a report period. Use a quarter such as 2026-Q3 or a year such as 2026.`);
  const [yearText, quarterText] = parsed.data.split("-Q");
  const year = Number(yearText);
  return quarterText ? { id: parsed.data, kind: "quarter", year, quarter: Number(quarterText) } : { id: parsed.data, kind: "year", year, quarter: null };
}

export function quarterId(year: number, quarter: number): string {
  return `${year}-Q${quarter}`;
}

/** The quarters a period covers, oldest first. */
export function quartersOf(period: ReportPeriod): string[] {
  return period.quarter ? [period.id] : [1, 2, 3, 4].map((q) => quarterId(period.year, q));
}

export function periodLabel(period: ReportPeriod): string {
  return period.quarter ? `${monthSpans[period.quarter - 1]} ${period.year}` : `January–December ${period.year}`;
}

/** The `count` quarters ending with the period's last quarter, oldest first. */
export function trailingQuarters(period: ReportPeriod, count: number): string[] {
  let year = period.year;
  let quarter = period.quarter ?? 4;
  const found: string[] = [];
  for (let i = 0; i < count; i++) {
    found.unshift(quarterId(year, quarter));
    quarter -= 1;
    if (quarter === 0) {
      quarter = 4;
      year -= 1;
    }
  }
  return found;
}

/** The periods a report compares with: previous quarter and same quarter a year earlier, or the previous year. */
export function comparisonPeriods(period: ReportPeriod): { label: string; period: ReportPeriod }[] {
  if (period.kind === "year") {
    return [{ label: "the previous year", period: { id: String(period.year - 1), kind: "year", year: period.year - 1, quarter: null } }];
  }
  const q = period.quarter!;
  const previous = q === 1 ? { year: period.year - 1, quarter: 4 } : { year: period.year, quarter: q - 1 };
  return [
    { label: "the previous quarter", period: { id: quarterId(previous.year, previous.quarter), kind: "quarter", ...previous } },
    {
      label: "the same quarter last year",
      period: { id: quarterId(period.year - 1, q), kind: "quarter", year: period.year - 1, quarter: q },
    },
  ];
}
