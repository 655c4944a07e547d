// POST /api/billing/webhook — the payment service's events, the only thing that changes a club's
// plan. The SDK checks the signature over the raw body (and that it is under 5 minutes old); a
// forged, altered or stale delivery is refused with 400 and logged. Each event id is applied once:
// a second delivery (the service retries, or someone replays a captured one) is acknowledged, logged
// and not applied again. Applying means reading the club's subscriptions afresh (sync.ts).
import express, { type Express, type Request, type Response } from "express";
import type Stripe from "stripe";
import { env } from "../env";
import { sendProblem } from "../http/problem";
import { payments } from "./payments";
import { clubByCustomer, forgetEvent, recordEvent } from "../entities/club/repository";
import { syncClub } from "./sync";

export const WEBHOOK_PATH = "/api/billing/webhook";

const HANDLED = new Set<string>([
  "checkout.session.completed",
  "customer.subscription.created", "customer.subscription.updated", "customer.subscription.deleted",
  "invoice.paid", "invoice.payment_succeeded", "invoice.payment_failed",
]);

function customerOf(event: Stripe.Event): string | null {
  const c = (event.data.object as { customer?: string | { id: string } | null }).customer;
  return typeof c === "string" ? c : (c?.id ?? null);
}

async function receive(req: Request, res: Response) {
  const e = env();
  if (!e.PAYMENTS_SECRET_KEY || !e.PAYMENTS_WEBHOOK_SECRET)
    return sendProblem(res, 503, "payments_off", "Payments are not set up on this server.");
  let event: Stripe.Event;
  try {
    event = payments().webhooks.constructEvent(req.body as Buffer, req.get("stripe-signature") ?? "", e.PAYMENTS_WEBHOOK_SECRET);
  } catch (err) {
    req.log.warn({ reason: (err as Error).message, ip: req.ip, bytes: (req.body as Buffer).length }, "payment webhook refused: signature not valid");
    return sendProblem(res, 400, "bad_signature", "The webhook's signature is not valid (forged, altered or too old), so nothing was applied.");
  }
  const log = req.log.child({ eventId: event.id, eventType: event.type });
  if (!HANDLED.has(event.type)) {
    log.info("payment webhook of a type we do not use; acknowledged");
    return void res.json({ received: true, ignored: true });
  }
  const customerId = customerOf(event);
  const club = customerId ? await clubByCustomer(customerId) : null;
  if (!club) {
    log.warn({ customerId }, "payment webhook for a customer of no club; acknowledged, nothing applied");
    return void res.json({ received: true, ignored: true });
  }
  if (!(await recordEvent({ id: event.id, type: event.type, clubId: club.id, createdAtService: new Date(event.created * 1000) }))) {
    log.warn({ clubId: club.id }, "payment webhook event already applied (a repeated delivery or a replay); not applied again");
    return void res.json({ received: true, duplicate: true });
  }
  try {
    await syncClub(club.id, log);
  } catch (err) {
    // Not applied: forget the id so the service's retry of this event is applied.
    await forgetEvent(event.id);
    throw err;
  }
  res.json({ received: true });
}

/** Mount before the JSON body parser: the signature covers the exact bytes. */
export function mountBillingWebhook(app: Express) {
  app.post(WEBHOOK_PATH, express.raw({ type: () => true, limit: "1mb" }), receive);
}
