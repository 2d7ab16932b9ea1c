import clsx from "clsx";
import type { ReactNode } from "react";

export type NoticeTone = "success" | "info" | "error";

const tones: Record<NoticeTone, string> = {
  success: "border-on-target-text/40 bg-on-target-tint text-on-target-text",
  info: "border-dusk-200 bg-dusk-50 text-dusk-800",
  error: "border-danger-line bg-danger-tint text-danger-text",
};

const marks: Record<NoticeTone, string> = { success: "✓", info: "i", error: "!" };

/**
 * A one-line message after an action ("Site renamed."). Success and info are polite status messages;
 * errors are alerts. The message keeps its mark and wording, so colour is never the only signal.
 */
export function Notice({ tone = "info", children, className }: { tone?: NoticeTone; children: ReactNode; className?: string }) {
  return (
    <div
      role={tone === "error" ? "alert" : "status"}
      className={clsx("flex items-start gap-2 rounded-control border px-3 py-2 text-small font-medium", tones[tone], className)}
    >
      <span aria-hidden="true" className="inline-flex size-5 shrink-0 items-center justify-center rounded-full border border-current text-caption font-bold">
        {marks[tone]}
      </span>
      <span className="pt-px">{children}</span>
    </div>
  );
}
