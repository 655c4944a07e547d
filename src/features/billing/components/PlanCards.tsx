import { useState } from "react";
import { Badge, Button, ConfirmDialog } from "@/components/ui";
import { cn } from "@/lib/cn";
import { errorMessage } from "@/lib/api";
import { formatDate } from "@/lib/format";
import { toast } from "@/components/ui";
import { isPaidPlan, moneyText, PLAN_IDS, PLANS, storageText, type PlanId } from "@shared/billing/plans";
import type { BillingStatus, PlanChangePreview } from "@shared/schemas/billing";
import { useCancelAtPeriodEnd, useChangePlan, useCheckout, usePlanPreview } from "../api/billing";

/** The three plans side by side, the current one marked; a team admin acts from here. */
export function PlanCards({ teamId, status, onRequested }: { teamId: string; status: BillingStatus; onRequested: () => void }) {
  const checkout = useCheckout(teamId);
  const preview = usePlanPreview(teamId);
  const change = useChangePlan(teamId);
  const cancel = useCancelAtPeriodEnd(teamId);
  const [confirm, setConfirm] = useState<PlanChangePreview | null>(null);
  const [confirmCancel, setConfirmCancel] = useState(false);
  const sub = status.subscription;
  const manage = status.canManage && status.paymentsEnabled && status.access !== "read_only";

  const fail = (e: unknown) => toast.error(errorMessage(e));
  const choose = (plan: PlanId) => {
    if (!sub) return checkout.mutate(plan, { onError: fail });
    preview.mutate(plan, { onSuccess: setConfirm, onError: fail });
  };

  return (
    <>
      <ul className="grid gap-4 md:grid-cols-3" aria-label="Plans">
        {PLAN_IDS.map((id) => {
          const p = PLANS[id];
          const current = status.plan === id;
          return (
            <li key={id} className={cn("flex flex-col rounded-[var(--radius-card)] border bg-surface p-5", current ? "border-accent ring-2 ring-accent/30" : "border-line")} aria-current={current || undefined}>
              <div className="flex items-center justify-between gap-2">
                <h3 className="text-lg font-semibold text-ink">{p.name}</h3>
                {current && <Badge tone="accent">Your plan</Badge>}
              </div>
              <p className="mt-1 text-2xl font-semibold tabular-nums text-ink">
                {p.monthlyCents ? moneyText(p.monthlyCents, p.currency) : "Free"}
                {p.monthlyCents > 0 && <span className="text-sm font-normal text-ink-muted"> / month</span>}
              </p>
              <p className="mt-1 text-sm text-ink-muted">{p.blurb}</p>
              <ul className="mt-4 flex flex-col gap-1 text-sm text-ink">
                <li>{storageText(p.storageBytes)} of clips</li>
                <li>{p.staffSeats} staff seats (players are free)</li>
                <li>{p.teams === 1 ? "1 team" : `Up to ${p.teams} teams`}</li>
              </ul>
              <div className="mt-auto pt-5">
                {manage && !current && isPaidPlan(id) && (
                  <Button className="w-full" variant={sub ? "secondary" : "primary"} loading={(checkout.isPending && checkout.variables === id) || (preview.isPending && preview.variables === id)} onClick={() => choose(id)}>
                    {sub ? `Switch to ${p.name}` : `Choose ${p.name}`}
                  </Button>
                )}
                {manage && current && sub && !sub.cancelAtPeriodEnd && (
                  <Button className="w-full" variant="ghost-danger" onClick={() => setConfirmCancel(true)}>
                    Cancel at the period's end
                  </Button>
                )}
                {manage && current && sub?.cancelAtPeriodEnd && (
                  <Button className="w-full" variant="secondary" loading={cancel.isPending} onClick={() => cancel.mutate(false, { onSuccess: onRequested, onError: fail })}>
                    Keep {p.name}
                  </Button>
                )}
                {current && sub?.cancelAtPeriodEnd && <p className="mt-2 text-sm text-warn">Ends {formatDate(sub.currentPeriodEnd)}; then the club is on Pond.</p>}
              </div>
            </li>
          );
        })}
      </ul>
      <ConfirmDialog
        open={!!confirm}
        tone="primary"
        title={confirm ? `Switch to ${PLANS[confirm.plan].name}?` : ""}
        description={
          confirm &&
          (confirm.amountDueCents > 0
            ? `For the rest of this period you pay the difference now: ${moneyText(confirm.amountDueCents, confirm.currency)}, charged to the card on file. From the next period, ${moneyText(PLANS[confirm.plan].monthlyCents)} a month.`
            : `The unused part of this period (${moneyText(-confirm.totalCents, confirm.currency)}) is credited to the next invoice. From the next period, ${moneyText(PLANS[confirm.plan].monthlyCents)} a month.`)
        }
        confirmLabel={confirm ? `Switch to ${PLANS[confirm.plan].name}` : "Switch"}
        pending={change.isPending}
        onCancel={() => setConfirm(null)}
        onConfirm={() => confirm && change.mutate(confirm.plan, { onSuccess: () => (setConfirm(null), onRequested()), onError: fail })}
      />
      <ConfirmDialog
        open={confirmCancel}
        title={`Cancel ${PLANS[status.plan].name}?`}
        description={`The club keeps ${PLANS[status.plan].name} until ${formatDate(sub?.currentPeriodEnd)} and is not charged again. Then it is on the free Pond plan: nothing is deleted, but uploads and new staff stop at Pond's limits.`}
        confirmLabel="Cancel at the period's end"
        cancelLabel="Keep the plan"
        pending={cancel.isPending}
        onCancel={() => setConfirmCancel(false)}
        onConfirm={() => cancel.mutate(true, { onSuccess: () => (setConfirmCancel(false), onRequested()), onError: fail })}
      />
    </>
  );
}
