// The filters of an insight page, kept in the URL (?quarter=2026-Q3&site=WRM…) so any view is a link. The
// quarter is always set: without one in the address the page writes the latest quarter with data into it,
// so a copied link keeps showing the same quarter after newer data arrives.
import { useQuery } from "@tanstack/react-query";
import { useEffect, useMemo } from "react";
import { useSearchParams } from "react-router";
import type { OptionsAnswer } from "../../../shared/schemas/insight";
import { feedbackFilter, filterParamName, readFilterValues, type FilterDefinition } from "../../components/FilterBar";
import { quarterLabel } from "./format";
import { insightQueries, type ApiFilters } from "./queries";
import { dimensionNames, patientTypeNames } from "../../../shared/vocabulary";

export type OptionalFilter = "site" | "patientType" | "feedback" | "instructor" | "manikin";

export function filterDefinitions(options: OptionsAnswer, optional: readonly OptionalFilter[]): FilterDefinition[] {
  const definitions: FilterDefinition[] = [
    { key: "quarter", options: options.quarters.map((q) => ({ value: q, label: quarterLabel(q) })), allLabel: null },
  ];
  for (const key of optional) {
    if (key === "site" && options.sites.length > 0) {
      definitions.push({ key, options: options.sites.map((s) => ({ value: s.code, label: `${s.code} · ${s.name}` })), allLabel: "All sites" });
    }
    if (key === "patientType" && options.patientTypes.length > 0) {
      definitions.push({ key, label: dimensionNames.patientType, options: options.patientTypes.map((p) => ({ value: p, label: patientTypeNames[p] })), allLabel: "All types" });
    }
    if (key === "feedback" && options.feedbackModes.length > 0) {
      definitions.push({ ...feedbackFilter, label: "Feedback display" });
    }
    if (key === "instructor" && options.instructors.length > 1) {
      definitions.push({ key, options: options.instructors.map((i) => ({ value: i.code, label: `${i.code} · ${i.name}` })), allLabel: "All instructors" });
    }
    if (key === "manikin" && options.manikins.length > 0) {
      definitions.push({ key, options: options.manikins.map((m) => ({ value: m.assetId, label: m.assetId })), allLabel: "All manikins" });
    }
  }
  return definitions;
}

export interface InsightFilterState {
  options: OptionsAnswer;
  definitions: FilterDefinition[];
  /** What the API is asked for. */
  api: ApiFilters;
  quarter: string;
  /** A quarter the address asked for that has no data (the page shows the latest instead). */
  unknownQuarter: string | null;
  /** Whether any filter other than the quarter narrows the view. */
  narrowed: boolean;
}

export function useInsightFilters(optional: readonly OptionalFilter[]) {
  const optionsQuery = useQuery(insightQueries.options());
  const [params, setParams] = useSearchParams();
  const optionalKey = optional.join(",");

  const state = useMemo<InsightFilterState | null>(() => {
    const options = optionsQuery.data;
    if (!options || options.quarters.length === 0) return null;
    const definitions = filterDefinitions(options, optionalKey ? (optionalKey.split(",") as OptionalFilter[]) : []);
    const values = readFilterValues(params, definitions);
    const asked = params.get(filterParamName("quarter"));
    const api: ApiFilters = {};
    if (values.quarter) api.quarter = values.quarter;
    if (values.site) api.site = values.site;
    if (values.patientType) api.profile = values.patientType;
    if (values.feedback) api.feedback = values.feedback;
    if (values.instructor) api.instructor = values.instructor;
    if (values.manikin) api.manikin = values.manikin;
    return {
      options,
      definitions,
      api,
      quarter: values.quarter ?? options.quarters[0],
      unknownQuarter: asked && !options.quarters.includes(asked) ? asked : null,
      narrowed: definitions.some((d) => d.key !== "quarter" && values[d.key] !== null),
    };
  }, [optionsQuery.data, params, optionalKey]);

  // Put the quarter shown into the address, so "copy link" and bookmarks keep it.
  const quarterInUrl = params.get("quarter");
  const shownQuarter = state?.quarter ?? null;
  useEffect(() => {
    if (shownQuarter && quarterInUrl === null) {
      setParams(
        (previous) => {
          const next = new URLSearchParams(previous);
          next.set("quarter", shownQuarter);
          return next;
        },
        { replace: true },
      );
    }
  }, [shownQuarter, quarterInUrl, setParams]);

  return { optionsQuery, state };
}
