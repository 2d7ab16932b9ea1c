// Colours and axis formats shared by the insight charts (values from the product palette).
import { quarterLabel } from "../../../shared/period";
import { chartSeries, dusk, marigold, neutral, status } from "../../styles/palette";

export const ink = {
  main: dusk[700],
  soft: dusk[300],
  limit: neutral.muted,
  grid: neutral.line,
  text: neutral.ink,
  accent: marigold[500],
  accentDark: marigold[700],
  above: status.onTarget.mark,
  below: status.tooHigh.mark,
  network: chartSeries[7],
} as const;

/** Axis ticks for shares: 0.3 → "30 %". */
export const percentTick = (value: number) => `${Math.round(value * 100)} %`;

/** Quarter ticks: "2026 Q3", or on a narrow chart, where eight of those run into each other, "Q3" over "2026"
 *  (give such a chart about 40 px of bottom margin). */
export const quarterTick = (width: number) => (q: string) => (width < 560 ? `${q.slice(5)}\n${q.slice(0, 4)}` : quarterLabel(q));

/** The top of a share axis: the largest value with some air, rounded up to 10 %, never above 100 %. */
export function shareAxisTop(values: readonly (number | null | undefined)[], floor = 0.5): number {
  const largest = Math.max(floor, ...values.filter((v): v is number => typeof v === "number" && Number.isFinite(v)));
  return Math.min(1, Math.ceil((largest + 0.04) * 10) / 10);
}
