import { queryOptions } from "@tanstack/react-query";
import type { z } from "zod";
import { policySettingsAnswerSchema, policyVersionSchema, policyVersionsAnswerSchema } from "../../../shared/schemas/policySettings";
import { chartBaselineSchema } from "../../../shared/schemas/chartSettings";
import { getParsed } from "../../api/getParsed";

export type PolicyVersionRow = z.infer<typeof policyVersionSchema>;

export const settingsQueries = {
  all: () => ["settings"] as const,
  policy: () =>
    queryOptions({
      queryKey: [...settingsQueries.all(), "policy"] as const,
      queryFn: ({ signal }) => getParsed(policySettingsAnswerSchema, "/api/settings/policy", signal),
    }),
  versions: () =>
    queryOptions({
      queryKey: [...settingsQueries.all(), "versions"] as const,
      queryFn: async ({ signal }) => (await getParsed(policyVersionsAnswerSchema, "/api/settings/policy/versions", signal)).versions,
    }),
  chartBaseline: () =>
    queryOptions({
      queryKey: [...settingsQueries.all(), "chart-baseline"] as const,
      queryFn: ({ signal }) => getParsed(chartBaselineSchema, "/api/settings/chart-baseline", signal),
    }),
};
