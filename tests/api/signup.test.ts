// A new club signs up: the e-mail is proven by a one-time link before anything is created; the
// link's holder becomes team admin of the club's first team, on the free plan.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Client, EMAILS, seedWorld, startServer, waitForMail, type TestServer } from "./helpers";

let srv: TestServer;
beforeAll(async () => {
  srv = await startServer();
  await seedWorld();
});
afterAll(() => srv.close());

const linkToken = (text: string) => text.match(/\/sign-up\/([\w-]+)/)?.[1] ?? "";
const details = { name: "Alex Marsh", password: "harbour-otters-1", clubName: "Harbour Otters", teamName: "Otters U18" };

async function userRow(email: string) {
  const { db } = await import("../../server/db/client");
  const { user } = await import("../../server/db/schema");
  const { eq } = await import("drizzle-orm");
  const [row] = await db().select().from(user).where(eq(user.email, email));
  return row ?? null;
}

describe("a new club signs up", () => {
  it("e-mail first: nothing exists until the mailed link is followed; then account, club, team and admin role, on the free plan", async () => {
    const email = `founder-${Date.now()}@otters.example`;
    const c = new Client(srv.url);
    const asked = await c.post("/api/signup", { email: email.toUpperCase() });
    expect(asked.status).toBe(202);
    expect(await userRow(email)).toBeNull();
    const mail = await waitForMail(email, /Confirm your e-mail/);
    const token = linkToken(mail.text);
    expect(token.length).toBeGreaterThan(30);

    expect((await c.get(`/api/signup/${token}`)).json).toEqual({ email });
    const bad = await c.post(`/api/signup/${token}`, { ...details, password: "short" });
    expect(bad.status).toBe(422);
    expect(bad.json.errors[0]).toMatchObject({ path: "password" });
    expect(await userRow(email)).toBeNull();

    const done = await c.post(`/api/signup/${token}`, details);
    expect(done.status, done.text).toBe(201);
    expect((await userRow(email))!.emailVerified).toBe(true);
    const me = (await c.get("/api/me")).json;
    expect(JSON.stringify(me)).toContain("Otters U18");
    const billing = (await c.get(`/api/teams/${done.json.teamId}/billing`)).json;
    expect(billing).toMatchObject({ club: { name: "Harbour Otters" }, plan: "pond", canManage: true, usage: { staffSeats: 1, teams: 1 } });
    const members = (await c.get(`/api/teams/${done.json.teamId}/members`)).json.members;
    expect(members).toEqual([expect.objectContaining({ email, role: "admin" })]);

    // The link works once.
    expect((await new Client(srv.url).post(`/api/signup/${token}`, details)).status).toBe(410);
    expect((await new Client(srv.url).get(`/api/signup/${token}`)).json.code).toBe("signup_link_used");
  });

  it("an address that already has an account gets the same answer and a 'sign in instead' mail; nothing is created", async () => {
    const r = await new Client(srv.url).post("/api/signup", { email: EMAILS.coach });
    expect(r.status).toBe(202);
    const mail = await waitForMail(EMAILS.coach, /already have a Loadframe account/);
    expect(mail.text).toMatch(/\/sign-in/);
    expect(mail.text).not.toMatch(/\/sign-up\//);
  });

  it("an unknown or expired link is refused and a malformed address is named", async () => {
    const c = new Client(srv.url);
    expect((await c.get("/api/signup/not-a-real-token")).status).toBe(404);
    expect((await c.post("/api/signup/not-a-real-token", details)).status).toBe(404);
    const email = `late-${Date.now()}@otters.example`;
    await c.post("/api/signup", { email });
    const token = linkToken((await waitForMail(email, /Confirm your e-mail/)).text);
    const { db } = await import("../../server/db/client");
    const { signupRequest } = await import("../../server/db/schema");
    const { eq } = await import("drizzle-orm");
    await db().update(signupRequest).set({ expiresAt: new Date(Date.now() - 1000) }).where(eq(signupRequest.email, email));
    const late = await c.post(`/api/signup/${token}`, details);
    expect(late.status).toBe(410);
    expect(late.json.code).toBe("signup_link_expired");
    expect(await userRow(email)).toBeNull();
    const malformed = await c.post("/api/signup", { email: "not an address" });
    expect(malformed.status).toBe(422);
  });
});
