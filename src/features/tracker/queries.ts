import { queryOptions } from "@tanstack/react-query";
import { trackerAnswerSchema } from "../../../shared/schemas/tracker";
import { getParsed } from "../../api/getParsed";
import { withQuery } from "../../api/withQuery";

export const trackerQueries = {
  all: () => ["tracker"] as const,
  quarter: (quarter: string) =>
    queryOptions({
      queryKey: [...trackerQueries.all(), quarter] as const,
      queryFn: ({ signal }) => getParsed(trackerAnswerSchema, withQuery("/api/tracker", { quarter }), signal),
    }),
};
