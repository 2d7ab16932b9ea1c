import { queryOptions } from "@tanstack/react-query";
import type { InstructorRow } from "../../../shared/schemas/sites";
import { http } from "../../api/http";

export const instructorQueries = {
  all: () => ["instructors"] as const,
  list: () =>
    queryOptions({
      queryKey: [...instructorQueries.all(), "list"] as const,
      queryFn: async ({ signal }) =>
        (await http.get<{ instructors: InstructorRow[] }>("/api/instructors", signal)).instructors,
    }),
};
