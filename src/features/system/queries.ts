// The installation's state (server/ops/systemRoutes.ts), for coordinators.
import { queryOptions } from "@tanstack/react-query";
import { systemReportSchema } from "../../../shared/schemas/system";
import { getParsed } from "../../api/getParsed";

export const systemQueries = {
  all: () => ["system"] as const,
  report: () =>
    queryOptions({
      queryKey: [...systemQueries.all(), "report"] as const,
      queryFn: ({ signal }) => getParsed(systemReportSchema, "/api/system", signal),
    }),
};
