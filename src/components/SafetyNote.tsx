import clsx from "clsx";

export const safetyNoteText =
  "Quarterbeat is a training-quality tool, not a medical device. Learners follow current resuscitation guidelines, their training organisation and local protocols.";

/** The caution shown wherever targets, scores or advice appear. */
export function SafetyNote({ compact = false, className }: { compact?: boolean; className?: string }) {
  return (
    <aside
      aria-label="About these targets"
      className={clsx(
        "flex items-start gap-2 rounded-control border border-marigold-300 bg-marigold-100 text-ink",
        compact ? "px-3 py-2 text-caption" : "px-4 py-3 text-small",
        className,
      )}
    >
      <svg viewBox="0 0 20 20" className="mt-0.5 size-4 shrink-0 text-marigold-700" aria-hidden="true">
        <circle cx="10" cy="10" r="8.5" fill="none" stroke="currentColor" strokeWidth="1.8" />
        <path d="M10 5.5v6M10 14v.5" stroke="currentColor" strokeWidth="2" strokeLinecap="round" />
      </svg>
      <p>{safetyNoteText}</p>
    </aside>
  );
}
