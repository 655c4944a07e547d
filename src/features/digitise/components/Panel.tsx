import type { ReactNode } from "react";
import { cn } from "@/lib/cn";

/** One section of the side panel. */
export function Panel({ title, aside, children, className }: { title: string; aside?: ReactNode; children: ReactNode; className?: string }) {
  return (
    <section className={cn("border-b border-line px-4 py-3", className)} aria-label={title}>
      <div className="mb-2 flex items-center justify-between gap-2">
        <h2 className="text-[13px] font-semibold tracking-wide text-ink uppercase">{title}</h2>
        {aside}
      </div>
      {children}
    </section>
  );
}

export function Kbd({ children }: { children: ReactNode }) {
  return <kbd className="inline-flex h-5 min-w-5 items-center justify-center rounded border border-line-strong bg-sunken px-1 font-mono text-[11px] text-ink-muted">{children}</kbd>;
}
