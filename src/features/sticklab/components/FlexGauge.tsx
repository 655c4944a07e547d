import { cn } from "@/lib/cn";
import { formatPercent } from "../lib/format";

const MAX = 120;

/** % of rated flex as a bar, with the rating (100 %) and the team's alert level marked. */
export function FlexGauge({ percent, alertPercent, className }: { percent: number | null; alertPercent: number; className?: string }) {
  const at = (p: number) => `${(Math.min(Math.max(p, 0), MAX) / MAX) * 100}%`;
  const below = percent !== null && percent < alertPercent;
  return (
    <div className={cn("relative h-2.5 w-full rounded-full bg-sunken", className)} role="img" aria-label={percent === null ? "No rating to compare with" : `${formatPercent(percent)} of rated flex; alert below ${alertPercent} %`}>
      {percent !== null && <div className={cn("absolute inset-y-0 left-0 rounded-full", below ? "bg-warn" : "bg-accent")} style={{ width: at(percent) }} />}
      <span aria-hidden className="absolute -top-1 -bottom-1 w-0.5 rounded bg-warn/70" style={{ left: at(alertPercent) }} title={`Alert level ${alertPercent} %`} />
      <span aria-hidden className="absolute -top-1 -bottom-1 w-0.5 rounded bg-ink-muted" style={{ left: at(100) }} title="Rated flex" />
    </div>
  );
}
