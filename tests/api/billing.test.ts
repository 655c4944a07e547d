// Plans and payments against the local payments fake, through the official SDK: checkout that
// pays, is declined, or asks to authenticate; renewal; a failed renewal → grace → read-only →
// restored by paying; plan change with proration; cancellation at the period's end.
// Webhook replays, forgeries and order: billing-webhooks.test.ts.
import { beforeEach, describe, expect, it } from "vitest";
import { Client } from "./helpers";
import { fakeControl, newClub, payOnPage, useBillingWorld, waitForBilling, type BillingWorld } from "./billing-support";

const world = useBillingWorld();
let w: BillingWorld;
beforeEach(() => {
  w = world.w;
});

const B = (teamId: string) => `/api/teams/${teamId}/billing`;

async function subscribe(admin: Client, teamId: string, plan = "rink", card = "4242424242424242") {
  const co = await admin.post(`${B(teamId)}/checkout`, { plan });
  expect(co.status, co.text).toBe(201);
  const paid = await payOnPage(co.json.url, card);
  expect(paid.status, paid.text).toBe(303);
  return waitForBilling(admin, teamId, (s) => s.plan === plan && s.subscription?.status === "active");
}

async function subscriptionOf(clubId: string) {
  const { clubById } = await import("../../server/entities/club/repository");
  return (await clubById(clubId))!;
}

async function auditActions(admin: Client, teamId: string) {
  return ((await admin.get(`/api/teams/${teamId}/audit`)).json.entries as { action: string; detail: any }[]).map((e) => e.action);
}

