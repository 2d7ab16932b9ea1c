// The list of improvement actions with each one's current verdict (higher, lower, no clear change), as the
// Improvement actions page and `quarterbeat actions list` show it.
import type { ActionEvaluation, ActionListRow, ActionRow } from "../../shared/schemas/actions";

/** `evaluationOf` answers the evaluation as the reader may see it, or null when they may not. */
export function withVerdicts(actions: readonly ActionRow[], evaluationOf: (action: ActionRow) => ActionEvaluation | null): ActionListRow[] {
  return actions.map((action) => ({ ...action, verdict: evaluationOf(action)?.verdict ?? null }));
}
