// The auth library's own team routes (organization plugin) against members of the team (issue
// group 4): none of them answers over HTTP, so nobody lists the members' e-mails past the
// product's policy, and no role, membership, invitation or team name changes without the
// product's service and audit log. The product's own routes keep working.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { and, eq } from "drizzle-orm";
import { Client, EMAILS, seedWorld, startServer, type TestServer } from "./helpers";
import { db } from "../../server/db/client";
import { auditLog, invitation, member, organization } from "../../server/db/schema";

let srv: TestServer;
let world: Awaited<ReturnType<typeof seedWorld>>;
let admin: Client;
let player: Client;

beforeAll(async () => {
  srv = await startServer();
  world = await seedWorld();
  admin = await new Client(srv.url).signIn(EMAILS.admin);
  player = await new Client(srv.url).signIn(EMAILS.player);
});
afterAll(() => srv.close());

const memberRow = async (email: string) => {
  const members = (await admin.get(`/api/teams/${world.teamId}/members`)).json.members as { id: string; email: string; role: string; userId: string }[];
  return members.find((m) => m.email === email)!;
};
const storedRole = async (memberId: string) => (await db().select({ role: member.role }).from(member).where(eq(member.id, memberId)))[0]?.role;

function expectClosed(r: { status: number; text: string; headers: Headers }) {
  expect(r.status, r.text).toBe(404);
  expect(r.headers.get("content-type")).toMatch(/application\/problem\+json/);
  expect(r.text).not.toContain("@ravens.example");
}

describe("the auth library's team routes are closed", () => {
  it("a player cannot list the members and their e-mails", async () => {
    const q = `organizationId=${world.teamId}`;
    expectClosed(await player.get(`/api/auth/organization/list-members?${q}`));
    expectClosed(await player.get(`/api/auth/organization/get-full-organization?${q}`));
    expectClosed(await player.get(`/api/auth/organization/get-active-member-role?${q}`));
    expectClosed(await player.get(`/api/auth/organization/list`));
    expectClosed(await player.post(`/api/auth/organization/set-active`, { organizationId: world.teamId }));
    // The product's own roster refuses players too.
    expect((await player.get(`/api/teams/${world.teamId}/members`)).status).toBe(403);
  });

  it("an admin cannot give a role list, remove, invite or rename there; nothing changes", async () => {
    const target = await memberRow(EMAILS.player);
    const auditBefore = (await db().select().from(auditLog).where(eq(auditLog.teamId, world.teamId))).length;

    expectClosed(await admin.post("/api/auth/organization/update-member-role", { memberId: target.id, role: ["player", "admin"], organizationId: world.teamId }));
    expect(await storedRole(target.id)).toBe("player");

    expectClosed(await admin.post("/api/auth/organization/remove-member", { memberIdOrEmail: target.id, organizationId: world.teamId }));
    expect(await storedRole(target.id)).toBe("player");

    const email = "backdoor.invite@ravens.example";
    expectClosed(await admin.post("/api/auth/organization/invite-member", { email, role: "admin", organizationId: world.teamId }));
    expect(await db().select().from(invitation).where(and(eq(invitation.email, email), eq(invitation.organizationId, world.teamId)))).toEqual([]);

    expectClosed(await admin.post("/api/auth/organization/update", { data: { name: "Renamed quietly" }, organizationId: world.teamId }));
    expect((await db().select({ name: organization.name }).from(organization).where(eq(organization.id, world.teamId)))[0]?.name).toBe("Lakeport Ravens");

    expectClosed(await admin.post("/api/auth/organization/create", { name: "Shadow team", slug: "shadow-team" }));
    expectClosed(await admin.post("/api/auth/organization/delete", { organizationId: world.teamId }));
    expect((await db().select().from(auditLog).where(eq(auditLog.teamId, world.teamId))).length).toBe(auditBefore);
  });

  it("other account routes of the library are closed too (profile, e-mail, password, sessions)", async () => {
    expectClosed(await player.post("/api/auth/update-user", { name: "x".repeat(5000) }));
    expectClosed(await player.post("/api/auth/change-email", { newEmail: "elsewhere@evil.example" }));
    expectClosed(await player.post("/api/auth/delete-user", {}));
    expectClosed(await player.get("/api/auth/list-sessions"));
    expectClosed(await player.get("/api/auth/list-accounts"));
    expect((await player.get("/api/me")).json.user.name).toBe("Theo Marchetti");
  });

  it("a role is one role: the database refuses a list such as the library's route stored", async () => {
    // The library read "player,admin" as admin, the product as player; now no such row can exist.
    const target = await memberRow(EMAILS.player2);
    const err = await db().update(member).set({ role: "player,admin" }).where(eq(member.id, target.id)).then(() => null, (e: { cause?: { constraint?: string } }) => e);
    expect(err?.cause?.constraint).toBe("member_role_single");
    expect(await storedRole(target.id)).toBe("player");
  });

  it("the product's own routes still do these things, each with an audit entry", async () => {
    const target = await memberRow(EMAILS.player2);
    const changed = await admin.patch(`/api/teams/${world.teamId}/members/${target.id}`, { role: "analyst" });
    expect(changed.status, changed.text).toBe(200);
    expect(await storedRole(target.id)).toBe("analyst");
    expect((await admin.patch(`/api/teams/${world.teamId}/members/${target.id}`, { role: "player" })).status).toBe(200);
    const actions = (await admin.get(`/api/teams/${world.teamId}/audit`)).json.entries.map((e: { action: string }) => e.action);
    expect(actions.filter((a: string) => a === "member.role_changed").length).toBeGreaterThanOrEqual(2);
  });
});
