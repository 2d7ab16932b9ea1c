// What a page shows while data loads, when there is none, and when the request failed.
import type { ReactNode } from "react";
import { ApiError } from "../api/http";
import { Button, Spinner } from "./Button";

export function LoadingState({ label = "Loading…" }: { label?: string }) {
  return (
    <div role="status" className="flex items-center gap-3 rounded-card border border-line bg-surface p-6 text-muted">
      <Spinner className="size-5 text-dusk-600" />
      <span>{label}</span>
    </div>
  );
}

export interface EmptyStateProps {
  title: string;
  children?: ReactNode;
  /** A next step, such as a link to the import page. */
  action?: ReactNode;
}

export function EmptyState({ title, children, action }: EmptyStateProps) {
  return (
    <div className="flex flex-col items-start gap-2 rounded-card border border-dashed border-line-strong bg-surface p-6">
      <p className="text-lead font-semibold text-ink">{title}</p>
      {children && <div className="text-muted">{children}</div>}
      {action}
    </div>
  );
}

export interface ErrorStateProps {
  error: unknown;
  title?: string;
  onRetry?: () => void;
}

export function errorMessage(error: unknown): string {
  if (error instanceof ApiError) return error.message;
  if (error instanceof TypeError) return "The server could not be reached. Check the connection and try again.";
  return "Something went wrong. Try again in a moment.";
}

export function ErrorState({ error, title = "This could not be loaded", onRetry }: ErrorStateProps) {
  return (
    <div role="alert" className="flex flex-col items-start gap-2 rounded-card border border-danger-line bg-danger-tint p-6">
      <p className="text-lead font-semibold text-danger-text">{title}</p>
      <p className="text-ink">{errorMessage(error)}</p>
      {onRetry && (
        <Button variant="secondary" size="sm" onClick={onRetry}>
          Try again
        </Button>
      )}
    </div>
  );
}
