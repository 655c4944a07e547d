// A ready clip of Theo (the demo club's first player) with two shots, for tests/e2e/reassign.spec.ts,
// published to him, made in the e2e server's database (DATABASE_URL). No frame files: the pages used only list shots
// and edit details. Prints { teamId, clipId, shots } as JSON.
//   node --import tsx tests/e2e/support/reassign-fixtures.ts
import { and, eq } from "drizzle-orm";
import { db } from "../../../server/db/client";
import { clip, member, organization, shot, user } from "../../../server/db/schema";
import { DEMO_TEAM } from "../../../server/seed/demo-people";

const [team] = await db().select({ id: organization.id }).from(organization).where(eq(organization.slug, DEMO_TEAM.slug));
if (!team) throw new Error("the demo club is not seeded in this database");
const [theo] = await db().select({ id: user.id }).from(user).innerJoin(member, eq(member.userId, user.id))
  .where(and(eq(user.email, "player@ravens.example"), eq(member.organizationId, team.id)));
const title = `Reassign ${Date.now().toString(36)} (made-up clip)`;
const [c] = await db()
  .insert(clip)
  .values({
    teamId: team.id, playerId: theo.id, title, status: "ready", captureFps: 1000, captureFpsConfirmed: true, storedFps: 30,
    frameCount: 100, framesDone: 100, width: 1280, height: 720, shotType: "wrist", originalName: "reassign.mp4",
  })
  .returning({ id: clip.id });
const shots = await db()
  .insert(shot)
  .values([1, 2].map((n) => ({ teamId: team.id, clipId: c.id, playerId: theo.id, label: `Reassign shot ${n}`, frameStart: n * 40 - 39, frameEnd: n * 40, publishedAt: new Date() })))
  .returning({ id: shot.id });
process.stdout.write(JSON.stringify({ teamId: team.id, clipId: c.id, title, shots: shots.map((s) => s.id) }));
await db().pool.end();
