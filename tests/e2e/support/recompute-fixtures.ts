// A calibrated, digitised shot of Theo for tests/e2e/recompute.spec.ts, made in the e2e server's
// database (DATABASE_URL): the engine's made-up slap shot ([CP] synthetic scene with known
// answers), results stored by the server's own recomputeShot. No frame files: the readout's
// numbers are what the test reads. Prints { teamId, clipId, shotId, calibration } as JSON.
//   node --import tsx tests/e2e/support/recompute-fixtures.ts
import { and, eq } from "drizzle-orm";
import { db } from "../../../server/db/client";
import { clip, member, organization, shot, user } from "../../../server/db/schema";
import { recomputeShot } from "../../../server/shots/results";
import { closeCpuPool } from "../../../server/cpu/pool";
import { DEMO_TEAM } from "../../../server/seed/demo-people";
import { scene } from "../../api/routes/readout";

const [team] = await db().select({ id: organization.id }).from(organization).where(eq(organization.slug, DEMO_TEAM.slug));
if (!team) throw new Error("the demo club is not seeded in this database");
const [theo] = await db().select({ id: user.id }).from(user).innerJoin(member, eq(member.userId, user.id))
  .where(and(eq(user.email, "player@ravens.example"), eq(member.organizationId, team.id)));
const { marks, events, calibration } = scene({ seed: "e2e-recompute" });
const [c] = await db()
  .insert(clip)
  .values({
    teamId: team.id, playerId: theo.id, title: `Recompute ${Date.now().toString(36)} (made-up clip)`, status: "ready", captureFps: 3200, captureFpsConfirmed: true,
    storedFps: 30, frameCount: 400, framesDone: 400, width: 2000, height: 720, shotType: "slap", originalName: "recompute.mp4", calibration,
  })
  .returning({ id: clip.id });
const [s] = await db().insert(shot).values({ teamId: team.id, clipId: c.id, playerId: theo.id, label: "Recompute shot", frameStart: 1, frameEnd: 400, marks, events }).returning({ id: shot.id });
const stored = await recomputeShot(s.id);
if (!stored?.results) throw new Error(`no results: ${stored?.error}`);
process.stdout.write(JSON.stringify({ teamId: team.id, clipId: c.id, shotId: s.id, calibration }));
await closeCpuPool();
await db().pool.end();
