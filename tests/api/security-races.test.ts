// Two requests at the same moment (issue group 5): each guard is atomic, so the second request
// sees what the first did. Last-admin demotion, one session per name, one extraction job per clip.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { and, eq } from "drizzle-orm";
import { Client, EMAILS, seedWorld, startServer, type TestServer } from "./helpers";
import { routeTable, type Ctx } from "./route-table";
import { db } from "../../server/db/client";
import { member, trainingSession } from "../../server/db/schema";

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
afterAll(async () => {
  const { stopJobs } = await import("../../server/jobs/runtime");
  await stopJobs();
  await srv.close();
});

const T = () => `/api/teams/${world.teamId}`;

describe("races", () => {
  it("two admins demoting each other at once leave the team with an admin", async () => {
    const members = (await admin.get(`${T()}/members`)).json.members as { id: string; email: string }[];
    const coach = members.find((m) => m.email === EMAILS.coach)!;
    expect((await admin.patch(`${T()}/members/${coach.id}`, { role: "admin" })).status).toBe(200);
    const second = await new Client(srv.url).signIn(EMAILS.coach);
    const me = members.find((m) => m.email === EMAILS.admin)!;
    for (let round = 0; round < 5; round++) {
      const [a, b] = await Promise.all([admin.patch(`${T()}/members/${coach.id}`, { role: "coach" }), second.patch(`${T()}/members/${me.id}`, { role: "coach" })]);
      const admins = await db().select().from(member).where(and(eq(member.organizationId, world.teamId), eq(member.role, "admin")));
      expect(admins.length, `round ${round}: ${a.status} ${b.status}`).toBeGreaterThanOrEqual(1);
      expect([a.status, b.status].filter((st) => st === 200)).toHaveLength(1);
      // put both back to admin for the next round
      const left = admins.some((x) => x.id === me.id) ? admin : second;
      for (const id of [me.id, coach.id]) await left.patch(`${T()}/members/${id}`, { role: "admin" });
    }
  });

  it("two edits naming the same new session at once make one session", async () => {
    const venue = `Race rink ${Date.now()}`;
    const clips = await Promise.all([0, 1, 2, 3].map(() => routeTable.find((r) => r.name === "edit clip")!.fixture!(ctx)));
    const results = await Promise.all(clips.map((c) => admin.patch(`${T()}/clips/${c.clipId}`, { newSession: { date: "2026-03-15", venue, drill: "Drill" } })));
    expect(results.map((r) => r.status)).toEqual([200, 200, 200, 200]);
    const rows = await db().select().from(trainingSession).where(and(eq(trainingSession.teamId, world.teamId), eq(trainingSession.venue, venue)));
    expect(rows).toHaveLength(1);
    // The same at the repository, where the requests overlap most closely.
    const { findOrCreateSession } = await import("../../server/entities/clip/repository");
    const venue2 = `Race rink bis ${Date.now()}`;
    const ids = await Promise.all(Array.from({ length: 8 }, () => findOrCreateSession(world.teamId, { date: "2026-03-16", venue: venue2, drill: "" })));
    expect(new Set(ids).size).toBe(1);
  });

  it("one extraction job per clip, however many ask at once", async () => {
    const { startJobs } = await import("../../server/jobs/runtime");
    await startJobs({ work: false });
    const { sendExtract, liveExtractJobs } = await import("../../server/jobs/clip-queue");
    const { clipId } = await routeTable.find((r) => r.name === "edit clip")!.fixture!(ctx);
    const ids = await Promise.all([0, 1, 2, 3, 4, 5].map(() => sendExtract(clipId)));
    expect(new Set(ids).size).toBe(1);
    expect(await liveExtractJobs(clipId)).toHaveLength(1);
  });
});
