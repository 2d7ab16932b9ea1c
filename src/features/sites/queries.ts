import { queryOptions } from "@tanstack/react-query";
import { siteListAnswerSchema } from "../../../shared/schemas/sites";
import { getParsed } from "../../api/getParsed";

export const siteQueries = {
  all: () => ["sites"] as const,
  list: () =>
    queryOptions({
      queryKey: [...siteQueries.all(), "list"] as const,
      queryFn: async ({ signal }) => (await getParsed(siteListAnswerSchema, "/api/sites", signal)).sites,
    }),
};
