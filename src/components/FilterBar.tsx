// Filters that live in the URL (?quarter=2025-Q2&site=NTH…), so every filtered view is a link people can
// share or bookmark. A page lists the filters it uses with their options:
//
//   const filters = [quarterFilter(quarterOptions), { key: "site", options: siteOptions }, feedbackFilter];
//   const values = useFilterValues(filters);          // { quarter: "2025-Q2", site: null, feedback: null }
//   <FilterBar filters={filters} />
import { useState } from "react";
import { useSearchParams } from "react-router";
import { feedbackModes } from "../../shared/domain";
import { Button } from "./Button";
import { Select, type SelectOption } from "./Field";
import { dimensionNames, feedbackNames } from "../../shared/vocabulary";

/** The network-wide filters; a page may also pass a key of its own. */
export type StandardFilterKey = "quarter" | "site" | "patientType" | "feedback" | "instructor" | "manikin";

export interface FilterDefinition {
  key: StandardFilterKey | (string & {});
  /** Defaults to the standard label for the key. */
  label?: string;
  options: readonly SelectOption[];
  /** The "no filter" choice; defaults to "All". Set null when a value is required (the first option is used). */
  allLabel?: string | null;
}

export const standardFilterLabels: Record<StandardFilterKey, string> = {
  quarter: dimensionNames.period,
  site: dimensionNames.site,
  patientType: dimensionNames.patientType,
  feedback: dimensionNames.feedback,
  instructor: dimensionNames.instructor,
  manikin: dimensionNames.manikin,
};

/** URL parameter names: short, lower-case, stable (links in e-mails must keep working). */
const paramNames: Record<StandardFilterKey, string> = {
  quarter: "quarter",
  site: "site",
  patientType: "patient",
  feedback: "feedback",
  instructor: "instructor",
  manikin: "manikin",
};

export function filterParamName(key: string): string {
  return paramNames[key as StandardFilterKey] ?? key;
}

export const feedbackFilter: FilterDefinition = {
  key: "feedback",
  options: feedbackModes.map((mode) => ({
    value: mode,
    label: feedbackNames[mode],
  })),
  allLabel: "Live and hidden",
};

export type FilterValues = Record<string, string | null>;

/** Reads the filters from the URL. A value that is not among the options counts as "no filter". */
export function readFilterValues(params: URLSearchParams, filters: readonly FilterDefinition[]): FilterValues {
  const values: FilterValues = {};
  for (const filter of filters) {
    const raw = params.get(filterParamName(filter.key));
    const known = raw !== null && filter.options.some((option) => option.value === raw);
    values[filter.key] = known ? raw : filter.allLabel === null ? (filter.options[0]?.value ?? null) : null;
  }
  return values;
}

export function useFilterValues(filters: readonly FilterDefinition[]): FilterValues {
  const [params] = useSearchParams();
  return readFilterValues(params, filters);
}

export interface FilterBarProps {
  filters: readonly FilterDefinition[];
  /** Names the group for screen readers, e.g. "Filter the overview". */
  label?: string;
}

export function FilterBar({ filters, label = "Filters" }: FilterBarProps) {
  const [params, setParams] = useSearchParams();
  const values = readFilterValues(params, filters);
  const [copied, setCopied] = useState<"yes" | "no" | null>(null);
  const anySet = filters.some((filter) => filter.allLabel !== null && values[filter.key] !== null);

  function change(key: string, value: string) {
    setParams(
      (previous) => {
        const next = new URLSearchParams(previous);
        if (value) next.set(filterParamName(key), value);
        else next.delete(filterParamName(key));
        return next;
      },
      { replace: true },
    );
    setCopied(null);
  }

  function clearAll() {
    setParams(
      (previous) => {
        const next = new URLSearchParams(previous);
        for (const filter of filters) next.delete(filterParamName(filter.key));
        return next;
      },
      { replace: true },
    );
    setCopied(null);
  }

  async function copyLink() {
    try {
      await navigator.clipboard.writeText(window.location.href);
      setCopied("yes");
    } catch {
      setCopied("no");
    }
  }

  return (
    <section aria-label={label} className="mb-6 rounded-card border border-line bg-surface p-4 shadow-card">
      <div className="grid grid-cols-[repeat(auto-fill,minmax(min(100%,13rem),1fr))] gap-3">
        {filters.map((filter) => (
          <Select
            key={filter.key}
            label={filter.label ?? standardFilterLabels[filter.key as StandardFilterKey] ?? filter.key}
            options={filter.options}
            placeholder={filter.allLabel === null ? undefined : (filter.allLabel ?? "All")}
            value={values[filter.key] ?? ""}
            onChange={(event) => change(filter.key, event.target.value)}
          />
        ))}
      </div>
      <div className="mt-3 flex flex-wrap items-center gap-2">
        {anySet && (
          <Button variant="quiet" size="sm" onClick={clearAll}>
            Clear filters
          </Button>
        )}
        <Button variant="secondary" size="sm" onClick={copyLink}>
          Copy link to this view
        </Button>
        <span role="status" className="text-caption text-muted">
          {copied === "yes" && "Link copied. Anyone signed in with access to this page will see the same filters."}
          {copied === "no" && "Copying is blocked here; copy the address from the browser's address bar instead."}
        </span>
      </div>
    </section>
  );
}
