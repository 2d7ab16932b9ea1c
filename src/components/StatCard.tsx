// One headline number with its label, and optionally its uncertainty and its change since last time.
import clsx from "clsx";
import type { ReactNode } from "react";
import { TargetBadge, type TargetStatus } from "./TargetBadge";

export interface StatInterval {
  low: string | number;
  high: string | number;
  /** e.g. "95 % interval". */
  label?: string;
}

export interface StatChange {
  /** Signed change; its sign picks the arrow. */
  value: number;
  /** The change as people should read it, e.g. "+4.2 points". */
  text: string;
  /** What it is compared with, e.g. "since Q1 2025". */
  comparedWith?: string;
  /** Which direction is an improvement; omit when neither is. */
  better?: "up" | "down";
  /** False when the change is within chance variation: it reads "no clear change" and is not coloured. */
  clear?: boolean;
}

export interface StatCardProps {
  label: string;
  value: ReactNode;
  unit?: string;
  interval?: StatInterval;
  change?: StatChange;
  status?: TargetStatus;
  /** The badge's words when the default ("Too low", …) would not say which way a value missed. */
  statusLabel?: string;
  /** A short note under the number, e.g. "n = 263 attempts". */
  footnote?: ReactNode;
  className?: string;
}

export function StatCard({ label, value, unit, interval, change, status, statusLabel, footnote, className }: StatCardProps) {
  return (
    <section className={clsx("flex flex-col gap-1 rounded-card border border-line bg-surface p-4 shadow-card", className)}>
      <h3 className="text-small font-semibold text-muted">{label}</h3>
      <p className="flex items-baseline gap-1">
        <span className="text-display tabular-nums text-ink">{value}</span>
        {unit && <span className="text-lead text-muted">{unit}</span>}
      </p>
      {interval && (
        <p className="text-caption text-muted tabular-nums">
          {interval.label ?? "95 % interval"}: {interval.low}–{interval.high}
        </p>
      )}
      {change && <ChangeLine change={change} />}
      {status && <TargetBadge status={status} label={statusLabel} className="self-start" />}
      {footnote && <p className="text-caption text-muted">{footnote}</p>}
    </section>
  );
}

function ChangeLine({ change }: { change: StatChange }) {
  const direction = change.value > 0 ? "up" : change.value < 0 ? "down" : "flat";
  const verdict = change.clear === false ? "no clear change" : direction === "flat" || !change.better ? null : direction === change.better ? "better" : "worse";
  return (
    <p
      className={clsx(
        "flex items-center gap-1 text-small font-medium tabular-nums",
        verdict === "better" ? "text-on-target-text" : verdict === "worse" ? "text-too-high-text" : "text-muted",
      )}
    >
      <svg viewBox="0 0 12 12" className="size-3" aria-hidden="true">
        {direction === "up" && <path d="M1 9.5h10L6 1z" fill="currentColor" />}
        {direction === "down" && <path d="M1 2.5h10L6 11z" fill="currentColor" />}
        {direction === "flat" && <path d="M1 6h10" stroke="currentColor" strokeWidth="2" />}
      </svg>
      <span>
        {direction === "flat" ? "No change" : change.text}
        {change.comparedWith && ` ${change.comparedWith}`}
        {verdict && ` (${verdict})`}
      </span>
    </p>
  );
}
