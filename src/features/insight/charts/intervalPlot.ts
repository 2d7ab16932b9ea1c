// Rates side by side as horizontal bars with their 95 % interval drawn as a whisker, and the value written at
// the end of each bar. Used wherever two or three groups' pass rates are compared.
import * as Plot from "@observablehq/plot";
import type { ChartSize } from "../../../components/Chart";
import { ink, percentTick } from "../chartStyle";
import { formatPercent } from "../format";

export interface IntervalBar {
  label: string;
  /** Used instead of the label on narrow screens. */
  shortLabel?: string;
  rate: number | null;
  low: number | null;
  high: number | null;
  fill?: string;
}

export function intervalBarsPlot(bars: readonly IntervalBar[], { width }: ChartSize, marginLeft = 150): Plot.PlotOptions {
  const narrow = width < 420;
  const named = bars.map((b) => ({ ...b, label: narrow && b.shortLabel ? b.shortLabel : b.label }));
  const shown = named.filter((b) => b.rate !== null);
  return {
    height: bars.length * 56 + 50,
    marginLeft: narrow ? Math.min(marginLeft, 96) : marginLeft,
    marginRight: 20,
    x: { domain: [0, 1], tickFormat: percentTick, label: null, grid: true, ticks: width < 700 ? 5 : 10 },
    y: { domain: named.map((b) => b.label), label: null, padding: 0.35 },
    marks: [
      Plot.barX(shown, { x: "rate", y: "label", fill: (b: IntervalBar) => b.fill ?? ink.main }),
      Plot.link(shown, { x1: "low", x2: "high", y1: "label", y2: "label", stroke: ink.text, strokeWidth: 1.5 }),
      Plot.tickX(shown, { x: "low", y: "label", stroke: ink.text, strokeWidth: 1.5, inset: 14 } as Plot.TickXOptions),
      Plot.tickX(shown, { x: "high", y: "label", stroke: ink.text, strokeWidth: 1.5, inset: 14 } as Plot.TickXOptions),
      Plot.text(shown, {
        x: "high",
        y: "label",
        text: (b: IntervalBar) => formatPercent(b.rate),
        dx: 6,
        textAnchor: "start",
        fill: ink.text,
        fontWeight: 600,
      }),
      Plot.ruleX([0]),
    ],
  };
}
