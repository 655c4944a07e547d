import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Client, EMAILS, linkIn, seedWorld, startServer, waitForMail, type TestServer } from "./helpers";

let srv: TestServer;
let world: Awaited<ReturnType<typeof seedWorld>>;
let admin: Client;

beforeAll(async () => {
  srv = await startServer();
  world = await seedWorld();
  admin = await new Client(srv.url).signIn(EMAILS.admin);
});
afterAll(() => srv.close());

const T = () => `/api/teams/${world.teamId}`;

describe("sign-in", () => {
  it("rejects a wrong password and an unknown e-mail with a message", async () => {
    const c = new Client(srv.url);
    const wrong = await c.post("/api/auth/sign-in/email", { email: EMAILS.coach, password: "not-the-password" });
    expect(wrong.status).toBe(401);
    expect(wrong.headers.get("content-type")).toMatch(/application\/problem\+json/);
    expect(wrong.json.detail).toMatch(/invalid/i);
    const unknown = await c.post("/api/auth/sign-in/email", { email: "nobody@ravens.example", password: "whatever-123" });
    expect(unknown.status).toBe(401);
    expect((await c.get("/api/me")).status).toBe(401);
  });

  it("lists the person's teams with their role and switches between them", async () => {
    const c = await new Client(srv.url).signIn(EMAILS.coach);
    const me = (await c.get("/api/me")).json;
    expect(me.teams.map((t: any) => `${t.name}: ${t.role}`).sort()).toEqual(["Lakeport Ravens U16: coach", "Lakeport Ravens: coach"].sort());
    const r = await c.put("/api/me/active-team", { teamId: world.secondTeamId });
    expect(r.status).toBe(200);
    expect(r.json.activeTeamId).toBe(world.secondTeamId);
    expect((await c.get("/api/me")).json.activeTeamId).toBe(world.secondTeamId);
    expect((await c.put("/api/me/active-team", { teamId: world.otherTeamId })).status).toBe(404);
  });

  it("answers malformed JSON and an oversize body as problem+json", async () => {
    const bad = await admin.request("PATCH", "/api/me/prefs", "{not json", { headers: { "content-type": "application/json" } });
    expect(bad.status).toBe(400);
    expect(bad.headers.get("content-type")).toMatch(/problem\+json/);
    expect(bad.json.code).toBe("malformed_json");
    const big = await admin.request("PATCH", "/api/me/prefs", JSON.stringify({ units: "x".repeat(3 * 1024 * 1024) }), { headers: { "content-type": "application/json" } });
    expect(big.status).toBe(413);
    expect(big.json.code).toBe("too_large");
  });
});

