import { cn } from "@/lib/cn";
import { PLANS, storageText } from "@shared/billing/plans";
import type { BillingStatus } from "@shared/schemas/billing";

function Meter({ label, used, limit, text }: { label: string; used: number; limit: number; text: string }) {
  const share = limit > 0 ? Math.min(used / limit, 1) : 1;
  const full = used >= limit;
  return (
    <div className="flex flex-col gap-1.5">
      <div className="flex items-baseline justify-between gap-3 text-sm">
        <span className="font-medium text-ink">{label}</span>
        <span className={cn("tabular-nums", full ? "font-semibold text-danger" : "text-ink-muted")}>{text}</span>
      </div>
      <div className="h-2 overflow-hidden rounded-full bg-sunken" role="meter" aria-label={label} aria-valuemin={0} aria-valuemax={limit} aria-valuenow={used}>
        <div className={cn("h-full rounded-full", full ? "bg-danger" : share > 0.8 ? "bg-warn" : "bg-accent")} style={{ width: `${Math.max(share * 100, used > 0 ? 2 : 0)}%` }} />
      </div>
    </div>
  );
}

/** What the club uses of its plan: storage, staff seats, teams. */
export function UsageMeters({ status }: { status: BillingStatus }) {
  const plan = PLANS[status.plan];
  const u = status.usage;
  return (
    <div className="grid gap-5 sm:grid-cols-3">
      <Meter label="Clip storage" used={u.storageBytes} limit={plan.storageBytes} text={`${storageText(u.storageBytes)} of ${storageText(plan.storageBytes)}`} />
      <Meter label="Staff seats" used={u.staffSeats} limit={plan.staffSeats} text={`${u.staffSeats} of ${plan.staffSeats}`} />
      <Meter label="Teams" used={u.teams} limit={plan.teams} text={`${u.teams} of ${plan.teams}`} />
    </div>
  );
}
