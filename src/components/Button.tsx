import clsx from "clsx";
import type { ButtonHTMLAttributes } from "react";

export type ButtonVariant = "primary" | "secondary" | "quiet" | "danger" | "dangerQuiet";

export interface ButtonProps extends ButtonHTMLAttributes<HTMLButtonElement> {
  variant?: ButtonVariant;
  size?: "sm" | "md";
  /** Shows a working state and blocks repeat clicks while a request runs. */
  busy?: boolean;
}

const variants: Record<ButtonVariant, string> = {
  primary: "bg-dusk-700 text-white hover:bg-dusk-800 border-dusk-700",
  secondary: "bg-surface text-dusk-800 border-line-strong hover:bg-dusk-50",
  quiet: "bg-transparent text-dusk-700 border-transparent hover:bg-dusk-50 underline-offset-2 hover:underline",
  danger: "bg-surface text-danger-text border-danger-line hover:bg-danger-tint",
  dangerQuiet: "bg-transparent text-danger-text border-transparent hover:bg-danger-tint underline-offset-2 hover:underline",
};

const sizes = { sm: "min-h-9 px-2.5 text-small", md: "min-h-11 px-4 text-body" };

export function Button({ variant = "primary", size = "md", busy = false, className, children, disabled, type, ...rest }: ButtonProps) {
  return (
    <button
      type={type ?? "button"}
      className={clsx(
        "inline-flex items-center justify-center gap-2 rounded-control border font-medium whitespace-nowrap transition-colors",
        "disabled:cursor-not-allowed disabled:opacity-60",
        variants[variant],
        sizes[size],
        className,
      )}
      disabled={disabled || busy}
      aria-busy={busy || undefined}
      {...rest}
    >
      {busy && <Spinner />}
      {children}
    </button>
  );
}

export function Spinner({ className }: { className?: string }) {
  return (
    <svg className={clsx("size-4 animate-spin", className)} viewBox="0 0 24 24" aria-hidden="true">
      <circle cx="12" cy="12" r="9" fill="none" stroke="currentColor" strokeOpacity="0.25" strokeWidth="3" />
      <path d="M21 12a9 9 0 0 0-9-9" fill="none" stroke="currentColor" strokeWidth="3" strokeLinecap="round" />
    </svg>
  );
}
