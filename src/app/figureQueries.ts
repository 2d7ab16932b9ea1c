// Which cached answers a write makes wrong. Imports, undo, rescoring and policy changes alter the figures of
// every insight page, the drill-downs, equipment, reports and the import history; those queries are
// invalidated at once, through their key factories, instead of waiting for them to go stale.
import type { QueryClient, QueryKey } from "@tanstack/react-query";
import { dataVersionAnswerSchema } from "../../shared/schemas/dataVersion";
import { getParsed } from "../api/getParsed";
import { actionQueries } from "../features/actions/queries";
import { alertQueries } from "../features/alerts/queries";
import { attemptQueries } from "../features/attempts/queries";
import { equipmentQueries } from "../features/equipment/queries";
import { importQueries } from "../features/imports/queries";
import { insightQueries } from "../features/insight/queries";
import { instructorQueries } from "../features/instructors/queries";
import { learnerQueries } from "../features/learners/queries";
import { reportQueries } from "../features/report/queries";
import { systemQueries } from "../features/system/queries";
import { techniqueErrorQueries } from "../features/techniqueErrors/queries";
import { trackerQueries } from "../features/tracker/queries";

/** Answers computed from attempts, classes, equipment logs and the scoring policy. */
export const figureQueryFamilies: readonly QueryKey[] = [
  insightQueries.all(),
  techniqueErrorQueries.all(),
  attemptQueries.all(),
  equipmentQueries.all(),
  reportQueries.all(),
  learnerQueries.all(),
  importQueries.all(),
  // A class log can name an instructor the directory has not seen yet.
  instructorQueries.all(),
  // The System page counts classes, attempts and streams per quarter and lists the last imports.
  systemQueries.all(),
  // Improvement actions are evaluated on the attempt figures.
  actionQueries.all(),
  // The quarter tracker counts classes, attempts and refused rows.
  trackerQueries.all(),
  // An import mails new alerts, which the Alerts page lists.
  alertQueries.all(),
];

/**
 * What a mutation declares it changes, in its `meta`: `changesFigures` for every family above, `invalidates`
 * for the keys of other families it touches. The query client invalidates them when the mutation succeeds.
 */
export interface ChangeMeta {
  changesFigures?: boolean;
  invalidates?: readonly QueryKey[];
}

declare module "@tanstack/react-query" {
  interface Register {
    mutationMeta: ChangeMeta;
  }
}

export function invalidateFamilies(queryClient: QueryClient, families: readonly QueryKey[]): Promise<void> {
  // A refetch already under way (from another invalidation) is kept rather than cancelled and started again.
  return Promise.all(families.map((queryKey) => queryClient.invalidateQueries({ queryKey }, { cancelRefetch: false }))).then(() => undefined);
}

export function invalidateFigures(queryClient: QueryClient): Promise<void> {
  return invalidateFamilies(queryClient, figureQueryFamilies);
}

/** The families a successful mutation with this meta makes stale. */
export function familiesChangedBy(meta: ChangeMeta | undefined): readonly QueryKey[] {
  return [...(meta?.changesFigures ? figureQueryFamilies : []), ...(meta?.invalidates ?? [])];
}

/** The server's token for its database state; asked for again whenever the window regains focus. */
export const dataVersionQuery = {
  all: () => ["data-version"] as const,
  current: () => ({
    queryKey: dataVersionQuery.all(),
    queryFn: ({ signal }: { signal: AbortSignal }) => getParsed(dataVersionAnswerSchema, "/api/data-version", signal),
  }),
};
