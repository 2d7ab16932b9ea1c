// A quarter or range (with these filters) that holds no attempts: say so and offer the way out — another
// quarter that has data, or the same period without the other filters.
import { Link, useSearchParams } from "react-router";
import { EmptyState } from "../../components/States";
import { quarterLabel, rangeLabel } from "../../../shared/period";
import type { InsightFilterState } from "./useInsightFilters";

export function NoDataForFilters({ state, what = "attempts" }: { state: InsightFilterState; what?: string }) {
  const [params] = useSearchParams();
  const { from, to } = state.api;
  const range = from !== undefined && to !== undefined ? { from, to } : null;
  const shown = range ? rangeLabel(range) : quarterLabel(state.quarter);
  // after an empty range, any single quarter is a way out; after an empty quarter, the others
  const others = state.options.quarters.filter((q) => range !== null || q !== state.quarter).slice(0, 3);
  const linkTo = (change: (next: URLSearchParams) => void) => {
    const next = new URLSearchParams(params);
    change(next);
    return `?${next.toString()}`;
  };
  const keep = new Set(["quarter"]);
  return (
    <EmptyState title={`No ${what} in ${shown}${state.narrowed ? " with these filters" : ""}`}>
      <p>Choose another quarter{state.narrowed ? " or clear the other filters" : ""}.</p>
      <ul className="mt-2 flex flex-wrap gap-x-4 gap-y-1">
        {others.map((quarter) => (
          <li key={quarter}>
            <Link className="font-semibold text-dusk-700 underline underline-offset-2 hover:text-dusk-900" to={linkTo((next) => next.set("quarter", quarter))}>
              Show {quarterLabel(quarter)}
            </Link>
          </li>
        ))}
        {state.narrowed && (
          <li>
            <Link
              className="font-semibold text-dusk-700 underline underline-offset-2 hover:text-dusk-900"
              to={linkTo((next) => {
                for (const key of [...next.keys()]) if (!keep.has(key)) next.delete(key);
              })}
            >
              Clear the other filters
            </Link>
          </li>
        )}
      </ul>
    </EmptyState>
  );
}
