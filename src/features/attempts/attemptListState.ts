// What the attempt list shows besides the network filters, all kept in the URL so any view is a link: the
// order (?sort=score&dir=asc), the page, the columns chosen (?cols=startedAt,learner,…), the learner and class
// searched for. The server sorts and filters the whole result; these only say what to ask for.
import { attemptSortKeys, sortDirections, type AttemptSortKey, type SortDirection } from "../../../shared/filters";

/** Columns the list can show besides the attempt itself (always first), in the order they appear. */
export type AttemptColumnKey = Exclude<AttemptSortKey, "id">;
export const attemptColumnKeys = attemptSortKeys.filter((key): key is AttemptColumnKey => key !== "id");

/** Shown until the user chooses: the figures that decide a result, narrow enough for a 1366 px screen. */
export const defaultAttemptColumns: readonly AttemptColumnKey[] = ["startedAt", "learner", "profile", "passed", "errors", "score", "depthOk", "rateOk"];

export const PAGE_SIZE = 50;

export interface AttemptListState {
  sort: AttemptSortKey;
  dir: SortDirection;
  /** True when the URL names no order (newest first). */
  defaultOrder: boolean;
  page: number;
  columns: AttemptColumnKey[];
  learner: string;
  learnerPrefix: boolean;
  classId: string;
}

const isSortKey = (value: string | null): value is AttemptSortKey => value !== null && (attemptSortKeys as readonly string[]).includes(value);
const isColumnKey = (value: string): value is AttemptColumnKey => (attemptColumnKeys as readonly string[]).includes(value);

/** The state in a URL; anything it does not know is read as the default. */
export function readAttemptListState(params: URLSearchParams): AttemptListState {
  const sortParam = params.get("sort");
  const sort = isSortKey(sortParam) ? sortParam : "startedAt";
  const dirParam = params.get("dir");
  const dir: SortDirection = (sortDirections as readonly string[]).includes(dirParam ?? "")
    ? (dirParam as SortDirection)
    : isSortKey(sortParam)
      ? "asc"
      : "desc";
  const page = Number.parseInt(params.get("page") ?? "1", 10);
  const chosen = params.get("cols");
  const named = chosen === null ? null : new Set(chosen.split(",").filter(isColumnKey));
  return {
    sort,
    dir,
    defaultOrder: !isSortKey(sortParam),
    page: Number.isFinite(page) && page >= 1 ? page : 1,
    columns: named === null ? [...defaultAttemptColumns] : attemptColumnKeys.filter((key) => named.has(key)),
    learner: params.get("learner") ?? "",
    learnerPrefix: params.get("learnerMatch") === "prefix",
    classId: params.get("class") ?? "",
  };
}

/** The fields of this state the API takes (the network filters and error/stream come from the filter bar). */
export function attemptSearchQuery(state: AttemptListState) {
  return {
    class: state.classId || undefined,
    learner: state.learner || undefined,
    learnerMatch: state.learner && state.learnerPrefix ? "prefix" : undefined,
    sort: state.defaultOrder ? undefined : state.sort,
    dir: state.defaultOrder ? undefined : state.dir,
  };
}

/** A header click: the same column turns its order round, another column starts ascending (figures: lowest first). */
export function nextSort(state: Pick<AttemptListState, "sort" | "dir">, key: AttemptSortKey): { sort: AttemptSortKey; dir: SortDirection } {
  return state.sort === key ? { sort: key, dir: state.dir === "asc" ? "desc" : "asc" } : { sort: key, dir: "asc" };
}

/** Params with the changes applied; a change of anything but the page or the columns starts at page 1. */
export function withChanges(params: URLSearchParams, changes: Record<string, string | null>): URLSearchParams {
  const next = new URLSearchParams(params);
  for (const [key, value] of Object.entries(changes)) {
    if (value === null || value === "") next.delete(key);
    else next.set(key, value);
  }
  if (!("page" in changes) && Object.keys(changes).some((key) => key !== "cols")) next.delete("page");
  return next;
}

/** The `cols` value for a choice of columns; null (no parameter) when it is the default, "none" for none. */
export function columnsParam(columns: readonly AttemptColumnKey[]): string | null {
  const ordered = attemptColumnKeys.filter((key) => columns.includes(key));
  const isDefault = ordered.length === defaultAttemptColumns.length && ordered.every((key) => defaultAttemptColumns.includes(key));
  return isDefault ? null : ordered.length === 0 ? "none" : ordered.join(",");
}
