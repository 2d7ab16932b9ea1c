// The alerts after each import (server/alerts/routes.ts): the reader's choice of kinds, the signals mailed to
// them and, for a coordinator, every user's.
import { queryOptions, useMutation, useQueryClient } from "@tanstack/react-query";
import { alertChoiceAnswerSchema, allAlertsAnswerSchema, myAlertsAnswerSchema, type AlertChoice } from "../../../shared/schemas/alerts";
import { getParsed } from "../../api/getParsed";
import { http } from "../../api/http";

export const alertQueries = {
  all: () => ["alerts"] as const,
  choice: () =>
    queryOptions({
      queryKey: [...alertQueries.all(), "choice"] as const,
      queryFn: ({ signal }) => getParsed(alertChoiceAnswerSchema, "/api/me/alerts", signal),
    }),
  mine: () =>
    queryOptions({
      queryKey: [...alertQueries.all(), "mine"] as const,
      queryFn: async ({ signal }) => (await getParsed(myAlertsAnswerSchema, "/api/alerts", signal)).deliveries,
    }),
  everyone: () =>
    queryOptions({
      queryKey: [...alertQueries.all(), "everyone"] as const,
      queryFn: async ({ signal }) => (await getParsed(allAlertsAnswerSchema, "/api/alerts/all", signal)).signals,
    }),
};

export function useSaveAlertChoice() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async (choice: AlertChoice) => alertChoiceAnswerSchema.parse(await http.put<unknown>("/api/me/alerts", choice)),
    onSuccess: (answer) => queryClient.setQueryData(alertQueries.choice().queryKey, answer),
  });
}
