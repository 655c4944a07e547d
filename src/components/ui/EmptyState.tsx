import type { ReactNode } from "react";
import { cn } from "@/lib/cn";

interface EmptyStateProps {
  title: ReactNode;
  children?: ReactNode;
  /** A button or link that gets the person going. */
  action?: ReactNode;
  icon?: ReactNode;
  className?: string;
}

export function EmptyState({ title, children, action, icon, className }: EmptyStateProps) {
  return (
    <div className={cn("flex flex-col items-center rounded-[var(--radius-card)] border border-dashed border-line-strong bg-surface/60 px-6 py-12 text-center", className)}>
      <div aria-hidden className="mb-4 flex size-12 items-center justify-center rounded-full bg-accent-soft text-accent">
        {icon ?? (
          <svg viewBox="0 0 24 24" className="size-6" fill="none" stroke="currentColor" strokeWidth="1.8" strokeLinecap="round">
            <path d="M3 14q9 6 18 0" />
            <path d="M3 19h4M17 19h4" />
            <path d="M12 4v6" />
          </svg>
        )}
      </div>
      <h2 className="text-base font-semibold text-ink">{title}</h2>
      {children && <div className="mt-1.5 max-w-prose text-sm text-ink-muted">{children}</div>}
      {action && <div className="mt-5">{action}</div>}
    </div>
  );
}
