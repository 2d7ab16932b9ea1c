// Quarterbeat's mark (shared/markGeometry.ts): a network of four nodes on a ring, one quarter filled. Drawn from
// filled and stroked shapes only, so it reads in one colour and at 16 px.
import clsx from "clsx";
import { markGeometry } from "../../shared/markGeometry";

export function LogoMark({ className, tone = "onDark" }: { className?: string; tone?: "onDark" | "onLight" }) {
  const line = tone === "onDark" ? "#E2E0F4" : "#3F3A8C";
  return (
    <svg viewBox="0 0 32 32" className={clsx("size-8 shrink-0", className)} aria-hidden="true" focusable="false">
      <path d={markGeometry.quarter} fill="#E8A33D" />
      {markGeometry.arcs.map((d) => (
        <path key={d} d={d} fill="none" stroke={line} strokeWidth={markGeometry.arcWidth} strokeLinecap="round" />
      ))}
      {markGeometry.nodes.map(([cx, cy]) => (
        <circle key={`${cx},${cy}`} cx={cx} cy={cy} r={markGeometry.nodeRadius} fill={line} />
      ))}
    </svg>
  );
}

/** Mark + name. The name is real text, so it reads as "Quarterbeat". */
export function Logo({ className, tone = "onDark", size = "md" }: { className?: string; tone?: "onDark" | "onLight"; size?: "md" | "lg" }) {
  return (
    <span className={clsx("inline-flex items-center", size === "lg" ? "gap-3" : "gap-2", className)}>
      <LogoMark tone={tone} className={size === "lg" ? "size-11" : undefined} />
      <span className={clsx("font-bold tracking-tight", size === "lg" ? "text-headline" : "text-lead", tone === "onDark" ? "text-white" : "text-ink")}>
        Quarter<span className={tone === "onDark" ? "text-marigold-300" : "text-dusk-700"}>beat</span>
      </span>
    </span>
  );
}
