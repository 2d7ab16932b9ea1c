// Saving the policy makes a new version; rescoring applies the version in force to older scores. Both change
// what every insight page shows, and the settings pages list the versions: all of them are refreshed.
import { useMutation } from "@tanstack/react-query";
import type { ChartBaseline, ChartBaselineSetting } from "../../../shared/schemas/chartSettings";
import type { RescoreAnswer } from "../../../shared/schemas/policySettings";
import type { NetworkPolicy } from "../../../shared/scoring/policy";
import { http } from "../../api/http";
import { settingsQueries, type PolicyVersionRow } from "./queries";

export function useSavePolicy() {
  return useMutation({
    mutationFn: (body: { policy: NetworkPolicy; note: string }) => http.put<PolicyVersionRow>("/api/settings/policy", body),
    meta: { changesFigures: true, invalidates: [settingsQueries.all()] },
  });
}

export function useRescore() {
  return useMutation({
    mutationFn: (body: { fromQuarter?: string }) => http.post<RescoreAnswer>("/api/settings/rescore", body),
    meta: { changesFigures: true, invalidates: [settingsQueries.all()] },
  });
}

/** The overview p-chart's baseline: it moves every centre line and limit, so figures are refreshed. */
export function useSaveChartBaseline() {
  return useMutation({
    mutationFn: (baseline: ChartBaselineSetting | null) => http.put<ChartBaseline>("/api/settings/chart-baseline", { baseline }),
    meta: { changesFigures: true, invalidates: [settingsQueries.all()] },
  });
}
