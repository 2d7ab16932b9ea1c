// Improvement actions drawn on a quarterly trend chart: a dashed line at the quarter each action starts in,
// labelled with a number that the chart's description and tooltip explain.
import * as Plot from "@observablehq/plot";
import { quarterLabel } from "../../../shared/period";
import type { ActionMark } from "../../../shared/schemas/actions";
import { ink } from "../insight/chartStyle";
import { formatDay } from "../../lib/formatting";

/** Only actions starting in one of the chart's quarters can be placed on its axis. */
function onAxis(marks: readonly ActionMark[], quarters: readonly string[]): ActionMark[] {
  return marks.filter((mark) => quarters.includes(mark.quarter));
}

export function actionMarkLayers(marks: readonly ActionMark[], quarters: readonly string[]): Plot.Markish[] {
  const shown = onAxis(marks, quarters).map((mark, index) => ({ ...mark, label: `A${index + 1}` }));
  return [
    Plot.ruleX(shown, { x: "quarter", stroke: ink.accentDark, strokeDasharray: "3 3", strokeWidth: 1.5 }),
    Plot.text(shown, {
      x: "quarter",
      frameAnchor: "top",
      dy: -14,
      text: "label",
      fill: ink.accentDark,
      fontWeight: 600,
      title: (mark: ActionMark) => `${mark.title}, from ${formatDay(mark.startDate)}`,
    }),
  ];
}

/** The marks in words, for the chart's description: "Improvement actions: A1 Depth refresher (from 15 Feb 2026, 2026 Q1)." */
export function describeActionMarks(marks: readonly ActionMark[], quarters: readonly string[]): string {
  const shown = onAxis(marks, quarters);
  if (shown.length === 0) return "";
  const items = shown.map((mark, index) => `A${index + 1} ${mark.title} (from ${formatDay(mark.startDate)}, ${quarterLabel(mark.quarter)})`);
  return ` Improvement actions marked: ${items.join("; ")}.`;
}
