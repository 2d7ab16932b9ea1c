// Choose the report's period: a quarter, or a whole year. Only periods with data are offered (to funders,
// only periods with a released report: the page passes those quarters and years).
import { useId } from "react";
import { controlClass } from "../../components/Field";
import { defaultPeriod, periodKindOf, periodLabel, yearsOf, type PeriodKind } from "../../../shared/period";

export interface PeriodPickerProps {
  quarters: readonly string[];
  /** The years to offer; by default every year that has one of the quarters. */
  years?: readonly string[];
  period: string;
  onChange: (period: string) => void;
}

export function PeriodPicker({ quarters, years: offeredYears, period, onChange }: PeriodPickerProps) {
  const kind = periodKindOf(period);
  const years = offeredYears ? [...offeredYears].sort().reverse() : yearsOf(quarters);
  const selectId = useId();
  const sortedQuarters = [...quarters].sort().reverse();

  function switchKind(next: PeriodKind) {
    if (next === kind) return;
    if (next === "year") onChange(offeredYears && !offeredYears.includes(period.slice(0, 4)) && years[0] ? years[0] : period.slice(0, 4));
    else onChange(defaultPeriod(quarters.filter((q) => q.startsWith(period))) ?? defaultPeriod(quarters) ?? period);
  }

  return (
    <fieldset className="flex flex-wrap items-end gap-x-6 gap-y-3 rounded-card border border-line bg-surface p-4 shadow-card print:hidden">
      <legend className="sr-only">Report period</legend>
      <div role="radiogroup" aria-label="Report for" className="flex flex-col gap-1">
        <span className="text-small font-semibold" aria-hidden="true">
          Report for
        </span>
        <div className="flex gap-1 rounded-control border border-line-strong bg-paper p-1">
          {(["quarter", "year"] as const).map((value) => (
            <label
              key={value}
              className={`flex min-h-9 cursor-pointer items-center gap-2 rounded-control px-3 text-small font-medium has-[:focus-visible]:outline-3 has-[:focus-visible]:outline-offset-2 has-[:focus-visible]:outline-dusk-500 has-[:focus-visible]:outline-solid ${kind === value ? "bg-dusk-700 text-white" : "text-dusk-800 hover:bg-dusk-50"}`}
            >
              <input type="radio" name="period-kind" value={value} checked={kind === value} onChange={() => switchKind(value)} className="sr-only" />
              {value === "quarter" ? "A quarter" : "A whole year"}
            </label>
          ))}
        </div>
      </div>
      <div className="flex min-w-[12rem] flex-col gap-1">
        <label htmlFor={selectId} className="text-small font-semibold">
          {kind === "quarter" ? "Quarter" : "Year"}
        </label>
        <select id={selectId} value={period} onChange={(event) => onChange(event.target.value)} className={controlClass(false)}>
          {(kind === "quarter" ? sortedQuarters : years).map((value) => (
            <option key={value} value={value}>
              {kind === "quarter" ? `${periodLabel(value)} (${value})` : value}
            </option>
          ))}
          {/* A period typed into the address that has no data still shows as chosen. */}
          {!(kind === "quarter" ? sortedQuarters : years).includes(period) && <option value={period}>{periodLabel(period)}</option>}
        </select>
      </div>
    </fieldset>
  );
}
