// Sign-in limits without a proxy (issue group 6): X-Forwarded-For is not believed unless
// TRUST_PROXY says so, so rotating it does not give a client fresh attempts.
process.env.RATE_LIMIT = "true";
delete process.env.TRUST_PROXY;
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Client, seedWorld, startServer, type TestServer } from "./helpers";
import { RATE_LIMITS } from "../../server/security/rate-limits";

let srv: TestServer;
beforeAll(async () => {
  srv = await startServer();
  await seedWorld();
});
afterAll(() => srv.close());

describe("sign-in limits behind no proxy", () => {
  it("a forged X-Forwarded-For on each attempt buys no extra guesses", async () => {
    const c = new Client(srv.url);
    const statuses: number[] = [];
    for (let i = 0; i < RATE_LIMITS.signIn + 3; i++) {
      const r = await c.request("POST", "/api/auth/sign-in/email", { email: `nobody${i}@ravens.example`, password: `guess-number-${i}` }, { headers: { "x-forwarded-for": `198.51.100.${i + 1}` } });
      statuses.push(r.status);
    }
    expect(statuses.slice(0, RATE_LIMITS.signIn).every((s) => s === 401)).toBe(true);
    expect(statuses.slice(RATE_LIMITS.signIn)).toEqual([429, 429, 429]);
  });
});
