// A club's plan state comes from the payment service only, and only when one of its webhooks
// says something changed. Rather than applying each event's payload (events arrive late, twice
// or out of order), every event makes us read the customer's subscriptions as they are now and
// store that, holding the club's row lock: whatever order the events come in, the last one to
// run leaves the state the service has (docs/decisions/181-webhooks-sync-the-club.md).
import type Stripe from "stripe";
import type { Logger } from "pino";
import { env } from "../env";
import { recordAudit, type AuditAction } from "../entities/audit/repository";
import { sendMail } from "../mail/mailer";
import { paymentFailedMail, readOnlyMail } from "../mail/templates";
import { FREE_PLAN, type PlanId } from "../../shared/billing/plans";
import { accessOf, graceEndsAt } from "./access";
import { payments, planOfPrice } from "./payments";
import * as repo from "../entities/club/repository";

/** Subscription states that still hold a plan (the service's words). */
const HOLDS_PLAN = new Set<Stripe.Subscription.Status>(["active", "trialing", "past_due", "unpaid"]);

export function currentSubscription(subs: Stripe.Subscription[]): Stripe.Subscription | null {
  return subs.filter((s) => HOLDS_PLAN.has(s.status)).sort((a, b) => b.created - a.created)[0] ?? null;
}

export async function syncClub(clubId: string, log: Logger): Promise<void> {
  const e = env();
  const now = new Date();
  const change = await repo.withClubLocked(clubId, async (before, tx) => {
    if (!before.customerId) return null;
    const subs = await payments().subscriptions.list({ customer: before.customerId, status: "all", limit: 20 });
    const sub = currentSubscription(subs.data);
    const item = sub?.items.data[0];
    let plan: PlanId = FREE_PLAN;
    if (sub) {
      const known = planOfPrice(item?.price.id);
      if (!known) log.error({ clubId, price: item?.price.id }, "subscription price is none of our plans (PAYMENTS_PRICE_*); plan left as it was");
      plan = known ?? before.plan;
    }
    const owing = sub?.status === "past_due" || sub?.status === "unpaid";
    const after = {
      ...before,
      plan,
      subscriptionId: sub?.id ?? null,
      subscriptionStatus: sub?.status ?? null,
      currentPeriodEnd: item ? new Date(item.current_period_end * 1000) : null,
      cancelAtPeriodEnd: sub?.cancel_at_period_end ?? false,
      pastDueSince: owing ? (before.pastDueSince ?? now) : null,
      syncedAt: now,
    };
    await repo.updateClub(tx, clubId, after);
    return { before, after };
  });
  if (!change) return;
  const { before, after } = change;

  const entries: { action: AuditAction; detail: Record<string, unknown> }[] = [];
  if (before.plan !== after.plan) entries.push({ action: "plan.changed", detail: { from: before.plan, to: after.plan } });
  if (!before.cancelAtPeriodEnd && after.cancelAtPeriodEnd)
    entries.push({ action: "plan.cancel_scheduled", detail: { plan: after.plan, endsAt: after.currentPeriodEnd?.toISOString() ?? null } });
  if (before.cancelAtPeriodEnd && !after.cancelAtPeriodEnd && after.subscriptionId)
    entries.push({ action: "plan.cancel_withdrawn", detail: { plan: after.plan } });
  const was = accessOf(before, now, e.BILLING_GRACE_DAYS);
  const is = accessOf(after, now, e.BILLING_GRACE_DAYS);
  const graceEnd = graceEndsAt(after, e.BILLING_GRACE_DAYS);
  if (was === "ok" && is !== "ok") entries.push({ action: "billing.payment_failed", detail: { graceEndsAt: graceEnd?.toISOString() ?? null } });
  if (was !== "read_only" && is === "read_only") entries.push({ action: "billing.read_only", detail: {} });
  if (was !== "ok" && is === "ok") entries.push({ action: "billing.restored", detail: { plan: after.plan } });
  if (!entries.length) return;

  log.info({ clubId, from: { plan: before.plan, status: before.subscriptionStatus }, to: { plan: after.plan, status: after.subscriptionStatus } }, "club plan state changed");
  const tell = (was === "ok" && is !== "ok") || (was !== "read_only" && is === "read_only");
  await announce(clubId, after.name, entries, tell ? (is === "read_only" ? "read_only" : "grace") : null, graceEnd, log);
}

/** Audit entries on every team of the club, and the mail to its admins when access changed. */
async function announce(clubId: string, clubName: string, entries: { action: AuditAction; detail: Record<string, unknown> }[],
  mail: "grace" | "read_only" | null, graceEnd: Date | null, log: Logger) {
  const teams = await repo.teamsOfClub(clubId);
  for (const t of teams)
    for (const entry of entries) await recordAudit({ teamId: t.id, actorId: null, targetType: "club", targetId: clubId, ...entry });
  if (!mail) return;
  const url = `${env().PUBLIC_URL}/billing`;
  for (const a of await repo.adminsOfClub(clubId)) {
    const m = mail === "read_only"
      ? readOnlyMail({ to: a.email, name: a.name, clubName, url })
      : paymentFailedMail({ to: a.email, name: a.name, clubName, graceEndsAt: graceEnd!, url });
    await sendMail(m).catch((err) => log.error({ err, clubId }, "payment mail could not be sent"));
  }
}

/**
 * Grace that ends by the clock sends no webhook: the periodic sweep finds such clubs and
 * announces read-only once (audit entry and mail), as a service event would have. The club's row
 * lock and the audit check under it keep two sweeps, or a sweep and a webhook, from announcing twice.
 */
export async function announceGraceEnded(log: Logger): Promise<string[]> {
  const days = env().BILLING_GRACE_DAYS;
  const announced: string[] = [];
  for (const { id } of await repo.clubsPastGraceUnannounced(days)) {
    const name = await repo.withClubLocked(id, async (row, tx) => {
      const still = (await repo.clubsPastGraceUnannounced(days, tx)).some((c) => c.id === id);
      if (!still || accessOf(row, new Date(), days) !== "read_only") return null;
      for (const t of await repo.teamsOfClub(id))
        await recordAudit({ teamId: t.id, actorId: null, targetType: "club", targetId: id, action: "billing.read_only", detail: { by: "grace_ended" } }, tx);
      return row.name;
    });
    if (!name) continue;
    log.info({ clubId: id }, "grace ended without a payment: the club is read-only");
    await announce(id, name, [], "read_only", null, log);
    announced.push(id);
  }
  return announced;
}
