// Hostile sizes and characters (issue group 2): every body has a size limit, the auth library's
// routes included; every human-entered text has a length cap and refuses NUL, control and
// text-direction override characters with a 422 naming the field; nothing is stored half-way and
// nothing answers 500.
import "./clips-support"; // a private upload folder for this file
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import { Client, EMAILS, seedWorld, startServer, type TestServer } from "./helpers";
import { routeTable, type Ctx } from "./route-table";
import { db } from "../../server/db/client";
import { session, user } from "../../server/db/schema";

let srv: TestServer;
let world: Awaited<ReturnType<typeof seedWorld>>;
let admin: Client;
let coach: Client;
let ctx: Ctx;

beforeAll(async () => {
  srv = await startServer();
  world = await seedWorld();
  admin = await new Client(srv.url).signIn(EMAILS.admin);
  coach = await new Client(srv.url).signIn(EMAILS.coach);
  ctx = { teamId: world.teamId, otherTeamId: world.otherTeamId, ids: {}, admin, users: world.users };
});
afterAll(() => srv.close());

const T = () => `/api/teams/${world.teamId}`;
const route = (name: string) => routeTable.find((r) => r.name === name)!;
const userRow = async (email: string) => (await db().select().from(user).where(eq(user.email, email)))[0];
const sessionCount = async () => (await db().select({ id: session.id }).from(session)).length;

function expectFieldProblem(r: { status: number; json: any; text: string; headers: Headers }, path: string, message: RegExp) {
  expect(r.status, r.text).toBe(422);
  expect(r.headers.get("content-type")).toMatch(/application\/problem\+json/);
  expect(r.json.code).toBe("validation_failed");
  expect(r.json.errors.map((e: { path: string }) => e.path)).toContain(path);
  expect(r.json.detail).toMatch(message);
}

const NUL = "\u0000", BELL = "\u0007", RLO = "\u202e", LRI = "\u2066";

describe("body sizes", () => {
  it("refuses a 20 MB name before it is stored, and keeps no account or session", async () => {
    const email = "huge.name@ravens.example";
    const inv = await admin.post(`${T()}/invitations`, { email, role: "player" });
    const sessions = await sessionCount();
    const r = await new Client(srv.url).post(`/api/invitations/${inv.json.id}/accept`, { name: "N".repeat(20 * 1024 * 1024), password: "huge-name-password" });
    expect(r.status).toBe(413);
    expect(r.json.code).toBe("too_large");
    expect(await userRow(email)).toBeUndefined();
    expect(await sessionCount()).toBe(sessions);
  });

  it("limits the auth library's routes to a small body, answered as problem+json", async () => {
    const big = { email: EMAILS.coach, password: "p".repeat(64 * 1024) };
    for (const path of ["/api/auth/sign-in/email", "/api/auth/request-password-reset", "/api/auth/reset-password"]) {
      const r = await new Client(srv.url).post(path, big);
      expect(r.status, path).toBe(413);
      expect(r.headers.get("content-type"), path).toMatch(/application\/problem\+json/);
      expect(r.json.code, path).toBe("too_large");
    }
  });

  it("caps a password and an e-mail address at sign-in with 422, not the library's guess", async () => {
    const r = await new Client(srv.url).post("/api/auth/sign-in/email", { email: EMAILS.coach, password: "p".repeat(500) });
    expectFieldProblem(r, "password", /at most 128/);
    const e = await new Client(srv.url).post("/api/auth/sign-in/email", { email: `${"a".repeat(300)}@ravens.example`, password: "whatever-long" });
    expectFieldProblem(e, "email", /254/);
  });
});

describe("names", () => {
  it("caps a person's name at 100 characters", async () => {
    const email = "long.name@ravens.example";
    const inv = await admin.post(`${T()}/invitations`, { email, role: "player" });
    const r = await new Client(srv.url).post(`/api/invitations/${inv.json.id}/accept`, { name: "A".repeat(101), password: "long-name-password" });
    expectFieldProblem(r, "name", /at most 100 characters/);
    expect(await userRow(email)).toBeUndefined();
  });

  it.each([
    ["NUL", `Dana${NUL}Smith`, /control character \(U\+0000\)/],
    ["a bell", `Dana${BELL}`, /control character/],
    ["a new line", "Dana\nSmith", /control character/],
    ["a right-to-left override", `Dana ${RLO}htimS`, /text-direction override/],
    ["a left-to-right isolate", `Dana ${LRI}Smith`, /text-direction override/],
    ["a broken surrogate", "Dana \ud800 Smith", /broken character/],
  ])("refuses %s in a new member's name with 422 naming the field; no account, no session", async (_what, name, message) => {
    const email = `odd.${Math.random().toString(36).slice(2)}@ravens.example`;
    const inv = await admin.post(`${T()}/invitations`, { email, role: "player" });
    const sessions = await sessionCount();
    const r = await new Client(srv.url).post(`/api/invitations/${inv.json.id}/accept`, { name, password: "odd-name-password" });
    expectFieldProblem(r, "name", message);
    expect(await userRow(email)).toBeUndefined();
    expect(await sessionCount()).toBe(sessions);
    // the invitation is still open for a good try
    expect((await new Client(srv.url).post(`/api/invitations/${inv.json.id}/accept`, { name: "Dana Smith", password: "odd-name-password" })).status).toBe(200);
  });
});

