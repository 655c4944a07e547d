import { useEffect, useState } from "react";
import { useSearchParams } from "react-router-dom";
import { Alert, Button, Card, EmptyState, Field, Input, LoadError, PageHeader, PageSpinner } from "@/components/ui";
import { errorMessage } from "@/lib/api";
import { formatDate } from "@/lib/format";
import { useActiveTeam } from "@/lib/session";
import { PLANS } from "@shared/billing/plans";
import type { BillingStatus } from "@shared/schemas/billing";
import { useAddTeam, useBilling, useInvoices } from "../api/billing";
import { InvoicesTable } from "../components/InvoicesTable";
import { PlanCards } from "../components/PlanCards";
import { UsageMeters } from "../components/UsageMeters";

/** A fingerprint of what a webhook can change, to tell when a requested change has landed. */
const stateOf = (s: BillingStatus) => JSON.stringify([s.plan, s.access, s.subscription]);

export function Component() {
  const team = useActiveTeam();
  if (!team) return <EmptyState title="No team yet">Once you belong to a team, its club's plan shows here.</EmptyState>;
  return <Billing teamId={team.id} teamName={team.name} />;
}

function Billing({ teamId, teamName }: { teamId: string; teamName: string }) {
  const [params, setParams] = useSearchParams();
  const returned = params.get("checkout");
  // After checkout or a change, wait for the payment service's webhook (the only source of the plan).
  const [waitingFrom, setWaitingFrom] = useState<string | null>(returned === "done" ? "" : null);
  const billing = useBilling(teamId, waitingFrom !== null);
  const s = billing.data;
  const invoices = useInvoices(teamId, !!s?.canManage);

  useEffect(() => {
    if (waitingFrom === null || !s) return;
    const landed = waitingFrom === "" ? !!s.subscription : stateOf(s) !== waitingFrom;
    if (landed) {
      setWaitingFrom(null);
      void invoices.refetch();
      if (returned) setParams({}, { replace: true });
    }
  }, [s, waitingFrom, returned, setParams, invoices]);

  if (billing.isPending) return <PageSpinner label="Loading the club's plan…" />;
  if (billing.isError) return <LoadError title="Couldn't load the club's plan" error={billing.error} onRetry={() => billing.refetch()} />;
  const st = billing.data;
  const plan = PLANS[st.plan];
  const openInvoice = invoices.data?.find((i) => i.status === "open");

  return (
    <>
      <PageHeader eyebrow={st.club.name} title="Plan and billing" description={teamName === st.club.name ? `The club is on the ${plan.name} plan.` : `${teamName} belongs to ${st.club.name}, which is on the ${plan.name} plan.`} />
      <div className="flex flex-col gap-6">
        {params.get("welcome") && (
          <Alert tone="ok" title={`Welcome! ${st.club.name} is ready.`}>
            You are its team admin, on the free Pond plan. Invite your staff under Roster, upload clips under Clips, or choose a larger plan below.
          </Alert>
        )}
        {waitingFrom !== null && (
          <Alert tone="info" title="Waiting for the payment service to confirm…">
            The plan changes as soon as the payment service tells us. This usually takes a few seconds.
          </Alert>
        )}
        {returned === "cancelled" && <Alert tone="info">Checkout was cancelled; nothing was charged.</Alert>}
        {st.access !== "ok" && (
          <Alert tone={st.access === "grace" ? "warn" : "danger"} title={st.access === "grace" ? "The last payment failed" : "The club is read-only until paid"}>
            {st.access === "grace"
              ? `Everything keeps working until ${formatDate(st.graceEndsAt)}. After that the club's teams become read-only (nothing is deleted). `
              : "Everything can still be seen, nothing was deleted, but nothing can be added or changed. "}
            {openInvoice?.url ? (
              <a className="font-semibold underline" href={openInvoice.url}>
                Pay the open invoice ({openInvoice.number})
              </a>
            ) : (
              st.canManage ? "Pay the open invoice from the list below." : "A team admin can pay the open invoice."
            )}
          </Alert>
        )}

        <Card title="What the club uses" description={st.subscription ? subscriptionLine(st) : plan.monthlyCents ? `${plan.name} was granted to the club: nothing is due.` : "The free plan has no end date."}>
          <UsageMeters status={st} />
        </Card>

        <section aria-labelledby="plans-h" className="flex flex-col gap-3">
          <h2 id="plans-h" className="text-base font-semibold text-ink">Plans</h2>
          {!st.canManage && <p className="text-sm text-ink-muted">A team admin chooses the club's plan.</p>}
          {st.canManage && !st.paymentsEnabled && <Alert tone="info">Payments are not set up on this server, so plans cannot be bought here.</Alert>}
          <PlanCards teamId={teamId} status={st} onRequested={() => setWaitingFrom(stateOf(st))} />
        </section>

        {st.canManage && (
          <div className="grid items-start gap-6 lg:grid-cols-[minmax(0,1fr)_20rem]">
            <Card title="Invoices" flush={!!invoices.data?.length}>
              {invoices.isError ? <p className="text-sm text-danger">{errorMessage(invoices.error)}</p> : <InvoicesTable invoices={invoices.data ?? []} />}
            </Card>
            <AddTeam teamId={teamId} status={st} />
          </div>
        )}
      </div>
    </>
  );
}

function subscriptionLine(s: BillingStatus) {
  const sub = s.subscription!;
  if (sub.cancelAtPeriodEnd) return `Cancelled: ${PLANS[s.plan].name} ends on ${formatDate(sub.currentPeriodEnd)}.`;
  return `Renews on ${formatDate(sub.currentPeriodEnd)}.`;
}

function AddTeam({ teamId, status }: { teamId: string; status: BillingStatus }) {
  const add = useAddTeam(teamId);
  const [name, setName] = useState("");
  const plan = PLANS[status.plan];
  const room = status.usage.teams < plan.teams;
  return (
    <Card title="Teams in the club" description={`${status.usage.teams} of ${plan.teams} on ${plan.name}.`}>
      <form
        className="flex flex-col gap-3"
        onSubmit={(e) => {
          e.preventDefault();
          add.mutate(name.trim(), { onSuccess: () => setName("") });
        }}
      >
        <Field label="New team" error={add.isError ? errorMessage(add.error) : undefined} hint={room ? "You become its team admin." : `${plan.name} has room for no more teams.`}>
          <Input value={name} onChange={(e) => setName(e.target.value)} placeholder="e.g. U14" disabled={!room || status.access === "read_only"} />
        </Field>
        <Button type="submit" variant="secondary" loading={add.isPending} disabled={!room || name.trim().length < 2 || status.access === "read_only"}>
          Add the team
        </Button>
        {add.isSuccess && <p className="text-sm text-ok">{add.data.name} was added; switch to it with the team menu.</p>}
      </form>
    </Card>
  );
}
