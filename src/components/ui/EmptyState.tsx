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
          <svg viewBox="0 0 24 24" className="size-7" fill="none" stroke="currentColor" strokeWidth="2" strokeLinecap="round" strokeLinejoin="round">
            <path d="M3 11.5Q12 17 21 11.5" />
            <path d="M12 3v6M9.5 6.8 12 9.3l2.5-2.5" />
            <path d="M2.5 20h4l-2-4.5zM17.5 20h4l-2-4.5z" fill="currentColor" stroke="none" />
          </svg>
        )}
      </div>
      <h2 className="text-base font-semibold text-ink">{title}</h2>
      {children && <div className="mt-1.5 max-w-prose text-sm text-ink-muted">{children}</div>}
      {action && <div className="mt-5">{action}</div>}
    </div>
  );
}
