import { keepPreviousData, queryOptions } from "@tanstack/react-query";
import { driftAnswerSchema, equipmentAnswerSchema, manikinRecordSchema } from "../../../shared/schemas/equipment";
import { getParsed } from "../../api/getParsed";
import { withQuery } from "../../api/withQuery";
import type { ApiFilters } from "../insight/queries";

export const equipmentQueries = {
  all: () => ["equipment"] as const,
  report: (query: ApiFilters) =>
    queryOptions({
      queryKey: [...equipmentQueries.all(), query] as const,
      queryFn: ({ signal }) => getParsed(equipmentAnswerSchema, withQuery("/api/equipment", query), signal),
      placeholderData: keepPreviousData,
    }),
  drift: (query: ApiFilters) =>
    queryOptions({
      queryKey: [...equipmentQueries.all(), "drift", query] as const,
      queryFn: ({ signal }) => getParsed(driftAnswerSchema, withQuery("/api/equipment/drift", query), signal),
      placeholderData: keepPreviousData,
    }),
  manikin: (assetId: string, query: ApiFilters) =>
    queryOptions({
      queryKey: [...equipmentQueries.all(), "manikin", assetId, query] as const,
      queryFn: ({ signal }) => getParsed(manikinRecordSchema, withQuery(`/api/equipment/manikins/${encodeURIComponent(assetId)}`, query), signal),
      placeholderData: keepPreviousData,
    }),
};
