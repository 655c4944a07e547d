// The authorization policy as a table: every route × every role × a member of another team ×
// signed out. Asserts the status and that no row of the other team appears in any response.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Client, EMAILS, seedWorld, startServer, type TestServer } from "./helpers";
import { routeTable, type Ctx } from "./route-table";
import { policy, type Actor } from "../../server/auth/policy";
import type { Role } from "../../shared/schemas/roster";

let srv: TestServer;
let world: Awaited<ReturnType<typeof seedWorld>>;
const as: Partial<Record<Role | "outsider", Client>> = {};
let ctx: Ctx;

beforeAll(async () => {
  srv = await startServer();
  world = await seedWorld();
  for (const r of ["admin", "coach", "analyst", "player"] as const) as[r] = await new Client(srv.url).signIn(EMAILS[r]);
  as.outsider = await new Client(srv.url).signIn(world.outsiderEmail);
  ctx = { teamId: world.teamId, otherTeamId: world.otherTeamId, ids: {}, admin: as.admin!, users: world.users };
});
afterAll(() => srv.close());

function noForeignRows(text: string) {
  expect(text).not.toContain(world.otherTeamId);
  expect(text).not.toContain(world.outsiderEmail);
  expect(text).not.toContain("Riverside Foxes");
}

describe("policy functions (pure)", () => {
  const a = (role: Role): Actor => ({ userId: "u1", teamId: "t1", role });
  it.each([
    ["admin", true], ["coach", false], ["analyst", false], ["player", false],
  ] as const)("manageRoster for %s is %s", (role, ok) => expect(policy.manageRoster(a(role))).toBe(ok));
  it("a player sees own and shared shots once published, never across teams", () => {
    const p = a("player");
    expect(policy.viewShot(p, { teamId: "t1", playerId: "u1", published: true })).toBe(true);
    expect(policy.viewShot(p, { teamId: "t1", playerId: "u1", published: false })).toBe(false);
    expect(policy.viewShot(p, { teamId: "t1", playerId: "u2", published: true })).toBe(false);
    expect(policy.viewShot(p, { teamId: "t1", playerId: "u2", published: true, sharedWith: ["u1"] })).toBe(true);
    expect(policy.viewShot(p, { teamId: "t2", playerId: "u1", published: true })).toBe(false);
    expect(policy.viewShot(a("coach"), { teamId: "t2", playerId: "u1", published: true })).toBe(false);
    expect(policy.viewShot(a("analyst"), { teamId: "t1", playerId: "u1", published: false })).toBe(true);
    expect(policy.publishShot(a("coach"), { teamId: "t1" })).toBe(true);
    expect(policy.publishShot(a("analyst"), { teamId: "t1" })).toBe(false);
    expect(policy.editShot(p, { teamId: "t1" })).toBe(false);
  });
});

describe.each(routeTable)("$method $name", (route) => {
  const call = async (who: Client | undefined) => {
    const ids = route.fixture ? await route.fixture(ctx) : {};
    const c = { ...ctx, ids };
    const client = who ?? new Client(srv.url);
    return client.request(route.method, route.path(c), route.body ? route.body(c) : route.method === "GET" || route.method === "DELETE" ? undefined : {});
  };

  it.each(["admin", "coach", "analyst", "player"] as const)("as %s", async (role) => {
    const r = await call(as[role]);
    if (route.allowed.includes(role)) expect(r.status, r.text).toBeLessThan(300);
    else {
      expect([403, 404], r.text).toContain(r.status);
      expect(r.headers.get("content-type")).toMatch(/problem\+json/);
    }
    noForeignRows(r.text);
  });

  it("signed out → 401", async () => {
    const r = await call(undefined);
    expect(r.status).toBe(401);
  });

  if (route.teamScoped) it("as a member of another team → 404, nothing leaks", async () => {
    const r = await call(as.outsider);
    expect(r.status).toBe(404);
    expect(r.text).not.toContain(world.teamId);
  });
});
