// The payment service's official SDK, configured from the environment only: PAYMENTS_API_HOST /
// _PORT / _PROTOCOL point it at the local fake (scripts/payments-fake); left unset, the SDK talks
// to the service itself, so a real account changes configuration, not code (README, "Payments").
import Stripe from "stripe";
import { env } from "../env";
import { HttpError } from "../http/problem";
import type { PlanId } from "../../shared/billing/plans";

let client: Stripe | undefined;

export const paymentsEnabled = () => !!env().PAYMENTS_SECRET_KEY;

export function payments(): Stripe {
  if (client) return client;
  const e = env();
  if (!e.PAYMENTS_SECRET_KEY)
    throw new HttpError(503, "payments_off", "Payments are not set up on this server, so plans cannot be bought here. The server's operator can set them up.");
  client = new Stripe(e.PAYMENTS_SECRET_KEY, {
    ...(e.PAYMENTS_API_HOST ? { host: e.PAYMENTS_API_HOST } : {}),
    ...(e.PAYMENTS_API_PORT ? { port: e.PAYMENTS_API_PORT } : {}),
    ...(e.PAYMENTS_API_PROTOCOL ? { protocol: e.PAYMENTS_API_PROTOCOL } : {}),
    maxNetworkRetries: 1,
    timeout: 15_000,
    telemetry: false,
    appInfo: { name: "Loadframe" },
  });
  return client;
}

/** Price id of a paid plan, and the plan a price id stands for (null: not one of ours). */
export function priceOf(plan: Exclude<PlanId, "pond">): string {
  const e = env();
  return plan === "rink" ? e.PAYMENTS_PRICE_RINK : e.PAYMENTS_PRICE_ARENA;
}

export function planOfPrice(priceId: string | null | undefined): Exclude<PlanId, "pond"> | null {
  const e = env();
  if (priceId === e.PAYMENTS_PRICE_RINK) return "rink";
  if (priceId === e.PAYMENTS_PRICE_ARENA) return "arena";
  return null;
}


