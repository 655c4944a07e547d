// Response headers (helmet), the content security policy, session cookie flags, and the
// cross-site write guard on our own /api routes.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Client, EMAILS, seedWorld, startServer, type TestServer } from "./helpers";
import { DEMO_PASSWORD } from "../../server/seed/demo-people";

let srv: TestServer;
let cookie = "";
let setCookie: string[] = [];

beforeAll(async () => {
  srv = await startServer();
  await seedWorld();
  const r = await fetch(`${srv.url}/api/auth/sign-in/email`, {
    method: "POST",
    headers: { "content-type": "application/json", origin: "http://127.0.0.1:3000" },
    body: JSON.stringify({ email: EMAILS.coach, password: DEMO_PASSWORD }),
  });
  expect(r.status).toBe(200);
  setCookie = r.headers.getSetCookie();
  cookie = setCookie.map((c) => c.split(";")[0]).join("; ");
});
afterAll(() => srv.close());

const raw = (method: string, path: string, headers: Record<string, string>, body?: unknown) =>
  fetch(srv.url + path, { method, headers: { cookie, ...(body ? { "content-type": "application/json" } : {}), ...headers }, body: body ? JSON.stringify(body) : undefined });
const units = async () => (await (await raw("GET", "/api/me", {})).json()).prefs?.units;

describe("response headers", () => {
  it("sets helmet's protective headers on API answers and pages", async () => {
    for (const path of ["/api/health", "/api/me", "/"]) {
      const r = await fetch(srv.url + path);
      const h = r.headers;
      // Header meanings: RFC 7034 (X-Frame-Options), WHATWG Fetch (X-Content-Type-Options),
      // RFC 6797 (HSTS), W3C Referrer Policy; helmet 8's defaults [docs].
      expect(h.get("x-content-type-options"), path).toBe("nosniff");
      expect(h.get("x-frame-options"), path).toBe("SAMEORIGIN");
      expect(h.get("referrer-policy"), path).toBe("no-referrer");
      // HSTS only behind https (security-https.test.ts): over plain http a browser must keep http.
      expect(h.get("strict-transport-security"), path).toBeNull();
      expect(h.get("cross-origin-opener-policy"), path).toBe("same-origin");
      expect(h.get("x-powered-by"), path).toBeNull();
      expect(h.get("content-security-policy"), path).toBeTruthy();
    }
  });

  it("has a content security policy that allows only our own origin", async () => {
    const csp = (await fetch(`${srv.url}/api/health`)).headers.get("content-security-policy")!;
    const directives = new Map(csp.split(";").map((d) => d.trim().split(/\s+/)).filter((p) => p[0]).map(([k, ...v]) => [k, v]));
    // CSP Level 3 (W3C): default-src is the fallback for every fetch directive not listed.
    expect(directives.get("default-src")).toEqual(["'self'"]);
    expect(directives.get("object-src")).toEqual(["'none'"]);
    expect(directives.get("frame-ancestors")).toEqual(["'none'"]);
    expect(directives.get("connect-src")).toEqual(["'self'"]);
    expect(directives.get("base-uri")).toEqual(["'self'"]);
    expect(directives.get("form-action")).toEqual(["'self'"]);
    // No host, no scheme wildcard, no inline or eval script: only keywords and data:/blob: for
    // images, fonts and workers. 'wasm-unsafe-eval' lets the tracking assist compile WebAssembly.
    const allowedTokens = new Set(["'self'", "'none'", "data:", "blob:", "'unsafe-inline'", "'wasm-unsafe-eval'"]);
    // Over plain http (a club network) the page must not ask for its assets over https.
    expect(directives.has("upgrade-insecure-requests")).toBe(false);
    for (const [name, values] of directives) {
      for (const v of values) expect(allowedTokens.has(v), `${name} ${v}`).toBe(true);
    }
    expect(directives.get("script-src")).toEqual(["'self'", "'wasm-unsafe-eval'"]);
    expect(directives.get("script-src-attr")).toEqual(["'none'"]);
  });
});

