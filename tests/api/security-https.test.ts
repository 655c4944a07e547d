// Behind https (PUBLIC_URL https://…) the session cookie is also Secure and carries the
// __Secure- name prefix, so a browser never sends it over plain http (RFC 6265bis, cookie prefixes).
process.env.PUBLIC_URL = "https://loadframe.club.example";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { EMAILS, seedWorld, startServer, type TestServer } from "./helpers";
import { DEMO_PASSWORD } from "../../server/seed/demo-people";

let srv: TestServer;
beforeAll(async () => {
  srv = await startServer();
  await seedWorld();
});
afterAll(() => srv.close());

describe("transport security behind https", () => {
  it("tells browsers to stay on https: HSTS and upgrade-insecure-requests", async () => {
    const h = (await fetch(`${srv.url}/api/health`)).headers;
    // RFC 6797 (HSTS); CSP Upgrade Insecure Requests (W3C).
    expect(h.get("strict-transport-security")).toMatch(/max-age=\d+/);
    expect(h.get("content-security-policy")).toMatch(/upgrade-insecure-requests/);
  });
});

describe("session cookie behind https", () => {
  it("is Secure, HttpOnly, SameSite=Lax with the __Secure- prefix", async () => {
    const r = await fetch(`${srv.url}/api/auth/sign-in/email`, {
      method: "POST",
      headers: { "content-type": "application/json", origin: "https://loadframe.club.example" },
      body: JSON.stringify({ email: EMAILS.coach, password: DEMO_PASSWORD }),
    });
    expect(r.status).toBe(200);
    const session = r.headers.getSetCookie().find((c) => /session_token=/.test(c))!;
    expect(session).toMatch(/^__Secure-/);
    expect(session).toMatch(/;\s*Secure/i);
    expect(session).toMatch(/;\s*HttpOnly/i);
    expect(session).toMatch(/;\s*SameSite=Lax/i);
  });

  it("trusts writes from the public https origin only", async () => {
    const prefs = (origin: string) =>
      fetch(`${srv.url}/api/me/prefs`, { method: "PATCH", headers: { "content-type": "application/json", origin, "sec-fetch-site": "cross-site" }, body: "{}" });
    expect((await prefs("https://loadframe.club.example")).status).toBe(401); // past the guard, no session
    expect((await prefs("http://loadframe.club.example")).status).toBe(403);
  });
});