describe("a new club's plan", () => {
  it("starts on the free plan with its limits and usage; only a team admin may manage it", async () => {
    const c = await newClub(w.srv.url);
    const s = (await c.admin.get(B(c.teamId))).json;
    expect(s).toMatchObject({ plan: "pond", access: "ok", subscription: null, canManage: true, paymentsEnabled: true, usage: { storageBytes: 0, staffSeats: 1, teams: 1 } });
    expect((await c.admin.get(`${B(c.teamId)}/invoices`)).json.invoices).toEqual([]);
    const free = await c.admin.post(`${B(c.teamId)}/checkout`, { plan: "pond" });
    expect(free.status).toBe(422);
  });

  it("checkout that pays: the plan changes only when the webhook arrives, and the audit log says so", async () => {
    const c = await newClub(w.srv.url);
    const co = await c.admin.post(`${B(c.teamId)}/checkout`, { plan: "rink" });
    expect(co.status).toBe(201);
    expect(co.json.url).toMatch(new RegExp(`^${w.fake.url}/pay/cs_test_`));
    const page = await fetch(co.json.url);
    expect(await page.text()).toMatch(/Test payment page[\s\S]*\$39\.00/);
    // Before paying nothing changed.
    expect((await c.admin.get(B(c.teamId))).json.plan).toBe("pond");
    const paid = await payOnPage(co.json.url, "4242 4242 4242 4242");
    expect(paid.status).toBe(303);
    expect(paid.location).toMatch(/\/billing\?checkout=done$/);
    const s = await waitForBilling(c.admin, c.teamId, (x) => x.plan === "rink");
    expect(s.subscription).toMatchObject({ status: "active", cancelAtPeriodEnd: false });
    expect(new Date(s.subscription.currentPeriodEnd).getTime()).toBeGreaterThan(Date.now() + 25 * 24 * 3600_000);
    const inv = (await c.admin.get(`${B(c.teamId)}/invoices`)).json.invoices;
    expect(inv).toHaveLength(1);
    expect(inv[0]).toMatchObject({ status: "paid", reason: "subscription_create", amountPaidCents: 3900, currency: "usd" });
    expect(await auditActions(c.admin, c.teamId)).toContain("plan.changed");
    // A second checkout for a club that already pays is refused.
    expect((await c.admin.post(`${B(c.teamId)}/checkout`, { plan: "arena" })).json.code).toBe("already_subscribed");
  });

  it("a declined card: the page says so, nothing is bought", async () => {
    const c = await newClub(w.srv.url);
    const co = (await c.admin.post(`${B(c.teamId)}/checkout`, { plan: "rink" })).json;
    const declined = await payOnPage(co.url, "4000000000000002");
    expect(declined.status).toBe(402);
    expect(declined.text).toMatch(/Your card was declined/);
    const notTest = await payOnPage(co.url, "4111111111111111");
    expect(notTest.text).toMatch(/use one of the test card numbers/);
    await w.fake.idle();
    const s = (await c.admin.get(B(c.teamId))).json;
    expect(s).toMatchObject({ plan: "pond", subscription: null });
    expect((await c.admin.get(`${B(c.teamId)}/invoices`)).json.invoices).toEqual([]);
  });

  it("a card that asks to authenticate: failing the step buys nothing, completing it pays", async () => {
    const c = await newClub(w.srv.url);
    const co = (await c.admin.post(`${B(c.teamId)}/checkout`, { plan: "arena" })).json;
    const first = await payOnPage(co.url, "4000002500003155");
    expect(first.status).toBe(303);
    expect(first.location).toBe(`/pay/${co.url.split("/pay/")[1]}/authenticate`);
    const authUrl = `${w.fake.url}${first.location}`;
    expect(await (await fetch(authUrl)).text()).toMatch(/Authenticate this payment/);
    const failed = await fetch(authUrl, { method: "POST", body: new URLSearchParams({ result: "fail" }), redirect: "manual" });
    expect(failed.status).toBe(402);
    expect(await failed.text()).toMatch(/could not authenticate/);
    await w.fake.idle();
    expect((await c.admin.get(B(c.teamId))).json.plan).toBe("pond");
    const again = await payOnPage(co.url, "4000002500003155");
    const done = await fetch(`${w.fake.url}${again.location}`, { method: "POST", body: new URLSearchParams({ result: "complete" }), redirect: "manual" });
    expect(done.status).toBe(303);
    await waitForBilling(c.admin, c.teamId, (x) => x.plan === "arena" && x.subscription?.status === "active");
  });

  it("a coach cannot buy or see invoices; a player sees the plan but may not manage it", async () => {
    const c = await newClub(w.srv.url);
    const { createAccount } = await import("../../server/auth/accounts");
    const { db } = await import("../../server/db/client");
    const { member } = await import("../../server/db/schema");
    const made: Client[] = [];
    for (const role of ["coach", "player"] as const) {
      const email = `${role}-${c.teamId.slice(0, 6)}@otters.example`;
      const { userId } = await createAccount({ email, password: "otters-test-2026", name: `A ${role}`, emailVerified: true, signIn: false });
      await db().insert(member).values({ id: crypto.randomUUID(), organizationId: c.teamId, userId, role, createdAt: new Date() });
      made.push(await new Client(w.srv.url).signIn(email, "otters-test-2026"));
    }
    const [coach, player] = made;
    expect((await coach!.post(`${B(c.teamId)}/checkout`, { plan: "rink" })).status).toBe(403);
    expect((await coach!.get(`${B(c.teamId)}/invoices`)).status).toBe(403);
    const seen = (await player!.get(B(c.teamId))).json;
    expect(seen).toMatchObject({ plan: "pond", canManage: false });
  });
});