describe("roster", () => {
  it("invites by e-mail; the invitee follows the mailed link, sets a password and lands in the team", async () => {
    const email = "rookie@ravens.example";
    const inv = await admin.post(`${T()}/invitations`, { email, role: "analyst" });
    expect(inv.status).toBe(201);
    const mail = await waitForMail(email, /invited to Lakeport Ravens/);
    const link = linkIn(mail.text);
    expect(link).toMatch(new RegExp(`/invite/${inv.json.id}$`));

    const invitee = new Client(srv.url);
    const info = await invitee.get(`/api/invitations/${inv.json.id}`);
    expect(info.json).toMatchObject({ email, teamName: "Lakeport Ravens", role: "analyst", hasAccount: false });
    const acc = await invitee.post(`/api/invitations/${inv.json.id}/accept`, { name: "Robin Rookie", password: "a-good-password" });
    expect(acc.status).toBe(200);
    const me = (await invitee.get("/api/me")).json;
    expect(me.teams).toEqual([expect.objectContaining({ id: world.teamId, role: "analyst" })]);

    // reused link
    const again = await new Client(srv.url).post(`/api/invitations/${inv.json.id}/accept`, { name: "X", password: "a-good-password" });
    expect(again.status).toBe(410);
    expect(again.json.code).toBe("invitation_used");
  });

  it("refuses a duplicate member and a duplicate invitation, and changes nothing", async () => {
    const dup = await admin.post(`${T()}/invitations`, { email: EMAILS.player, role: "player" });
    expect(dup.status).toBe(409);
    expect(dup.json.code).toBe("already_member");
    const first = await admin.post(`${T()}/invitations`, { email: "twice@ravens.example", role: "player" });
    expect(first.status).toBe(201);
    const second = await admin.post(`${T()}/invitations`, { email: "twice@ravens.example", role: "coach" });
    expect(second.status).toBe(409);
    expect(second.json.code).toBe("already_invited");
    const list = (await admin.get(`${T()}/members`)).json.invitations.filter((i: any) => i.email === "twice@ravens.example");
    expect(list).toHaveLength(1);
    expect(list[0].role).toBe("player");
  });

  it("resends and cancels an invitation; a cancelled link says so", async () => {
    const inv = (await admin.post(`${T()}/invitations`, { email: "maybe@ravens.example", role: "coach" })).json;
    expect((await admin.post(`${T()}/invitations/${inv.id}/resend`)).status).toBe(200);
    expect((await admin.del(`${T()}/invitations/${inv.id}`)).status).toBe(204);
    const r = await new Client(srv.url).get(`/api/invitations/${inv.id}`);
    expect(r.status).toBe(410);
    expect(r.json.code).toBe("invitation_cancelled");
  });

  it("an expired invitation is refused", async () => {
    const inv = (await admin.post(`${T()}/invitations`, { email: "late@ravens.example", role: "player" })).json;
    const { db } = await import("../../server/db/client");
    const { invitation } = await import("../../server/db/schema");
    const { eq } = await import("drizzle-orm");
    await db().update(invitation).set({ expiresAt: new Date(Date.now() - 1000) }).where(eq(invitation.id, inv.id));
    const r = await new Client(srv.url).post(`/api/invitations/${inv.id}/accept`, { name: "Late", password: "a-good-password" });
    expect(r.status).toBe(410);
    expect(r.json.code).toBe("invitation_expired");
  });

  it("a role change takes effect on the member's next request", async () => {
    const p2 = await new Client(srv.url).signIn(EMAILS.player2);
    expect((await p2.get(`${T()}/members`)).status).toBe(403);
    const m = (await admin.get(`${T()}/members`)).json.members.find((x: any) => x.email === EMAILS.player2);
    const r = await admin.patch(`${T()}/members/${m.id}`, { role: "coach" });
    expect(r.status).toBe(200);
    expect((await p2.get(`${T()}/members`)).status).toBe(200);
    await admin.patch(`${T()}/members/${m.id}`, { role: "player" });
    expect((await p2.get(`${T()}/members`)).status).toBe(403);
    const audit = (await admin.get(`${T()}/audit`)).json.entries.filter((e: any) => e.action === "member.role_changed");
    expect(audit.length).toBeGreaterThanOrEqual(2);
  });

  it("removing a member keeps their name, e-mail and role in the audit log", async () => {
    const r = await admin.post(`${T()}/invitations`, { email: `leaver-${Date.now()}@ravens.example`, role: "player" });
    const joiner = new Client(srv.url);
    expect((await joiner.post(`/api/invitations/${r.json.id}/accept`, { name: "Lee Leaver", password: "leaver-password-1" })).status).toBe(200);
    const m = (await admin.get(`${T()}/members`)).json.members.find((x: any) => x.name === "Lee Leaver");
    expect((await admin.del(`${T()}/members/${m.id}`)).status).toBe(204);
    const entry = (await admin.get(`${T()}/audit`)).json.entries.find((e: any) => e.action === "member.removed" && e.targetId === m.id);
    expect(entry.detail).toMatchObject({ userId: m.userId, name: "Lee Leaver", email: r.json.email, role: "player" });
  });

  it("keeps at least one team admin and validates the role", async () => {
    const me = (await admin.get(`${T()}/members`)).json.members.find((x: any) => x.email === EMAILS.admin);
    const r = await admin.patch(`${T()}/members/${me.id}`, { role: "coach" });
    expect(r.status).toBe(409);
    expect(r.json.code).toBe("last_admin");
    const bad = await admin.patch(`${T()}/members/${me.id}`, { role: "captain" });
    expect(bad.status).toBe(422);
    expect(bad.json.errors[0].path).toBe("role");
  });

  it("password reset by e-mail", async () => {
    const c = new Client(srv.url);
    const r = await c.post("/api/auth/request-password-reset", { email: EMAILS.analyst, redirectTo: "/reset-password" });
    expect(r.status).toBe(200);
    const mail = await waitForMail(EMAILS.analyst, /Reset your Loadframe password/);
    const link = new URL(linkIn(mail.text));
    // better-auth's link verifies the token, then redirects to our page with ?token=
    const hop = await c.get(link.pathname + link.search);
    expect(hop.status).toBe(302);
    const token = new URL(hop.headers.get("location")!, srv.url).searchParams.get("token")!;
    expect(token).toBeTruthy();
    expect((await c.post("/api/auth/reset-password", { newPassword: "brand-new-secret", token })).status).toBe(200);
    await new Client(srv.url).signIn(EMAILS.analyst, "brand-new-secret");
    expect((await c.post("/api/auth/reset-password", { newPassword: "another-secret-1", token })).status).toBe(400);
  });
});
