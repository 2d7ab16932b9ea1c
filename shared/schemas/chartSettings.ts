// The control chart's baseline (GET/PUT /api/settings/chart-baseline): the quarters whose pass rate sets the
// overview p-chart's centre line and limits. Without a setting it is the first four quarters with attempts.
import { z } from "zod";
import { quarterParamSchema } from "../filters";
import { isoDateSchema } from "./isoDate";

/** How many quarters with attempts make the default baseline. */
export const DEFAULT_BASELINE_QUARTERS = 4;

export const chartBaselineSettingSchema = z
  .object({ from: quarterParamSchema, to: quarterParamSchema })
  .refine((value) => value.from <= value.to, { path: ["to"], message: "The end of the baseline must not come before its start" });
export type ChartBaselineSetting = z.infer<typeof chartBaselineSettingSchema>;

/** PUT body: a range, or null to go back to the default. */
export const saveChartBaselineSchema = z.object({ baseline: chartBaselineSettingSchema.nullable() });

export const chartBaselineSchema = z.object({
  /** null when no quarter holds attempts yet. */
  from: z.string().nullable(),
  to: z.string().nullable(),
  /** `setting`: chosen by a coordinator; `default`: the first four quarters with attempts. */
  source: z.enum(["setting", "default"]),
});
export type ChartBaseline = z.infer<typeof chartBaselineSchema>;

/** `laney` widens the limits by Laney's σ_z (for quarters with many attempts); `binomial` keeps them plain. */
export const chartLimitModes = ["binomial", "laney"] as const;
/** The overview p-chart's options: its limits, and a date to split it at (an improvement action's start). */
export const overviewChartQuerySchema = z.object({
  limits: z.enum(chartLimitModes, { error: `Use one of ${chartLimitModes.join(", ")}` }).default("binomial"),
  split: isoDateSchema.optional(),
});
export interface OverviewChartOptions {
  limits: (typeof chartLimitModes)[number];
  /** "YYYY-MM-DD", or null for one phase. */
  splitAt: string | null;
}
