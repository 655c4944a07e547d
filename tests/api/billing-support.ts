// Billing API tests: the payments fake on an ephemeral loopback port, the app pointed at it through
// the same variables a real account would use, and small helpers to act as the cardholder.
import { randomBytes } from "node:crypto";
import { afterAll, beforeAll } from "vitest";
import { startPaymentsFake, type PaymentsFake } from "../../scripts/payments-fake/server";
import { fakePrices } from "../../scripts/payments-fake/prices";
import { Client, startServer, type TestServer } from "./helpers";

export interface BillingWorld { fake: PaymentsFake; srv: TestServer; apiKey: string; webhookSecret: string }

/** Start the fake, point the app's environment at it, start the app. Call before anything reads env(). */
export async function startBillingWorld(): Promise<BillingWorld> {
  const apiKey = `sk_test_${randomBytes(12).toString("hex")}`;
  const webhookSecret = `whsec_${randomBytes(16).toString("hex")}`;
  const fake = await startPaymentsFake({ apiKey, webhookSecret, prices: fakePrices() });
  const u = new URL(fake.url);
  Object.assign(process.env, {
    PAYMENTS_SECRET_KEY: apiKey, PAYMENTS_WEBHOOK_SECRET: webhookSecret,
    PAYMENTS_API_HOST: u.hostname, PAYMENTS_API_PORT: u.port, PAYMENTS_API_PROTOCOL: "http",
  });
  const srv = await startServer();
  fake.setWebhookUrl(`${srv.url}/api/billing/webhook`);
  return { fake, srv, apiKey, webhookSecret };
}

/** For a test file: the world before its tests, closed after them. Read `w` inside tests only. */
export function useBillingWorld(): { readonly w: BillingWorld } {
  const holder = {} as { w: BillingWorld };
  beforeAll(async () => {
    holder.w = await startBillingWorld();
  });
  afterAll(async () => {
    await holder.w.srv.close();
    await holder.w.fake.close();
  });
  return holder;
}

/** Submit the fake's hosted card form (as a browser would); returns the status and where it sends us. */
export async function payOnPage(pageUrl: string, card: string, extra: Record<string, string> = {}) {
  const r = await fetch(pageUrl, { method: "POST", body: new URLSearchParams({ card, expiry: "12/34", cvc: "123", holder: "Dana Whitlock", ...extra }), redirect: "manual" });
  return { status: r.status, location: r.headers.get("location"), text: await r.text() };
}

export async function fakeControl(w: BillingWorld, path: string, body: unknown = {}) {
  const r = await fetch(`${w.fake.url}/_fake${path}`, { method: "POST", headers: { authorization: `Bearer ${w.apiKey}`, "content-type": "application/json" }, body: JSON.stringify(body) });
  if (!r.ok) throw new Error(`fake control ${path}: ${r.status} ${await r.text()}`);
  return r.json();
}

/** Waits until the club's billing status (as the team's member sees it) satisfies `ok`. */
export async function waitForBilling(who: Client, teamId: string, ok: (s: any) => boolean, timeoutMs = 8000) {
  const t0 = Date.now();
  let last: any;
  while (Date.now() - t0 < timeoutMs) {
    last = (await who.get(`/api/teams/${teamId}/billing`)).json;
    if (last && ok(last)) return last;
    await new Promise((r) => setTimeout(r, 50));
  }
  throw new Error(`billing state not reached within ${timeoutMs} ms; last: ${JSON.stringify(last)}`);
}

let n = 0;
/** A new club with its first team, and its team admin signed in (made directly, not through sign-up). */
export async function newClub(base: string, label = "Harbour Otters") {
  const { createAccount } = await import("../../server/auth/accounts");
  const { createClubWithTeam } = await import("../../server/billing/clubs");
  const email = `admin${++n}-${randomBytes(3).toString("hex")}@otters.example`;
  const password = "otters-test-2026";
  const { userId } = await createAccount({ email, password, name: `Rowan Admin ${n}`, emailVerified: true, signIn: false });
  const { club, team } = await createClubWithTeam({ clubName: `${label} ${n}`, teamName: `${label} ${n} U18`, adminId: userId });
  const admin = await new Client(base).signIn(email, password);
  return { clubId: club.id, teamId: team.id, email, admin, userId };
}
