// Scales for Observable Plot that match the rest of the product: the target-status colours and shapes
// (never colour alone), and labels for the legend and tooltips.
import type { TargetStatus } from "../components/TargetBadge";
import { targetStatusLabels } from "../components/TargetBadge";
import { status } from "../styles/palette";

export const targetStatusOrder: readonly TargetStatus[] = ["too_low", "on_target", "too_high"];

/** Plot colour scale: `color: targetStatusColorScale` with a channel holding TargetStatus values. */
export const targetStatusColorScale = {
  type: "categorical" as const,
  domain: [...targetStatusOrder],
  range: [status.tooLow.mark, status.onTarget.mark, status.tooHigh.mark],
  tickFormat: (value: TargetStatus) => targetStatusLabels[value],
};

/** Plot symbol scale: circle for on target, triangles for off target (rotate too-low ones by 180°). */
export const targetStatusSymbolScale = {
  domain: [...targetStatusOrder],
  range: ["triangle", "circle", "triangle"],
};

/** Rotation for a dot mark: too low points down, too high points up. */
export const targetStatusRotate = (value: TargetStatus) => (value === "too_low" ? 180 : 0);
