// Error Pareto rows from per-error counts: the shared Pareto plus each error's share of attempts and its label.
import type { z } from "zod";
import type { paretoSchema } from "../../shared/schemas/insight";
import { type AttemptError } from "../../shared/scoring/scoreAttempt";
import { pareto } from "../../shared/stats";
import { errorLabels } from "../../shared/vocabulary";

export type ParetoAnswer = z.infer<typeof paretoSchema>;

export function techniqueErrorPareto(counts: Record<AttemptError, number>, attemptCount: number, hidden: boolean): ParetoAnswer {
  if (hidden) return { attempts: null, rows: [], suppressed: true };
  return {
    attempts: attemptCount,
    rows: pareto(counts).map((row) => ({
      error: row.name as AttemptError,
      label: errorLabels[row.name as AttemptError],
      count: row.count,
      share: row.share,
      cumulativeShare: row.cumulativeShare,
      attemptShare: attemptCount === 0 ? 0 : row.count / attemptCount,
    })),
    suppressed: false,
  };
}
