// The improvement actions a trend chart marks: those touching the chart's filters that start within its quarters.
import { useQuery } from "@tanstack/react-query";
import type { ActionMark } from "../../../shared/schemas/actions";
import { useCan } from "../auth/useCan";
import type { ApiFilters } from "../insight/queries";
import { actionQueries } from "./queries";

/** The chart's filters that decide which actions touch it (its period comes from its quarters). */
export type ChartScope = Pick<ApiFilters, "site" | "profile" | "instructor">;

const none: ActionMark[] = [];

export function useActionMarks(scope: ChartScope, quarters: readonly string[]): ActionMark[] {
  const mayRead = useCan("readActions");
  const from = quarters[0];
  const to = quarters[quarters.length - 1];
  const query = useQuery({
    ...actionQueries.marks({ site: scope.site, profile: scope.profile, instructor: scope.instructor, from, to }),
    enabled: mayRead && quarters.length > 0,
  });
  return query.data ?? none;
}
