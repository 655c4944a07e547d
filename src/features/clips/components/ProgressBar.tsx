import { cn } from "@/lib/cn";

/** A thin bar with the share done; `label` is read out and shown beside it. */
export function ProgressBar({ value, label, tone = "accent", className }: { value: number; label: string; tone?: "accent" | "warn" | "danger"; className?: string }) {
  const pct = Math.round(Math.max(0, Math.min(1, value)) * 100);
  const fill = { accent: "bg-accent", warn: "bg-gold", danger: "bg-danger" }[tone];
  return (
    <div className={cn("flex min-w-0 items-center gap-2", className)}>
      <div role="progressbar" aria-valuemin={0} aria-valuemax={100} aria-valuenow={pct} aria-label={label} className="h-2 min-w-16 flex-1 overflow-hidden rounded-full bg-sunken">
        <div className={cn("h-full rounded-full transition-[width] duration-300", fill)} style={{ width: `${pct}%` }} />
      </div>
      <span className="shrink-0 text-xs text-ink-muted tabular-nums">{label}</span>
    </div>
  );
}
