import { queryOptions } from "@tanstack/react-query";
import { instructorListAnswerSchema } from "../../../shared/schemas/sites";
import { getParsed } from "../../api/getParsed";

export const instructorQueries = {
  all: () => ["instructors"] as const,
  list: () =>
    queryOptions({
      queryKey: [...instructorQueries.all(), "list"] as const,
      queryFn: async ({ signal }) => (await getParsed(instructorListAnswerSchema, "/api/instructors", signal)).instructors,
    }),
};