describe("session cookie", () => {
  it("is HttpOnly, SameSite=Lax and scoped to the whole site", () => {
    const session = setCookie.find((c) => /session_token=/.test(c));
    expect(session).toBeTruthy();
    // RFC 6265bis: HttpOnly hides it from scripts; SameSite=Lax keeps it off cross-site
    // sub-requests and POSTs. Secure is only set for an https PUBLIC_URL (security-https.test.ts).
    expect(session).toMatch(/;\s*HttpOnly/i);
    expect(session).toMatch(/;\s*SameSite=Lax/i);
    expect(session).toMatch(/;\s*Path=\//i);
    expect(session).toMatch(/;\s*Max-Age=\d+/i);
  });
});

describe("cross-site writes", () => {
  it("refuses a write from another origin and changes nothing", async () => {
    expect(await units()).toBe("metric");
    const cases: Record<string, string>[] = [
      { origin: "http://evil.example" },
      { origin: "http://evil.example", "sec-fetch-site": "cross-site" },
      // a sibling subdomain: "same site" for SameSite cookies, still another origin
      { origin: "http://club.ravens.example", "sec-fetch-site": "same-site" },
      { origin: "null" },
      { "sec-fetch-site": "cross-site" },
    ];
    for (const headers of cases) {
      const r = await raw("PATCH", "/api/me/prefs", headers, { units: "imperial" });
      expect(r.status, JSON.stringify(headers)).toBe(403);
      expect(r.headers.get("content-type")).toMatch(/application\/problem\+json/);
      expect((await r.json()).code).toBe("cross_site_request");
    }
    // A form POST (no JSON, no preflight) from another site is refused the same way.
    const form = await fetch(`${srv.url}/api/teams/x/invitations`, { method: "POST", headers: { cookie, origin: "http://evil.example", "content-type": "application/x-www-form-urlencoded" }, body: "email=a%40b.example" });
    expect(form.status).toBe(403);
    expect(await units()).toBe("metric");
  });

  it("lets our own pages, trusted origins and non-browser clients write", async () => {
    const ok: Record<string, string>[] = [
      { origin: "http://127.0.0.1:3000" }, // PUBLIC_URL, trusted
      { origin: "http://127.0.0.1:5173", "sec-fetch-site": "same-site" }, // the dev server, trusted
      { origin: srv.url, "sec-fetch-site": "same-origin" },
      { origin: srv.url }, // an older browser without Fetch Metadata, same host
      {}, // curl or a script: no ambient cookie from a browser
    ];
    for (const [i, headers] of ok.entries()) {
      const r = await raw("PATCH", "/api/me/prefs", headers, { units: i % 2 ? "metric" : "imperial" });
      expect(r.status, JSON.stringify(headers)).toBe(200);
      expect(await units()).toBe(i % 2 ? "metric" : "imperial");
    }
  });

  it("leaves reads alone and also guards better-auth's routes", async () => {
    expect((await raw("GET", "/api/me", { origin: "http://evil.example", "sec-fetch-site": "cross-site" })).status).toBe(200);
    // better-auth skips its own Origin check under NODE_ENV=test (and without a cookie): ours holds.
    const signIn = await fetch(`${srv.url}/api/auth/sign-in/email`, {
      method: "POST",
      headers: { "content-type": "application/json", origin: "http://evil.example", "sec-fetch-site": "cross-site", "sec-fetch-mode": "cors" },
      body: JSON.stringify({ email: EMAILS.coach, password: DEMO_PASSWORD }),
    });
    expect(signIn.status).toBe(403);
    expect((await signIn.json()).code).toBe("cross_site_request");
    const signOut = await raw("POST", "/api/auth/sign-out", { origin: "http://evil.example" }, {});
    expect(signOut.status).toBe(403);
    expect((await raw("GET", "/api/me", {})).status).toBe(200);
  });

  it("does not get in the way of the test client (same trusted origin)", async () => {
    const c = await new Client(srv.url).signIn(EMAILS.analyst);
    expect((await c.patch("/api/me/prefs", { units: "imperial" })).status).toBe(200);
  });
});
