import { filtersToQuery } from "../../shared/filters";

type QueryFields<Q> = { [K in keyof Q]: string | number | undefined };

/** An API path with its query string; empty values are left out, and so is a "?" with nothing after it. */
export function withQuery<Q extends QueryFields<Q>>(path: string, query: Q): string {
  const search = filtersToQuery(query as Partial<Record<string, string | number | undefined>>);
  return search ? `${path}?${search}` : path;
}
