import type { ReactNode } from "react";

export interface PageHeaderProps {
  title: string;
  /** One or two sentences saying what the page is for. */
  description?: ReactNode;
  /** Buttons or links that act on the whole page (export, add…). */
  actions?: ReactNode;
}

// In a page laid out as a column with gaps the gap spaces the header; its own margin would add to it.
export function PageHeader({ title, description, actions }: PageHeaderProps) {
  return (
    <header className="mb-6 flex flex-wrap items-end justify-between gap-4 border-b border-line pb-4 [.flex-col>&]:mb-0">
      <div className="max-w-3xl">
        <h1 className="text-headline text-ink">{title}</h1>
        {description && <p className="mt-1 text-lead text-muted">{description}</p>}
      </div>
      {actions && <div className="flex flex-wrap gap-2">{actions}</div>}
    </header>
  );
}
