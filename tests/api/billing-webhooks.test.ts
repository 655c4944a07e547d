// The webhook endpoint: a replayed event is not applied twice, a stale or forged signature is
// refused and logged, and events that arrive in the wrong order leave the state the service has.
import { beforeEach, describe, expect, it, vi } from "vitest";
import { signatureHeader } from "../../scripts/payments-fake/server";
import { fakeControl, newClub, payOnPage, useBillingWorld, waitForBilling, type BillingWorld } from "./billing-support";

const world = useBillingWorld();
let w: BillingWorld;
beforeEach(() => {
  w = world.w;
});

const B = (teamId: string) => `/api/teams/${teamId}/billing`;
const post = (payload: string, signature: string) =>
  fetch(`${w.srv.url}/api/billing/webhook`, { method: "POST", headers: { "content-type": "application/json", "stripe-signature": signature }, body: payload });

async function eventCount(clubId: string) {
  const { db } = await import("../../server/db/client");
  const { billingEvent } = await import("../../server/db/schema");
  const { eq } = await import("drizzle-orm");
  return (await db().select().from(billingEvent).where(eq(billingEvent.clubId, clubId))).length;
}

/** Warnings logged while `fn` runs (request loggers are children of the app's logger). */
async function warningsDuring(fn: () => Promise<void>) {
  const { log } = await import("../../server/log");
  const seen: { obj: unknown; msg: string }[] = [];
  const capture = (o: unknown, msg?: string) => void seen.push({ obj: o, msg: msg ?? String(o) });
  const fake = { warn: capture, info: () => {}, error: capture, debug: () => {}, child: () => fake } as never;
  const spy = vi.spyOn(log, "child").mockReturnValue(fake);
  try {
    await fn();
  } finally {
    spy.mockRestore();
  }
  return seen;
}

async function paidClub() {
  const c = await newClub(w.srv.url, "Bayside Herons");
  const co = (await c.admin.post(`${B(c.teamId)}/checkout`, { plan: "rink" })).json;
  await payOnPage(co.url, "4242424242424242");
  await waitForBilling(c.admin, c.teamId, (s) => s.plan === "rink");
  await w.fake.idle();
  return c;
}

describe("payment webhooks", () => {
  it("a delivered event sent again is acknowledged, logged and not applied twice", async () => {
    const c = await paidClub();
    const { clubById } = await import("../../server/entities/club/repository");
    const d = w.fake.deliveries().filter((x) => x.status === 200).at(-1)!;
    const before = await eventCount(c.clubId);
    const syncedAt = (await clubById(c.clubId))!.syncedAt;
    let r!: Response;
    const warnings = await warningsDuring(async () => {
      r = await post(d.payload, signatureHeader(d.payload, w.webhookSecret));
    });
    expect(r.status).toBe(200);
    expect(await r.json()).toMatchObject({ received: true, duplicate: true });
    expect(await eventCount(c.clubId)).toBe(before);
    expect((await clubById(c.clubId))!.syncedAt).toEqual(syncedAt); // nothing re-applied
    expect(warnings.some((x) => /already applied/.test(x.msg))).toBe(true);
  });

  it("a captured delivery replayed after the 5-minute tolerance, a forged signature and an altered body are refused and logged", async () => {
    const c = await paidClub();
    const d = w.fake.deliveries().find((x) => x.type === "invoice.paid")!;
    const before = await eventCount(c.clubId);
    const tenMinutesAgo = Math.floor(Date.now() / 1000) - 600;
    // A new event id, so only the signature's age can refuse it.
    const fresh = d.payload.replace(/"id": "evt_[^"]+"/, `"id": "evt_replayed_${Date.now()}"`);
    const cases = [
      ["stale", fresh, signatureHeader(fresh, w.webhookSecret, tenMinutesAgo)],
      ["forged", fresh, signatureHeader(fresh, "whsec_not_our_secret")],
      ["altered", d.payload.replace(/"amount_paid": 3900/, '"amount_paid": 1'), d.signature],
      ["unsigned", fresh, ""],
    ] as const;
    for (const [what, payload, sig] of cases) {
      let r!: Response;
      const warnings = await warningsDuring(async () => {
        r = await post(payload, sig);
      });
      expect(r.status, what).toBe(400);
      expect((await r.json()).code, what).toBe("bad_signature");
      expect(warnings.some((x) => /signature not valid/.test(x.msg)), what).toBe(true);
    }
    expect(await eventCount(c.clubId)).toBe(before);
    expect((await c.admin.get(B(c.teamId))).json.plan).toBe("rink");
  });

  it("events delivered in reverse order leave the club as the service has it", async () => {
    const c = await newClub(w.srv.url, "Bayside Herons");
    await fakeControl(w, "/webhooks/hold");
    try {
      const co = (await c.admin.post(`${B(c.teamId)}/checkout`, { plan: "rink" })).json;
      await payOnPage(co.url, "4242424242424242");
      // No webhook yet: the app still knows nothing, so a change of plan cannot be asked for.
      expect((await c.admin.get(B(c.teamId))).json.plan).toBe("pond");
      const { payments } = await import("../../server/billing/payments");
      const { clubById } = await import("../../server/entities/club/repository");
      const customer = (await clubById(c.clubId))!.customerId!;
      const sub = (await payments().subscriptions.list({ customer })).data[0]!;
      await payments().subscriptions.update(sub.id, { items: [{ id: sub.items.data[0]!.id, price: "price_arena_monthly" }], proration_behavior: "always_invoice" });
      await payments().subscriptions.update(sub.id, { cancel_at_period_end: true });
    } finally {
      await fakeControl(w, "/webhooks/release?order=reverse");
    }
    await w.fake.idle();
    const s = (await c.admin.get(B(c.teamId))).json;
    expect(s).toMatchObject({ plan: "arena", subscription: { status: "active", cancelAtPeriodEnd: true } });
    expect(await eventCount(c.clubId)).toBeGreaterThanOrEqual(6);
  });

  it("an event for a customer of no club is acknowledged and changes nothing", async () => {
    const payload = JSON.stringify({ id: `evt_stray_${Date.now()}`, object: "event", type: "invoice.paid", created: Math.floor(Date.now() / 1000), data: { object: { object: "invoice", customer: "cus_nobody" } } });
    const r = await post(payload, signatureHeader(payload, w.webhookSecret));
    expect(r.status).toBe(200);
    expect(await r.json()).toMatchObject({ ignored: true });
  });
});
