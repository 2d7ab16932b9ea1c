// On target / too low / too high: colour-blind-safe colours, and always a shape and a word as well.
import clsx from "clsx";

export type TargetStatus = "on_target" | "too_low" | "too_high";

export const targetStatusLabels: Record<TargetStatus, string> = {
  on_target: "On target",
  too_low: "Too low",
  too_high: "Too high",
};

const styles: Record<TargetStatus, string> = {
  on_target: "bg-on-target-tint text-on-target-text border-on-target-mark",
  too_low: "bg-too-low-tint text-too-low-text border-too-low-mark",
  too_high: "bg-too-high-tint text-too-high-text border-too-high-mark",
};

/** The shapes: a filled circle for on target, a triangle pointing down for too low, up for too high. */
export function TargetMark({ status, className }: { status: TargetStatus; className?: string }) {
  return (
    <svg viewBox="0 0 12 12" className={clsx("size-3 shrink-0", className)} aria-hidden="true">
      {status === "on_target" && <circle cx="6" cy="6" r="5" fill="currentColor" />}
      {status === "too_low" && <path d="M1 2.5h10L6 11z" fill="currentColor" />}
      {status === "too_high" && <path d="M1 9.5h10L6 1z" fill="currentColor" />}
    </svg>
  );
}

export interface TargetBadgeProps {
  status: TargetStatus;
  /** Replaces the default word, e.g. "Depth too shallow"; keep the meaning of the status. */
  label?: string;
  className?: string;
}

export function TargetBadge({ status, label, className }: TargetBadgeProps) {
  return (
    <span className={clsx("inline-flex items-center gap-1.5 rounded-full border px-2 py-0.5 text-caption font-semibold", styles[status], className)}>
      <TargetMark status={status} />
      {label ?? targetStatusLabels[status]}
    </span>
  );
}

/** A legend for charts that use the target-status colours and shapes (see lib/chartScales.ts). */
export function TargetLegend({ statuses = ["too_low", "on_target", "too_high"], className }: { statuses?: readonly TargetStatus[]; className?: string }) {
  const marks: Record<TargetStatus, string> = { on_target: "text-on-target-mark", too_low: "text-too-low-mark", too_high: "text-too-high-mark" };
  return (
    <ul className={clsx("flex flex-wrap gap-x-4 gap-y-1 text-caption text-ink", className)} aria-label="Legend">
      {statuses.map((status) => (
        <li key={status} className="inline-flex items-center gap-1.5">
          <TargetMark status={status} className={marks[status]} />
          {targetStatusLabels[status]}
        </li>
      ))}
    </ul>
  );
}
