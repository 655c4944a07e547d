// The smaller leaks (issue group 7): readiness details, cache headers of private media, the
// answer a player gets for another player's clip, quota held by unfinished uploads, and what a
// signed-out session's copied cookie can still do.
process.env.TRUST_PROXY = "loopback"; // so a test can stand in for a client on another machine
import "./clips-support";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Client, EMAILS, seedWorld, startServer, type TestServer } from "./helpers";
import { routeTable, type Ctx } from "./route-table";
import { trustedOriginsFor } from "../../server/auth/auth";

let srv: TestServer;
let world: Awaited<ReturnType<typeof seedWorld>>;
let admin: Client;
let ctx: Ctx;

beforeAll(async () => {
  srv = await startServer();
  world = await seedWorld();
  admin = await new Client(srv.url).signIn(EMAILS.admin);
  ctx = { teamId: world.teamId, otherTeamId: world.otherTeamId, ids: {}, admin, users: world.users };
});
afterAll(() => srv.close());

const T = () => `/api/teams/${world.teamId}`;
const remote = { "x-forwarded-for": "203.0.113.50" };

describe("smaller leaks", () => {
  it("/api/ready tells a stranger only ok per part, an admin or the machine itself the details", async () => {
    const stranger = await new Client(srv.url).request("GET", "/api/ready", undefined, { headers: remote });
    expect(Object.keys(stranger.json.checks).sort()).toEqual(["database", "ffmpeg", "queue", "storage"].sort());
    expect(stranger.text).not.toMatch(/ffmpeg version|GiB|free/);
    for (const c of Object.values(stranger.json.checks) as { detail?: string }[]) expect(c.detail).toBeUndefined();
    const player = await new Client(srv.url).signIn(EMAILS.player);
    expect((await player.request("GET", "/api/ready", undefined, { headers: remote })).text).not.toMatch(/ffmpeg version/);
    const asAdmin = await admin.request("GET", "/api/ready", undefined, { headers: remote });
    expect(asAdmin.json.checks.storage.detail ?? asAdmin.json.checks.ffmpeg.detail).toBeTruthy();
    const local = await new Client(srv.url).get("/api/ready");
    expect(local.json.checks.storage.detail).toBeTruthy();
  });

  it("trusts development origins only outside production", () => {
    expect(trustedOriginsFor({ NODE_ENV: "production", PUBLIC_URL: "http://192.168.1.20:3000" })).toEqual(["http://192.168.1.20:3000"]);
    expect(trustedOriginsFor({ NODE_ENV: "development", PUBLIC_URL: "http://127.0.0.1:3000" })).toContain("http://localhost:5173");
  });

  it("frames, thumbnails and originals are cached privately, never by a shared cache", async () => {
    const { clipId } = await routeTable.find((r) => r.name === "clip frame")!.fixture!(ctx);
    for (const path of [`${T()}/clips/${clipId}/frames/1`, `${T()}/clips/${clipId}/original`]) {
      const r = await admin.get(path);
      expect(r.status, path).toBeLessThan(300);
      expect(r.headers.get("cache-control"), path).toMatch(/^private\b/);
    }
  });

  it("a player writing a calibration on another player's clip gets 404, as for no clip", async () => {
    const { clipId } = await routeTable.find((r) => r.name === "set clip calibration")!.fixture!(ctx);
    const other = await new Client(srv.url).signIn(EMAILS.player2);
    const r = await other.request("PUT", `${T()}/clips/${clipId}/calibration`, { calibration: null });
    expect(r.status).toBe(404);
    const own = await new Client(srv.url).signIn(EMAILS.player);
    expect((await own.request("PUT", `${T()}/clips/${clipId}/calibration`, { calibration: null })).status).toBe(403);
  });

  it("an unfinished upload holds only the bytes it received, not the size it claimed", async () => {
    const { cookieOf } = await import("./clips-support");
    const coach = await new Client(srv.url).signIn(EMAILS.coach);
    const meta = JSON.stringify({ title: "", newSession: { date: "2026-03-14", venue: "", drill: "" }, shotType: "slap", cameraView: "side", playerId: world.users[EMAILS.player] });
    const b64 = (s: string) => Buffer.from(s).toString("base64");
    const start = (length: number) => fetch(`${srv.url}/api/uploads`, {
      method: "POST",
      headers: { cookie: cookieOf(coach), origin: "http://127.0.0.1:3000", "tus-resumable": "1.0.0", "upload-length": String(length), "upload-metadata": `teamId ${b64(world.teamId)},filename ${b64("a.mp4")},meta ${b64(meta)}` },
    });
    const { storageAllowance } = await import("../../server/billing/limits");
    const { clubFor } = await import("../../server/billing/clubs");
    const { db } = await import("../../server/db/client");
    const { club } = await import("../../server/db/schema");
    const { eq } = await import("drizzle-orm");
    await db().update(club).set({ plan: "pond" }).where(eq(club.id, (await clubFor(world.teamId)).id)); // 5 GB
    const limit = (await storageAllowance(world.teamId)).limitBytes;
    const hog = await start(Math.floor(limit * 0.7));
    expect(hog.status, await hog.clone().text()).toBe(201);
    const next = await start(Math.floor(limit * 0.4));
    expect(next.status, `${limit} ${await next.text()}`).toBe(201);
  });

  it("a copied cookie of a signed-out session can change nothing", async () => {
    const c = await new Client(srv.url).signIn(EMAILS.analyst);
    const copy = (c as unknown as { cookies: Map<string, string> }).cookies;
    const cookie = [...copy].map(([k, v]) => `${k}=${v}`).join("; ");
    // A read first, so the process has this Cookie header's session in its short memo (decision 174).
    expect((await fetch(`${srv.url}/api/me`, { headers: { cookie } })).status).toBe(200);
    expect((await c.post("/api/auth/sign-out", {})).status).toBe(200);
    // The signed-out browser itself sends no session any more: its next read is refused at once.
    expect((await c.request("GET", "/api/me")).status).toBe(401);
    const write = await fetch(`${srv.url}/api/me/prefs`, { method: "PATCH", headers: { cookie, "content-type": "application/json", origin: "http://127.0.0.1:3000" }, body: JSON.stringify({ units: "imperial" }) });
    expect(write.status).toBe(401);
    const upload = await fetch(`${srv.url}/api/uploads`, { method: "POST", headers: { cookie, origin: "http://127.0.0.1:3000", "tus-resumable": "1.0.0", "upload-length": "10", "upload-metadata": `teamId ${Buffer.from(world.teamId).toString("base64")}` } });
    expect(upload.status).toBe(401);
  });
});
