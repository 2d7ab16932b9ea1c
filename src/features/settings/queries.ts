import { queryOptions } from "@tanstack/react-query";
import type { PolicySettingsAnswer } from "../../../shared/schemas/policySettings";
import type { NetworkPolicy } from "../../../shared/scoring/policy";
import { http } from "../../api/http";

export interface PolicyVersionRow {
  version: number;
  policy: NetworkPolicy;
  note: string;
  createdAt: string;
}

export const settingsQueries = {
  all: () => ["settings"] as const,
  policy: () =>
    queryOptions({
      queryKey: [...settingsQueries.all(), "policy"] as const,
      queryFn: ({ signal }) => http.get<PolicySettingsAnswer>("/api/settings/policy", signal),
    }),
  versions: () =>
    queryOptions({
      queryKey: [...settingsQueries.all(), "versions"] as const,
      queryFn: async ({ signal }) => (await http.get<{ versions: PolicyVersionRow[] }>("/api/settings/policy/versions", signal)).versions,
    }),
};
