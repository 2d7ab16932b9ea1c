import { queryOptions } from "@tanstack/react-query";
import type { SiteRow } from "../../../shared/schemas/sites";
import { http } from "../../api/http";

export const siteQueries = {
  all: () => ["sites"] as const,
  list: () =>
    queryOptions({
      queryKey: [...siteQueries.all(), "list"] as const,
      queryFn: async ({ signal }) => (await http.get<{ sites: SiteRow[] }>("/api/sites", signal)).sites,
    }),
};
