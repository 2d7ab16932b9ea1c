// The monthly run chart of an aim (server/metrics/monthlyRunChart.ts): one point per calendar month of the
// class date with attempts, the median, and the run-chart rules of Anhøj & Olesen 2014. Rates are fractions.
import { z } from "zod";
import { aimFigures, evaluationPhases } from "./actions";

const count = z.number().int().min(0);

export const monthPointSchema = z.object({
  /** YYYY-MM */
  period: z.string(),
  n: count,
  /** Attempts counted: passed, or failing on the aim's error. */
  x: count,
  rate: z.number(),
  /** Before, in or after an action's start; null when the chart is not split. */
  phase: z.enum(evaluationPhases).nullable(),
});
export type MonthPoint = z.infer<typeof monthPointSchema>;

/** The rules around a median; the limits are null without a useful point. */
export const runChartRulesSchema = z.object({
  median: z.number().nullable(),
  /** Points not exactly on the median. */
  useful: count,
  longestRun: count,
  /** A run longer than this signals a shift: round(log2(useful) + 3). */
  longestRunLimit: count.nullable(),
  crossings: count,
  /** Fewer crossings than this signal a shift: the 5th percentile of Binomial(useful − 1, 0.5). */
  crossingsLimit: count.nullable(),
  signal: z.boolean(),
});
export type RunChartRules = z.infer<typeof runChartRulesSchema>;

/** One side of an action's start with its own centre line, and the rules within that side. */
export const phaseCentreSchema = z.object({
  phase: z.enum(["before", "after"]),
  from: z.string(),
  to: z.string(),
  median: z.number().nullable(),
  rules: runChartRulesSchema,
});
export type PhaseCentre = z.infer<typeof phaseCentreSchema>;

/**
 * The rules judge every month around the median, or, when the chart is split at an action's start, the months
 * after the start around the median of the months before it.
 */
export const monthlyRunChartSchema = runChartRulesSchema.extend({
  aim: z.enum(aimFigures),
  /** The months the median is taken over. */
  baseline: z.object({ from: z.string(), to: z.string(), months: count }).nullable(),
  points: z.array(monthPointSchema),
  /** Before and after an action's start, each with its own median; empty when the chart is not split. */
  phases: z.array(phaseCentreSchema),
});
export type MonthlyRunChart = z.infer<typeof monthlyRunChartSchema>;

/** GET /api/actions/:id/monthly: null when the viewer may not see the scope's months. */
export const actionMonthlyAnswerSchema = z.object({ chart: monthlyRunChartSchema.nullable() });
