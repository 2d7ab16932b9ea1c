// Saving the policy makes a new version; rescoring applies the version in force to older scores. Both change
// what every insight page shows, so everything cached is refreshed afterwards.
import { useMutation, useQueryClient } from "@tanstack/react-query";
import type { RescoreAnswer } from "../../../shared/schemas/policySettings";
import type { NetworkPolicy } from "../../../shared/scoring/policy";
import { http } from "../../api/http";
import type { PolicyVersionRow } from "./queries";

export function useSavePolicy() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: { policy: NetworkPolicy; note: string }) => http.put<PolicyVersionRow>("/api/settings/policy", body),
    onSuccess: () => queryClient.invalidateQueries(),
  });
}

export function useRescore() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: { fromQuarter?: string }) => http.post<RescoreAnswer>("/api/settings/rescore", body),
    onSuccess: () => queryClient.invalidateQueries(),
  });
}