describe("renewals", () => {
  it("a renewal that pays moves the period on and adds a paid invoice", async () => {
    const c = await newClub(w.srv.url);
    const before = await subscribe(c.admin, c.teamId);
    const sub = await subscriptionOf(c.clubId);
    await fakeControl(w, `/subscriptions/${sub.subscriptionId}/renew`);
    const after = await waitForBilling(c.admin, c.teamId, (x) => x.subscription.currentPeriodEnd !== before.subscription.currentPeriodEnd);
    expect(after).toMatchObject({ plan: "rink", access: "ok", subscription: { status: "active" } });
    const inv = (await c.admin.get(`${B(c.teamId)}/invoices`)).json.invoices;
    expect(inv.map((i: any) => [i.reason, i.status])).toEqual([["subscription_cycle", "paid"], ["subscription_create", "paid"]]);
  });

  it("a failed renewal: grace (mail to admins, everything works) → read-only (nothing deleted) → paying restores at once", async () => {
    const { waitForMail } = await import("./helpers");
    const c = await newClub(w.srv.url);
    await subscribe(c.admin, c.teamId);
    const stick = await c.admin.post(`/api/teams/${c.teamId}/sticks`, { label: "Grace stick", ratedFlex: 85 });
    expect(stick.status).toBe(201);
    const sub = await subscriptionOf(c.clubId);

    // The card on file now declines: the renewal fails → grace.
    await fakeControl(w, `/subscriptions/${sub.subscriptionId}/renew`, { card: "4000000000000341" });
    const grace = await waitForBilling(c.admin, c.teamId, (x) => x.access === "grace");
    expect(grace.subscription.status).toBe("past_due");
    expect(new Date(grace.graceEndsAt).getTime()).toBeGreaterThan(Date.now() + 13 * 24 * 3600_000);
    const mail = await waitForMail(c.email, /Payment for .* failed/);
    expect(mail.text).toMatch(/Everything keeps working until/);
    expect(mail.text).toMatch(/\/billing/);
    expect((await c.admin.patch(`/api/teams/${c.teamId}/sticks/${stick.json.id}`, { notes: "still writable in grace" })).status).toBe(200);

    // The retry fails too: the service marks it unpaid → read-only.
    await fakeControl(w, `/subscriptions/${sub.subscriptionId}/renew`);
    await waitForBilling(c.admin, c.teamId, (x) => x.access === "read_only");
    await waitForMail(c.email, /read-only until paid/);
    const refused = await c.admin.post(`/api/teams/${c.teamId}/sticks`, { label: "Refused stick" });
    expect(refused.status).toBe(402);
    expect(refused.json.code).toBe("read_only_unpaid");
    expect(refused.json.detail).toMatch(/read-only.*nothing was deleted/);
    expect((await c.admin.del(`/api/teams/${c.teamId}/sticks/${stick.json.id}`)).status).toBe(402);
    const upload = await fetch(`${w.srv.url}/api/uploads`, {
      method: "POST",
      headers: { "tus-resumable": "1.0.0", "upload-length": "1000", origin: "http://127.0.0.1:3000", cookie: (c.admin as any).cookies && [...(c.admin as any).cookies].map(([k, v]: [string, string]) => `${k}=${v}`).join("; "),
        "upload-metadata": `teamId ${Buffer.from(c.teamId).toString("base64")},filename ${Buffer.from("a.mp4").toString("base64")}` },
    });
    expect(upload.status).toBe(402);
    // Everything stays readable; the billing routes stay open so the admin can pay.
    const read = await c.admin.get(`/api/teams/${c.teamId}/sticks/${stick.json.id}`);
    expect(read.status).toBe(200);
    expect(read.json.notes ?? read.json.stick?.notes).toBe("still writable in grace");
    const inv = (await c.admin.get(`${B(c.teamId)}/invoices`)).json.invoices;
    const open = inv.find((i: any) => i.status === "open");
    expect(open).toMatchObject({ reason: "subscription_cycle", amountDueCents: 3900 });
    expect(await auditActions(c.admin, c.teamId)).toEqual(expect.arrayContaining(["billing.payment_failed", "billing.read_only"]));

    // Paying the open invoice restores the team at once.
    const paid = await payOnPage(open.url, "4242424242424242");
    expect(paid.status).toBe(200);
    const back = await waitForBilling(c.admin, c.teamId, (x) => x.access === "ok");
    expect(back).toMatchObject({ plan: "rink", graceEndsAt: null, subscription: { status: "active" } });
    expect((await c.admin.post(`/api/teams/${c.teamId}/sticks`, { label: "After paying" })).status).toBe(201);
    expect(await auditActions(c.admin, c.teamId)).toContain("billing.restored");
  });
});

