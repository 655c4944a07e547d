// Billing rules for a team's club: what plan it is on and how much it uses (every member sees
// this, for the banner), and for team admins: checkout, plan change with proration, cancellation
// at the period's end, invoices, and a new team in the club. Nothing here changes the plan
// itself: the payment service's webhooks do (sync.ts).
import type Stripe from "stripe";
import { policy, type Actor } from "../auth/policy";
import { env } from "../env";
import { forbidden, HttpError } from "../http/problem";
import { recordAudit } from "../entities/audit/repository";
import { teamUsageBytes } from "../entities/clip/repository";
import { isPaidPlan, PLANS, type PlanId } from "../../shared/billing/plans";
import type { BillingStatus, Invoice, PlanChangePreview } from "../../shared/schemas/billing";
import { accessOf, graceEndsAt } from "./access";
import { clubFor, createTeamInClub } from "./clubs";
import { assertTeamRoom } from "./limits";
import { payments, paymentsEnabled, priceOf } from "./payments";
import * as repo from "../entities/club/repository";
import { currentSubscription } from "./sync";

const iso = (d: Date | null) => d?.toISOString() ?? null;
const fromUnix = (s: number | null | undefined) => (s ? new Date(s * 1000).toISOString() : null);

function requireManager(a: Actor) {
  if (!policy.manageBilling(a)) throw forbidden("Only a team admin can manage the club's plan and payments.");
}

export async function status(a: Actor): Promise<BillingStatus> {
  const e = env();
  const club = await clubFor(a.teamId);
  const teams = await repo.teamsOfClub(club.id);
  let storage = 0;
  for (const t of teams) storage += await teamUsageBytes(t.id);
  return {
    club: { id: club.id, name: club.name },
    plan: club.plan,
    access: accessOf(club, new Date(), e.BILLING_GRACE_DAYS),
    graceEndsAt: iso(graceEndsAt(club, e.BILLING_GRACE_DAYS)),
    subscription: club.subscriptionStatus
      ? { status: club.subscriptionStatus, currentPeriodEnd: iso(club.currentPeriodEnd), cancelAtPeriodEnd: club.cancelAtPeriodEnd }
      : null,
    usage: { storageBytes: storage, staffSeats: (await repo.staffEmailsOfClub(club.id)).size, teams: teams.length },
    canManage: policy.manageBilling(a),
    paymentsEnabled: paymentsEnabled(),
  };
}

async function liveSubscription(customerId: string | null): Promise<Stripe.Subscription | null> {
  if (!customerId) return null;
  const subs = await payments().subscriptions.list({ customer: customerId, status: "all", limit: 20 });
  return currentSubscription(subs.data);
}

function paidPlan(plan: PlanId) {
  if (!isPaidPlan(plan)) throw new HttpError(422, "not_a_paid_plan", `${PLANS[plan].name} is free: to go back to it, cancel the subscription and it ends with the paid period.`);
  return plan as Exclude<PlanId, "pond">;
}

/** Starts a hosted checkout for a paid plan; the client sends the person to the returned url. */
export async function checkout(a: Actor, plan: PlanId, signedInEmail: string): Promise<{ url: string }> {
  requireManager(a);
  const paid = paidPlan(plan);
  const e = env();
  const club = await clubFor(a.teamId);
  if (await liveSubscription(club.customerId))
    throw new HttpError(409, "already_subscribed", `${club.name} already has a subscription: change its plan instead of buying a second one.`);
  let customerId = club.customerId;
  if (!customerId) {
    const made = await payments().customers.create(
      { email: signedInEmail, name: club.name, metadata: { clubId: club.id } },
      { idempotencyKey: `customer-of-club-${club.id}` },
    );
    customerId = await repo.claimCustomer(club.id, made.id);
  }
  const session = await payments().checkout.sessions.create({
    mode: "subscription",
    customer: customerId,
    line_items: [{ price: priceOf(paid), quantity: 1 }],
    client_reference_id: club.id,
    metadata: { clubId: club.id },
    subscription_data: { metadata: { clubId: club.id } },
    success_url: `${e.PUBLIC_URL}/billing?checkout=done`,
    cancel_url: `${e.PUBLIC_URL}/billing?checkout=cancelled`,
  });
  if (!session.url) throw new HttpError(502, "payments_error", "The payment service gave no checkout page. Try again in a moment.");
  return { url: session.url };
}

async function subscriptionOf(a: Actor) {
  requireManager(a);
  const club = await clubFor(a.teamId);
  const sub = await liveSubscription(club.customerId);
  if (!sub) throw new HttpError(409, "no_subscription", `${club.name} is on the free plan: choose a plan to subscribe first.`);
  return { club, sub, item: sub.items.data[0]! };
}

/** What changing to `plan` now costs (or credits) for the rest of the period. */
export async function previewChange(a: Actor, plan: PlanId): Promise<PlanChangePreview> {
  const paid = paidPlan(plan);
  const { club, sub, item } = await subscriptionOf(a);
  const inv = await payments().invoices.createPreview({
    customer: club.customerId!,
    subscription: sub.id,
    subscription_details: { items: [{ id: item.id, price: priceOf(paid) }], proration_behavior: "always_invoice" },
  });
  return { plan, amountDueCents: inv.amount_due, totalCents: inv.total, currency: inv.currency };
}

/** Moves the subscription to another paid plan, prorated and invoiced at once. */
export async function changePlan(a: Actor, plan: PlanId) {
  const paid = paidPlan(plan);
  const { club, sub, item } = await subscriptionOf(a);
  if (item.price.id === priceOf(paid)) throw new HttpError(409, "same_plan", `${club.name} is already on ${PLANS[paid].name}.`);
  await payments().subscriptions.update(sub.id, { items: [{ id: item.id, price: priceOf(paid) }], proration_behavior: "always_invoice" });
  return { requested: paid };
}

export async function setCancelAtPeriodEnd(a: Actor, cancel: boolean) {
  const { sub } = await subscriptionOf(a);
  await payments().subscriptions.update(sub.id, { cancel_at_period_end: cancel });
  return { cancelAtPeriodEnd: cancel };
}

const toInvoice = (i: Stripe.Invoice): Invoice => ({
  id: i.id!, number: i.number, status: i.status ?? "draft", reason: i.billing_reason, totalCents: i.total, amountDueCents: i.amount_due,
  amountPaidCents: i.amount_paid, currency: i.currency, createdAt: fromUnix(i.created)!, periodStart: fromUnix(i.period_start), periodEnd: fromUnix(i.period_end),
  url: i.hosted_invoice_url ?? null,
});

export async function invoices(a: Actor): Promise<Invoice[]> {
  requireManager(a);
  const club = await clubFor(a.teamId);
  if (!club.customerId || !paymentsEnabled()) return [];
  const list = await payments().invoices.list({ customer: club.customerId, limit: 24 });
  return list.data.map(toInvoice);
}

export async function addTeam(a: Actor, name: string) {
  requireManager(a);
  const club = await clubFor(a.teamId);
  if (!(await repo.isClubAdmin(club.id, a.userId))) throw forbidden();
  // Under the club's row lock, so two requests at once cannot both take the last free team.
  const team = (await repo.withClubLocked(club.id, async (locked, tx) => {
    await assertTeamRoom(locked);
    return createTeamInClub(club.id, name, a.userId, tx);
  }))!;
  for (const teamId of [a.teamId, team.id])
    await recordAudit({ teamId, actorId: a.userId, action: "team.created", targetType: "team", targetId: team.id, detail: { name, clubId: club.id } });
  return team;
}
