import { useId } from "react";

export interface ProgressBarProps {
  label: string;
  /** 0–1, or null while the total is not known (the bar then shows activity only). */
  fraction: number | null;
  /** e.g. "3.1 MB of 20 MB, 41 200 rows". */
  detail?: string;
}

/** A labelled progress bar that screen readers announce politely as it moves. */
export function ProgressBar({ label, fraction, detail }: ProgressBarProps) {
  const labelId = useId();
  const percent = fraction === null ? null : Math.round(Math.min(1, Math.max(0, fraction)) * 100);
  return (
    <div className="flex flex-col gap-1" role="status">
      <div className="flex flex-wrap items-baseline justify-between gap-2 text-small">
        <span id={labelId} className="font-semibold">
          {label}
        </span>
        <span className="text-muted tabular-nums">
          {percent !== null && `${percent} %`}
          {percent !== null && detail ? " · " : ""}
          {detail}
        </span>
      </div>
      <div
        role="progressbar"
        aria-labelledby={labelId}
        aria-valuemin={0}
        aria-valuemax={100}
        aria-valuenow={percent ?? undefined}
        aria-valuetext={percent === null ? "working" : `${percent} %`}
        className="h-3 overflow-hidden rounded-full border border-line-strong bg-paper"
      >
        <div
          className={percent === null ? "h-full w-1/3 animate-pulse bg-dusk-500" : "h-full bg-dusk-600 transition-[width]"}
          style={percent === null ? undefined : { width: `${percent}%` }}
        />
      </div>
    </div>
  );
}
