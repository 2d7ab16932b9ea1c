// Quarterbeat's mark: a year split into four quarters, one quarter lit, with a single beat running
// through it — steady work, reviewed a quarter at a time.
import clsx from "clsx";

export function LogoMark({ className, tone = "onDark" }: { className?: string; tone?: "onDark" | "onLight" }) {
  const ring = tone === "onDark" ? "#C6C2EA" : "#3F3A8C";
  const pulse = tone === "onDark" ? "#FFFFFF" : "#1C1B2E";
  return (
    <svg viewBox="0 0 32 32" className={clsx("size-8 shrink-0", className)} aria-hidden="true" focusable="false">
      <circle cx="16" cy="16" r="13" fill="none" stroke={ring} strokeWidth="2" />
      <path d="M16 16V3a13 13 0 0 1 13 13z" fill="#E8A33D" />
      <path d="M16 3v26M3 16h26" stroke={ring} strokeWidth="1.2" opacity="0.7" />
      <path
        d="M1.5 18h8.5l2-5.5 3.2 11 3.3-15 2.5 9.5H30.5"
        fill="none"
        stroke={pulse}
        strokeWidth="2.4"
        strokeLinecap="round"
        strokeLinejoin="round"
      />
    </svg>
  );
}

/** Mark + name. The name is real text, so it reads as "Quarterbeat". */
export function Logo({ className, tone = "onDark", size = "md" }: { className?: string; tone?: "onDark" | "onLight"; size?: "md" | "lg" }) {
  return (
    <span className={clsx("inline-flex items-center", size === "lg" ? "gap-3" : "gap-2", className)}>
      <LogoMark tone={tone} className={size === "lg" ? "size-11" : undefined} />
      <span
        className={clsx("font-bold tracking-tight", size === "lg" ? "text-headline" : "text-lead", tone === "onDark" ? "text-white" : "text-ink")}
      >
        Quarter<span className={tone === "onDark" ? "text-marigold-300" : "text-dusk-700"}>beat</span>
      </span>
    </span>
  );
}
