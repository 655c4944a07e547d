import { Link } from "react-router-dom";
import type { StickRow } from "@shared/schemas/sticks";
import { Badge } from "@/components/ui";
import { formatDay, formatFlex, formatPercent, formatRated } from "../lib/format";
import { FlexGauge } from "./FlexGauge";

/** One stick in the list: who uses it, what it was rated, what it measures now. */
export function StickCard({ stick, alertPercent }: { stick: StickRow; alertPercent: number }) {
  const { latest } = stick;
  return (
    <Link
      to={stick.id}
      className="group flex h-full flex-col gap-4 rounded-[var(--radius-card)] border border-line bg-surface p-5 shadow-[var(--shadow-card)] transition-colors hover:border-accent/50"
    >
      <div className="flex items-start justify-between gap-3">
        <div className="min-w-0">
          <h2 className="truncate text-base font-semibold text-ink group-hover:text-accent-strong">{stick.label}</h2>
          <p className="text-sm text-ink-muted">
            {stick.owner?.name ?? "Team stick"}
            {stick.ratedFlex !== null && <> · rated {formatRated(stick.ratedFlex)}</>}
          </p>
        </div>
        {stick.belowAlert ? <Badge tone="warn">Below {alertPercent} %</Badge> : latest ? <Badge tone="ok">Within {alertPercent} %</Badge> : <Badge>Not tested</Badge>}
      </div>
      {latest ? (
        <div>
          <p className="flex items-baseline gap-2">
            <span className="text-3xl font-semibold tracking-tight text-ink tabular-nums">{formatFlex(latest.measuredFlex)}</span>
            <span className="text-sm text-ink-muted">flex measured</span>
            {latest.percentOfRated !== null && (
              <span className={stick.belowAlert ? "ml-auto text-sm font-semibold text-warn" : "ml-auto text-sm font-semibold text-ok"}>{formatPercent(latest.percentOfRated)} of rated</span>
            )}
          </p>
          {latest.percentOfRated !== null && <FlexGauge percent={latest.percentOfRated} alertPercent={alertPercent} className="mt-2" />}
        </div>
      ) : (
        <p className="text-sm text-ink-muted">No bench test yet. Test it to know how stiff it really is.</p>
      )}
      <p className="mt-auto text-xs text-ink-muted">
        {stick.benchTestCount} bench test{stick.benchTestCount === 1 ? "" : "s"}
        {latest && <> · last {formatDay(latest.testedOn)}</>} · {stick.shotCount} shot{stick.shotCount === 1 ? "" : "s"}
      </p>
    </Link>
  );
}