describe("plan changes", () => {
  it("rink → arena with proration: the preview's amount is invoiced and the plan follows the webhook", async () => {
    const c = await newClub(w.srv.url);
    await subscribe(c.admin, c.teamId, "rink");
    const preview = await c.admin.post(`${B(c.teamId)}/plan/preview`, { plan: "arena" });
    expect(preview.status, preview.text).toBe(200);
    // Almost the whole period is left: close to the full difference of $60.
    expect(preview.json.amountDueCents).toBeGreaterThan(5900);
    expect(preview.json.amountDueCents).toBeLessThanOrEqual(6000);
    const change = await c.admin.put(`${B(c.teamId)}/plan`, { plan: "arena" });
    expect(change.status).toBe(202);
    await waitForBilling(c.admin, c.teamId, (x) => x.plan === "arena");
    const inv = (await c.admin.get(`${B(c.teamId)}/invoices`)).json.invoices;
    expect(inv[0]).toMatchObject({ reason: "subscription_update", status: "paid" });
    expect(Math.abs(inv[0].amountPaidCents - preview.json.amountDueCents)).toBeLessThanOrEqual(1);
    expect((await c.admin.put(`${B(c.teamId)}/plan`, { plan: "arena" })).json.code).toBe("same_plan");
    expect((await c.admin.put(`${B(c.teamId)}/plan`, { plan: "pond" })).status).toBe(422);
  });

  it("cancel at the period's end: the plan stays until then, then the club is on the free plan with everything kept", async () => {
    const c = await newClub(w.srv.url);
    await subscribe(c.admin, c.teamId, "rink");
    const stick = await c.admin.post(`/api/teams/${c.teamId}/sticks`, { label: "Kept stick" });
    expect((await c.admin.post(`${B(c.teamId)}/cancel`)).status).toBe(202);
    const scheduled = await waitForBilling(c.admin, c.teamId, (x) => x.subscription?.cancelAtPeriodEnd === true);
    expect(scheduled.plan).toBe("rink");
    expect(await auditActions(c.admin, c.teamId)).toContain("plan.cancel_scheduled");
    // Changing one's mind before the end keeps the plan …
    await c.admin.post(`${B(c.teamId)}/resume`);
    await waitForBilling(c.admin, c.teamId, (x) => x.subscription?.cancelAtPeriodEnd === false);
    await c.admin.post(`${B(c.teamId)}/cancel`);
    await waitForBilling(c.admin, c.teamId, (x) => x.subscription?.cancelAtPeriodEnd === true);
    // … and at the end the subscription is over.
    const sub = await subscriptionOf(c.clubId);
    await fakeControl(w, `/subscriptions/${sub.subscriptionId}/renew`);
    const ended = await waitForBilling(c.admin, c.teamId, (x) => x.plan === "pond");
    expect(ended).toMatchObject({ access: "ok", subscription: null });
    expect((await c.admin.get(`/api/teams/${c.teamId}/sticks/${stick.json.id}`)).status).toBe(200);
    // Only one paid invoice: nothing was charged at the end.
    expect((await c.admin.get(`${B(c.teamId)}/invoices`)).json.invoices).toHaveLength(1);
  });
});

