// Sign-in limits behind a configured proxy (issue group 6): each client address and each account
// is limited, and a stranger guessing an account's password cannot lock its owner out.
process.env.RATE_LIMIT = "true";
process.env.TRUST_PROXY = "loopback";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Client, EMAILS, seedWorld, startServer, type TestServer } from "./helpers";
import { DEMO_PASSWORD } from "../../server/seed/demo-people";
import { RATE_LIMITS } from "../../server/security/rate-limits";

let srv: TestServer;
beforeAll(async () => {
  srv = await startServer();
  await seedWorld();
});
afterAll(() => srv.close());

const signIn = (from: string, email: string, password: string) =>
  new Client(srv.url).request("POST", "/api/auth/sign-in/email", { email, password }, { headers: { "x-forwarded-for": from } });

describe("sign-in limits per account and per client", () => {
  it("limits wrong passwords for one account from one address, and the owner elsewhere still signs in", async () => {
    const attacker = "203.0.113.7";
    for (let i = 0; i < RATE_LIMITS.signInFailuresPerAccount; i++) expect((await signIn(attacker, EMAILS.player, `guess-${i}-xxxx`)).status).toBe(401);
    const over = await signIn(attacker, EMAILS.player, "guess-over-xxxx");
    expect(over.status).toBe(429);
    expect(over.json.code).toBe("rate_limited");
    // the owner, from another address, with the right password
    expect((await signIn("198.51.100.20", EMAILS.player, DEMO_PASSWORD)).status).toBe(200);
    // and the attacker's address is not locked out of every account by this one
    expect((await signIn(attacker, EMAILS.coach, DEMO_PASSWORD)).status).toBe(200);
  });

  it("a correct password does not count towards the account's limit", async () => {
    const from = "203.0.113.8";
    for (let i = 0; i < RATE_LIMITS.signInFailuresPerAccount + 2; i++) expect((await signIn(from, EMAILS.analyst, DEMO_PASSWORD)).status).toBe(200);
  });

  it("records the client's address on the session, not a header it made up", async () => {
    const { db } = await import("../../server/db/client");
    const { session } = await import("../../server/db/schema");
    const r = await signIn("198.51.100.77", EMAILS.player2, DEMO_PASSWORD);
    expect(r.status).toBe(200);
    const rows = await db().select({ ip: session.ipAddress }).from(session);
    expect(rows.map((x) => x.ip)).toContain("198.51.100.77");
  });
});
