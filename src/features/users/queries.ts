import { queryOptions } from "@tanstack/react-query";
import type { UserRow } from "../../../shared/schemas/users";
import { http } from "../../api/http";

export const userQueries = {
  all: () => ["users"] as const,
  list: () =>
    queryOptions({
      queryKey: [...userQueries.all(), "list"] as const,
      queryFn: async ({ signal }) => (await http.get<{ users: UserRow[] }>("/api/users", signal)).users,
    }),
};
