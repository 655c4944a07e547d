// Rate limits answer 429 problem+json with a RateLimit header; they count per address and per
// route, so one route's limit does not lock a person out of another.
process.env.RATE_LIMIT = "true";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Client, EMAILS, seedWorld, startServer, type TestServer } from "./helpers";
import { RATE_LIMITS } from "../../server/security/rate-limits";

let srv: TestServer;
let world: Awaited<ReturnType<typeof seedWorld>>;

beforeAll(async () => {
  srv = await startServer();
  world = await seedWorld();
});
afterAll(() => srv.close());

async function expectLimited(r: { status: number; headers: Headers; json: any }) {
  expect(r.status).toBe(429);
  expect(r.headers.get("content-type")).toMatch(/application\/problem\+json/);
  expect(r.json).toMatchObject({ status: 429, code: "rate_limited", title: "Too many requests" });
  // IETF draft-ietf-httpapi-ratelimit-headers-08: RateLimit-Policy and RateLimit (with t = seconds to reset).
  expect(r.headers.get("ratelimit")).toMatch(/r=0.*t=\d+/);
  expect(r.headers.get("ratelimit-policy")).toMatch(/q=\d+/);
}

describe("rate limits", () => {
  it("stops password guessing after the sign-in limit, even with the right password", async () => {
    const c = new Client(srv.url);
    for (let i = 0; i < RATE_LIMITS.signIn; i++) {
      // a different account each time: the per-account limit (5 per address) does not bite first
      const r = await c.post("/api/auth/sign-in/email", { email: `guess${i}@ravens.example`, password: `guess-number-${i}` });
      expect(r.status).toBe(401);
    }
    const over = await c.post("/api/auth/sign-in/email", { email: EMAILS.player, password: "guess-number-x" });
    await expectLimited(over);
    await expect(new Client(srv.url).signIn(EMAILS.player)).rejects.toThrow(/429/);
  });

  it("limits invitation changes but not reading the list", async () => {
    // A session made before the sign-in limit bit: this file's sign-ins all come from loopback.
    const admin = (await adminClient())!;
    const T = `/api/teams/${world.teamId}`;
    for (let i = 0; i < RATE_LIMITS.invitations; i++) {
      const r = await admin.post(`${T}/invitations`, { email: "not-an-address", role: "player" });
      expect(r.status).toBe(422);
    }
    await expectLimited(await admin.post(`${T}/invitations`, { email: "new.player@ravens.example", role: "player" }));
    expect((await admin.get(`${T}/members`)).status).toBe(200);
  });

  it("limits starting uploads, not the chunks of one upload", async () => {
    const post = () => fetch(`${srv.url}/api/uploads`, { method: "POST", headers: { "tus-resumable": "1.0.0", "upload-length": "10", "upload-metadata": `teamId ${Buffer.from(world.teamId).toString("base64")}` } });
    for (let i = 0; i < RATE_LIMITS.uploads; i++) expect((await post()).status).toBe(401);
    const over = await post();
    await expectLimited({ status: over.status, headers: over.headers, json: await over.json() });
    const chunk = await fetch(`${srv.url}/api/uploads/some-upload-id`, { method: "PATCH", headers: { "tus-resumable": "1.0.0", "upload-offset": "0", "content-type": "application/offset+octet-stream" }, body: "x" });
    expect(chunk.status).not.toBe(429);
  });
});

// Signs in the admin through better-auth's server API (no HTTP, so the sign-in limit above does
// not apply) and hands its cookie to a client.
async function adminClient() {
  const { auth } = await import("../../server/auth/auth");
  const { DEMO_PASSWORD } = await import("../../server/seed/demo-people");
  const r = await auth().api.signInEmail({ body: { email: EMAILS.admin, password: DEMO_PASSWORD }, asResponse: true });
  const c = new Client(srv.url);
  const cookie = r.headers.getSetCookie().map((x) => x.split(";")[0]).join("; ");
  const request = c.request.bind(c);
  c.request = (method, path, body, init = {}) => request(method, path, body, { ...init, headers: { ...(init.headers as object), cookie } });
  return c;
}
