import clsx from "clsx";

/** "Active" / "Deactivated" with a filled or hollow dot, so the state reads without colour. */
export function ActiveBadge({ active, inactiveLabel = "Deactivated" }: { active: boolean; inactiveLabel?: string }) {
  return (
    <span
      className={clsx(
        "inline-flex items-center gap-1.5 rounded-full border px-2 py-0.5 text-caption font-semibold whitespace-nowrap",
        active ? "border-dusk-300 bg-dusk-50 text-dusk-800" : "border-line-strong bg-paper text-muted",
      )}
    >
      <svg viewBox="0 0 10 10" className="size-2.5" aria-hidden="true">
        <circle cx="5" cy="5" r="4" fill={active ? "currentColor" : "none"} stroke="currentColor" strokeWidth="1.5" />
      </svg>
      {active ? "Active" : inactiveLabel}
    </span>
  );
}
