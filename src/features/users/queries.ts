import { queryOptions } from "@tanstack/react-query";
import { userListAnswerSchema } from "../../../shared/schemas/users";
import { getParsed } from "../../api/getParsed";

export const userQueries = {
  all: () => ["users"] as const,
  list: () =>
    queryOptions({
      queryKey: [...userQueries.all(), "list"] as const,
      queryFn: async ({ signal }) => (await getParsed(userListAnswerSchema, "/api/users", signal)).users,
    }),
};
