// Accounts and sessions against a hostile outsider (issue group 1): nobody creates an account
// without a product flow that proved the address, a password reset ends every session of the
// account, and the name whoever made an unclaimed account chose never reaches a mail.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import { Client, EMAILS, linkIn, mailsTo, seedWorld, startServer, waitForMail, type TestServer } from "./helpers";
import { db } from "../../server/db/client";
import { session, user } from "../../server/db/schema";

let srv: TestServer;
let world: Awaited<ReturnType<typeof seedWorld>>;
let admin: Client;

beforeAll(async () => {
  srv = await startServer();
  world = await seedWorld();
  admin = await new Client(srv.url).signIn(EMAILS.admin);
});
afterAll(() => srv.close());

const userRow = async (email: string) => (await db().select().from(user).where(eq(user.email, email)))[0];
const sessionsOf = async (userId: string) => db().select().from(session).where(eq(session.userId, userId));

/** Follows the reset mail's link to its token and sets a new password. */
async function resetByMail(email: string, newPassword: string) {
  const c = new Client(srv.url);
  expect((await c.post("/api/auth/request-password-reset", { email, redirectTo: "/reset-password" })).status).toBe(200);
  const mail = await waitForMail(email, /Reset your Loadframe password/);
  const link = new URL(linkIn(mail.text));
  const hop = await c.get(link.pathname + link.search);
  const token = new URL(hop.headers.get("location")!, srv.url).searchParams.get("token")!;
  expect((await c.post("/api/auth/reset-password", { newPassword, token })).status).toBe(200);
  return mail;
}

/** An account nobody proved the address of, as the open sign-up could make one before it closed. */
async function unclaimedAccount(email: string, name: string, password: string) {
  const accounts = await import("../../server/auth/accounts").catch(() => null);
  if (accounts) await accounts.createAccount({ email, name, password, emailVerified: false, signIn: false });
  else await (await import("../../server/auth/auth")).auth().api.signUpEmail({ body: { email, name, password } });
}

describe("no open sign-up", () => {
  it("refuses the auth library's e-mail sign-up over HTTP and stores nothing", async () => {
    const email = "squatter@ravens.example";
    const r = await new Client(srv.url).post("/api/auth/sign-up/email", { email, password: "squatter-password-1", name: "Squatter" });
    expect(r.status).toBe(404);
    expect(r.headers.get("content-type")).toMatch(/application\/problem\+json/);
    expect(await userRow(email)).toBeUndefined();
    expect((await new Client(srv.url).post("/api/auth/sign-in/email", { email, password: "squatter-password-1" })).status).toBe(401);
  });

  it("refuses a server-side sign-up that does not come through the product's account flow", async () => {
    const { auth } = await import("../../server/auth/auth");
    const email = "backdoor@ravens.example";
    await expect(auth().api.signUpEmail({ body: { email, password: "backdoor-password-1", name: "Backdoor" } })).rejects.toThrow();
    expect(await userRow(email)).toBeUndefined();
  });

  it("still lets an invited person create an account, with the address counted as proved", async () => {
    const email = "invited.rookie@ravens.example";
    const inv = await admin.post(`/api/teams/${world.teamId}/invitations`, { email, role: "player" });
    expect(inv.status).toBe(201);
    const joiner = new Client(srv.url);
    const r = await joiner.post(`/api/invitations/${inv.json.id}/accept`, { name: "Riley Rookie", password: "rookie-password-1" });
    expect(r.status, r.text).toBe(200);
    expect((await joiner.get("/api/me")).json.teams.map((t: { id: string }) => t.id)).toContain(world.teamId);
    const row = await userRow(email);
    expect(row?.emailVerified).toBe(true);
    expect(row?.name).toBe("Riley Rookie");
  });
});

describe("password reset", () => {
  it("ends every session of the account, at once for writes", async () => {
    const email = EMAILS.player2;
    const elsewhere = await new Client(srv.url).signIn(email);
    expect((await elsewhere.patch("/api/me/prefs", { units: "imperial" })).status).toBe(200);
    const { id } = (await userRow(email))!;
    expect((await sessionsOf(id)).length).toBeGreaterThan(0);

    await resetByMail(email, "player-two-new-secret");

    expect(await sessionsOf(id)).toEqual([]);
    const write = await elsewhere.patch("/api/me/prefs", { units: "metric" });
    expect(write.status).toBe(401);
    expect(write.headers.get("content-type")).toMatch(/application\/problem\+json/);
    await new Client(srv.url).signIn(email, "player-two-new-secret");
  });

  it("takes over nothing: the maker of an unclaimed account loses it and its name at the owner's reset", async () => {
    const email = "late.invitee@ravens.example";
    const lure = "Loadframe Support - call 555-0100 now";
    await unclaimedAccount(email, lure, "squatter-password-2");
    const squatter = await new Client(srv.url).signIn(email, "squatter-password-2");
    const squatterSessions = (await sessionsOf((await userRow(email))!.id)).map((s) => s.id);
    expect(squatterSessions.length).toBe(1);

    // The real owner is invited, resets the password and accepts.
    const inv = await admin.post(`/api/teams/${world.teamId}/invitations`, { email, role: "analyst" });
    expect(inv.status).toBe(201);
    const resetMail = await resetByMail(email, "the-real-owner-secret");
    expect(resetMail.text).not.toContain(lure);
    expect(resetMail.html).not.toContain("555-0100");
    const owner = await new Client(srv.url).signIn(email, "the-real-owner-secret");
    expect((await owner.post(`/api/invitations/${inv.json.id}/accept`, {})).status).toBe(200);

    // The squatter's old session: writes refused at once, and no session row is left to read with.
    expect((await squatter.patch("/api/me/prefs", { units: "imperial" })).status).toBe(401);
    const row = (await userRow(email))!;
    const left = (await sessionsOf(row.id)).map((s) => s.id);
    expect(left.filter((id) => squatterSessions.includes(id))).toEqual([]);
    expect(row.emailVerified).toBe(true);
    expect(row.name).not.toContain("555");

    // The roster and a mail that names the member carry the name the owner's address gives, not the lure.
    const roster = (await admin.get(`/api/teams/${world.teamId}/members`)).json.members as { email: string; name: string }[];
    expect(roster.find((m) => m.email === email)?.name).not.toContain("555");
    for (const m of await mailsTo(email)) expect(m.text).not.toContain("555-0100");
  });
});
