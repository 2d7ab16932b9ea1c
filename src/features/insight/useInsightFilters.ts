// The network filters of every insight page (overview, standing, instructors, error trends, attempts,
// equipment), kept in the URL (?quarter=2026-Q3&site=WRM…) so any view is a link. Their choices come from the
// one options query. The period is always set: without one in the address the page writes the latest quarter
// with data into it, so a copied link keeps showing the same quarter after newer data arrives. Pages that
// allow it also offer the ranges "last-4" and "all", which the API receives as from/to.
import { useQuery } from "@tanstack/react-query";
import { useEffect, useMemo } from "react";
import { useSearchParams } from "react-router";
import type { OptionsAnswer } from "../../../shared/schemas/insight";
import { feedbackFilter, filterParamName, readFilterValues, type FilterDefinition, type FilterValues } from "../../components/FilterBar";
import { quarterLabel } from "../../../shared/period";
import { insightQueries, type ApiFilters } from "./queries";
import { dimensionNames, patientTypeNames } from "../../../shared/vocabulary";

/** Period choices besides single quarters. */
export const LAST_FOUR = "last-4";
export const ALL_QUARTERS = "all";

export type OptionalFilter = "site" | "patientType" | "feedback" | "instructor" | "manikin";

export interface FilterChoices {
  /** Offer the ranges "last 4 quarters" and "all quarters" besides single quarters. */
  ranges?: boolean;
}

/** The filter choices, from the one options query every page shares. */
export function useInsightOptions() {
  return useQuery(insightQueries.options());
}

/** The filter bar's definitions: the period first (quarters newest first), then the optional filters that have choices. */
export function filterDefinitions(options: OptionsAnswer, optional: readonly OptionalFilter[], { ranges = false }: FilterChoices = {}): FilterDefinition[] {
  const periods = [
    ...options.quarters.map((q) => ({ value: q, label: quarterLabel(q) })),
    ...(ranges && options.quarters.length > 1 ? [{ value: LAST_FOUR, label: "Last 4 quarters" }] : []),
    ...(ranges && options.quarters.length > 4 ? [{ value: ALL_QUARTERS, label: `All quarters (${options.quarters.length})` }] : []),
  ];
  const definitions: FilterDefinition[] = [{ key: "quarter", options: periods, allLabel: null }];
  for (const key of optional) {
    if (key === "site" && options.sites.length > 0) {
      definitions.push({ key, options: options.sites.map((s) => ({ value: s.code, label: `${s.code} · ${s.name}` })), allLabel: "All sites" });
    }
    if (key === "patientType" && options.patientTypes.length > 0) {
      definitions.push({
        key,
        label: dimensionNames.patientType,
        options: options.patientTypes.map((p) => ({ value: p, label: patientTypeNames[p] })),
        allLabel: "All types",
      });
    }
    if (key === "feedback" && options.feedbackModes.length > 0) {
      definitions.push({ ...feedbackFilter, label: dimensionNames.feedback });
    }
    // filtering on the only instructor one may see (an instructor's own) would change nothing
    if (key === "instructor" && options.instructors.length > 1) {
      definitions.push({ key, options: options.instructors.map((i) => ({ value: i.code, label: `${i.code} · ${i.name}` })), allLabel: "All instructors" });
    }
    if (key === "manikin" && options.manikins.length > 0) {
      definitions.push({ key, options: options.manikins.map((m) => ({ value: m.assetId, label: m.assetId })), allLabel: "All manikins" });
    }
  }
  return definitions;
}

/** What the API is asked for: the period becomes one quarter or a from/to range (quarters newest first). */
export function apiFilters(values: FilterValues, quarters: readonly string[]): ApiFilters {
  const api: ApiFilters = {};
  const period = values.quarter;
  if (period === LAST_FOUR && quarters.length > 0) {
    api.from = quarters[Math.min(3, quarters.length - 1)];
    api.to = quarters[0];
  } else if (period === ALL_QUARTERS && quarters.length > 0) {
    api.from = quarters[quarters.length - 1];
    api.to = quarters[0];
  } else if (period) {
    api.quarter = period;
  }
  if (values.site) api.site = values.site;
  if (values.patientType) api.profile = values.patientType;
  if (values.feedback) api.feedback = values.feedback;
  if (values.instructor) api.instructor = values.instructor;
  if (values.manikin) api.manikin = values.manikin;
  return api;
}

/** URL search params (as the filter bar writes them) for a link to another insight page. */
export function linkParams(values: FilterValues, extra: Record<string, string | null | undefined> = {}): string {
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(values)) if (value) params.set(filterParamName(key), value);
  for (const [key, value] of Object.entries(extra)) {
    if (value) params.set(filterParamName(key), value);
    else params.delete(filterParamName(key));
  }
  return params.toString();
}

export interface InsightFilterState {
  options: OptionsAnswer;
  definitions: FilterDefinition[];
  /** The filter bar's values, by filter key. */
  values: FilterValues;
  /** What the API is asked for. */
  api: ApiFilters;
  /** The period chosen: a quarter, or a range ("last-4", "all"). */
  period: string;
  /** The quarter chosen; for a range, its newest quarter. */
  quarter: string;
  /** A period the address asked for that has no data (the page shows the latest quarter instead). */
  unknownQuarter: string | null;
  /** Whether any filter other than the period narrows the view. */
  narrowed: boolean;
}

/** The filter state of a page once the options are known; null while none have arrived or nothing has been imported. */
export function filterState(
  options: OptionsAnswer | undefined,
  params: URLSearchParams,
  optional: readonly OptionalFilter[],
  choices: FilterChoices = {},
): InsightFilterState | null {
  if (!options || options.quarters.length === 0) return null;
  const definitions = filterDefinitions(options, optional, choices);
  const values = readFilterValues(params, definitions);
  const asked = params.get(filterParamName("quarter"));
  const period = values.quarter ?? options.quarters[0];
  return {
    options,
    definitions,
    values,
    api: apiFilters(values, options.quarters),
    period,
    quarter: options.quarters.includes(period) ? period : options.quarters[0],
    unknownQuarter: asked !== null && !definitions[0].options.some((option) => option.value === asked) ? asked : null,
    narrowed: definitions.some((d) => d.key !== "quarter" && values[d.key] !== null),
  };
}

export function useInsightFilters(optional: readonly OptionalFilter[], { ranges = false }: FilterChoices = {}) {
  const optionsQuery = useInsightOptions();
  const [params, setParams] = useSearchParams();
  const optionalKey = optional.join(",");

  const state = useMemo(
    () => filterState(optionsQuery.data, params, optionalKey ? (optionalKey.split(",") as OptionalFilter[]) : [], { ranges }),
    [optionsQuery.data, params, optionalKey, ranges],
  );

  // Put the period shown into the address, so "copy link" and bookmarks keep it.
  const paramName = filterParamName("quarter");
  const periodInUrl = params.get(paramName);
  const shownPeriod = state?.period ?? null;
  useEffect(() => {
    if (shownPeriod && periodInUrl === null) {
      setParams(
        (previous) => {
          const next = new URLSearchParams(previous);
          next.set(paramName, shownPeriod);
          return next;
        },
        { replace: true },
      );
    }
  }, [shownPeriod, periodInUrl, paramName, setParams]);

  return { optionsQuery, state };
}