describe("text fields of clips, shots and sticks", () => {
  it("refuses control and override characters in every field, naming it, and changes nothing", async () => {
    const clip = await route("edit clip").fixture!(ctx);
    const shot = await route("update shot").fixture!(ctx);
    const stick = await route("edit stick").fixture!(ctx);
    const cases: [string, string, Record<string, unknown>, string][] = [
      ["PATCH", `${T()}/clips/${clip.clipId}`, { title: `Slap${NUL}` }, "title"],
      ["PATCH", `${T()}/clips/${clip.clipId}`, { notes: `fine\nthen ${RLO}evil` }, "notes"],
      ["PATCH", `${T()}/clips/${clip.clipId}`, { newSession: { date: "2026-03-14", venue: `Rink${BELL}`, drill: "" } }, "newSession.venue"],
      ["PATCH", `${T()}/clips/${clip.clipId}`, { newSession: { date: "2026-03-14", venue: "Rink", drill: `x${NUL}` } }, "newSession.drill"],
      ["PATCH", `${T()}/shots/${shot.shotId}`, { label: `Shot ${LRI}1` }, "label"],
      ["PATCH", `${T()}/sticks/${stick.stickId}`, { label: `Stick${NUL}` }, "label"],
      ["PATCH", `${T()}/sticks/${stick.stickId}`, { lie: "x".repeat(41) }, "lie"],
      ["PATCH", `${T()}/sticks/${stick.stickId}`, { bladeCurve: `P92${RLO}` }, "bladeCurve"],
      ["POST", `${T()}/sticks`, { label: "Spare", notes: `a${NUL}b` }, "notes"],
    ];
    const before = await Promise.all([coach.get(`${T()}/clips/${clip.clipId}`), coach.get(`${T()}/shots/${shot.shotId}`), coach.get(`${T()}/sticks/${stick.stickId}`)]);
    const sticksBefore = (await coach.get(`${T()}/sticks`)).text;
    for (const [method, path, body, field] of cases) {
      const r = await coach.request(method, path, body);
      expect(r.status, `${path} ${field}: ${r.text}`).toBe(422);
      expect(r.json.errors.map((e: { path: string }) => e.path), field).toContain(field);
    }
    const after = await Promise.all([coach.get(`${T()}/clips/${clip.clipId}`), coach.get(`${T()}/shots/${shot.shotId}`), coach.get(`${T()}/sticks/${stick.stickId}`)]);
    expect(after.map((r) => r.text)).toEqual(before.map((r) => r.text));
    expect((await coach.get(`${T()}/sticks`)).text).toBe(sticksBefore);
  });

  it("keeps line breaks and tabs in notes, which are multi-line", async () => {
    const clip = await route("edit clip").fixture!(ctx);
    const r = await coach.patch(`${T()}/clips/${clip.clipId}`, { notes: "Skated in\n\tfrom the blue line" });
    expect(r.status, r.text).toBe(200);
    expect((await coach.get(`${T()}/clips/${clip.clipId}`)).json.notes).toBe("Skated in\n\tfrom the blue line");
  });
});

describe("addresses", () => {
  it("answers a NUL in any id of any route 400, never 500", async () => {
    const seen: string[] = [];
    for (const rc of routeTable) {
      const ids = new Proxy({}, { get: () => "%00" }) as Record<string, string>;
      const path = rc.path({ ...ctx, teamId: rc.teamScoped ? "%00" : ctx.teamId, ids });
      if (!path.includes("%00")) continue;
      const r = await admin.request(rc.method, path, rc.method === "GET" || rc.method === "DELETE" ? undefined : {});
      if (r.status !== 400 || !/problem\+json/.test(r.headers.get("content-type") ?? "")) seen.push(`${rc.method} ${rc.name}: ${r.status}`);
    }
    expect(seen).toEqual([]);
    const q = await coach.get(`${T()}/clips?playerId=%00`);
    expect(q.status).toBe(400);
  });
});