describe("grace that ends by the clock", () => {
  it("with no event from the service, the sweep announces read-only once: audit entry and mail to admins", async () => {
    const { waitForMail, mailsTo } = await import("./helpers");
    const { announceGraceEnded } = await import("../../server/billing/sync");
    const { db } = await import("../../server/db/client");
    const { club } = await import("../../server/db/schema");
    const { eq } = await import("drizzle-orm");
    const { log } = await import("../../server/log");
    const c = await newClub(w.srv.url);
    await subscribe(c.admin, c.teamId);
    const sub = await subscriptionOf(c.clubId);
    await fakeControl(w, `/subscriptions/${sub.subscriptionId}/renew`, { card: "4000000000000341" });
    await waitForBilling(c.admin, c.teamId, (x) => x.access === "grace");
    await waitForMail(c.email, /Payment for .* failed/);
    expect(await announceGraceEnded(log)).not.toContain(c.clubId); // still in grace: nothing to say

    // Fifteen days pass and the service stays silent (it may retry later, or never).
    await db().update(club).set({ pastDueSince: new Date(Date.now() - 15 * 24 * 3600_000) }).where(eq(club.id, c.clubId));
    expect((await c.admin.get(B(c.teamId))).json.access).toBe("read_only");
    expect(await auditActions(c.admin, c.teamId)).not.toContain("billing.read_only");

    const [first, second] = await Promise.all([announceGraceEnded(log), announceGraceEnded(log)]);
    // (The server's own sweep may have got there first; either way it is said once.)
    expect([...first, ...second].filter((id) => id === c.clubId).length).toBeLessThanOrEqual(1);
    expect(await announceGraceEnded(log)).not.toContain(c.clubId);
    expect((await auditActions(c.admin, c.teamId)).filter((a) => a === "billing.read_only")).toHaveLength(1);
    await waitForMail(c.email, /read-only until paid/);
    expect((await mailsTo(c.email)).filter((m) => /read-only until paid/.test(m.subject))).toHaveLength(1);
  });
});

describe("limits of the plan", () => {
  it("staff seats: the free plan's three are taken, a fourth staff invitation is refused naming the plan; a player is fine", async () => {
    const c = await newClub(w.srv.url);
    const T = `/api/teams/${c.teamId}`;
    expect((await c.admin.post(`${T}/invitations`, { email: "coach1@otters.example", role: "coach" })).status).toBe(201);
    expect((await c.admin.post(`${T}/invitations`, { email: "analyst1@otters.example", role: "analyst" })).status).toBe(201);
    const fourth = await c.admin.post(`${T}/invitations`, { email: "coach2@otters.example", role: "coach" });
    expect(fourth.status).toBe(409);
    expect(fourth.json).toMatchObject({ code: "plan_limit" });
    expect(fourth.json.detail).toMatch(/Pond plan has 3 staff seats/);
    expect((await c.admin.post(`${T}/invitations`, { email: "player1@otters.example", role: "player" })).status).toBe(201);
    // Re-sending an invitation that already holds a seat is not a new seat.
    const inv = (await c.admin.get(`${T}/members`)).json.invitations.find((i: any) => i.email === "coach1@otters.example");
    expect((await c.admin.post(`${T}/invitations/${inv.id}/resend`)).status).toBe(200);
    expect((await c.admin.get(B(c.teamId))).json.usage.staffSeats).toBe(3);
  });

  it("staff seats under a race: eight staff invitations sent at once for the last two seats give exactly two", async () => {
    const c = await newClub(w.srv.url);
    const T = `/api/teams/${c.teamId}`;
    const answers = await Promise.all(Array.from({ length: 8 }, (_, i) =>
      c.admin.post(`${T}/invitations`, { email: `racer${i}@otters.example`, role: i % 2 ? "coach" : "analyst" })));
    const statuses = answers.map((a) => a.status).sort();
    expect(statuses.filter((s) => s === 201), JSON.stringify(statuses)).toHaveLength(2);
    expect(answers.filter((a) => a.status === 409).every((a) => a.json.code === "plan_limit")).toBe(true);
    expect((await c.admin.get(B(c.teamId))).json.usage.staffSeats).toBe(3);
  });

  it("teams per club: one on the free plan, more once on a larger plan", async () => {
    const c = await newClub(w.srv.url);
    const refused = await c.admin.post(`/api/teams/${c.teamId}/club/teams`, { name: "Otters U14" });
    expect(refused.status).toBe(409);
    expect(refused.json.detail).toMatch(/Pond plan has room for one team/);
    await subscribe(c.admin, c.teamId, "rink");
    const made = await c.admin.post(`/api/teams/${c.teamId}/club/teams`, { name: "Otters U14" });
    expect(made.status).toBe(201);
    const me = (await c.admin.get("/api/me")).json;
    expect(JSON.stringify(me)).toContain("Otters U14");
    expect((await c.admin.get(B(made.json.id))).json).toMatchObject({ plan: "rink", usage: { teams: 2 } });
  });
});
