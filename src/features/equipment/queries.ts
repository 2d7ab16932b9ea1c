import { keepPreviousData, queryOptions } from "@tanstack/react-query";
import { filtersToQuery } from "../../../shared/filters";
import type { EquipmentAnswer } from "../../../shared/schemas/equipment";
import { http } from "../../api/http";

export const equipmentQueries = {
  all: () => ["equipment"] as const,
  report: (query: Record<string, string | undefined>) =>
    queryOptions({
      queryKey: [...equipmentQueries.all(), query] as const,
      queryFn: ({ signal }) => http.get<EquipmentAnswer>(`/api/equipment?${filtersToQuery(query)}`, signal),
      placeholderData: keepPreviousData,
    }),
};
