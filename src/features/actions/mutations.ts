// Recording and changing improvement actions. Their evaluations are figures, so a write of attempts
// (figureQueryFamilies lists the actions family) refreshes them too; a write of an action refreshes the
// action lists, the pages and the chart marks.
import { useMutation } from "@tanstack/react-query";
import type { ActionChanges, ActionNote, ActionRow, NewAction, NewActionNote } from "../../../shared/schemas/actions";
import { http } from "../../api/http";
import { actionQueries } from "./queries";

const meta = { invalidates: [actionQueries.all()] };

export function useCreateAction() {
  return useMutation({ mutationFn: (action: NewAction) => http.post<{ action: ActionRow }>("/api/actions", action), meta });
}

export function useUpdateAction() {
  return useMutation({
    mutationFn: ({ id, changes }: { id: number; changes: ActionChanges }) => http.patch<{ action: ActionRow }>(`/api/actions/${id}`, changes),
    meta,
  });
}

export function useAddNote() {
  return useMutation({
    mutationFn: ({ actionId, note }: { actionId: number; note: NewActionNote }) => http.post<{ note: ActionNote }>(`/api/actions/${actionId}/notes`, note),
    meta,
  });
}
