// The demo season (scripts/demo/season.ts — invented for the demo only): more players in both
// teams, sticks with bench histories, and ten sessions of clips whose shots get their results the
// way an upload's do: synthetic footage rendered and encoded with ffmpeg, ingested (probe,
// checksum, store) and split into frames; a scale bar and marks clicked on the scenes' known truth
// with a seeded digitiser's scatter; results from the mechanics engine. Then the club's usual
// leftovers: clips in review, not digitised, waiting for a rate confirmation, failed, still
// extracting; and shots shared with teammates.
// Times are set as they would have been at the rink (America/Vancouver). Idempotent: clips are
// found by title; a season already complete is seen in one query and left alone.
import { and, eq, inArray, sql } from "drizzle-orm";
import { createAccount } from "../auth/accounts";
import type { Actor } from "../auth/policy";
import { db } from "../db/client";
import { clip, member, shot, shotShare, stick, trainingSession, user } from "../db/schema";
import { log } from "../log";
import { updateClip } from "../entities/clip/repository";
import * as repo from "../entities/shot/repository";
import { recomputeShot } from "../shots/results";
import { normalSource } from "../../shared/mechanics/uncertainty";
import { clipTruth } from "../../scripts/demo/render-scene";
import { seasonClips, seasonExtraMemberships, seasonPlayers, seasonShares, seasonSticks, vancouverTime, type SeasonClip, type SeasonTeam } from "../../scripts/demo/season";
import { DEMO_PASSWORD, type DemoIds } from "./demo-people";
import type { SeedOptions } from "./index";
import { CLICK_SCATTER_PX, calibrateDemoClip, ingestDemoClip, scatteredMarks } from "./shots";
import { ensureDemoSticks } from "./sticks";
import { DEMO_CLIP_TITLE } from "./clips";
import { DEMO_CLIPS } from "../../scripts/demo/demo-scenes";

/** The reason a worker's repeated death leaves on a clip (server/jobs/clip-sweep.ts): what the demo's failed clip shows. */
const FAILED_REASON = "The worker stopped while extracting this clip on every attempt (out of memory?). Retry once the cause is fixed.";

const teamOf = (ids: DemoIds, t: SeasonTeam) => (t === "senior" ? ids.teamId : ids.secondTeamId);

async function ensureUserId(email: string, name: string) {
  const [found] = await db().select({ id: user.id }).from(user).where(eq(user.email, email));
  if (found) return found.id;
  return (await createAccount({ email, name, password: DEMO_PASSWORD, emailVerified: true, signIn: false })).userId;
}

async function ensureMembership(teamId: string, userId: string, role: string) {
  const [found] = await db().select({ id: member.id }).from(member).where(and(eq(member.organizationId, teamId), eq(member.userId, userId)));
  if (!found) await db().insert(member).values({ id: crypto.randomUUID(), organizationId: teamId, userId, role, createdAt: new Date("2026-09-01T16:00:00Z") });
}

async function seedSeasonPeople(ids: DemoIds) {
  for (const p of seasonPlayers) {
    const id = await ensureUserId(p.email, p.name);
    ids.users[p.email] = id;
    for (const t of p.teams) await ensureMembership(teamOf(ids, t), id, "player");
  }
  for (const m of seasonExtraMemberships) await ensureMembership(teamOf(ids, m.team), ids.users[m.email], m.role);
}

async function seedSeasonSticks(ids: DemoIds) {
  for (const team of ["senior", "u16"] as const) {
    const analyst: Actor = { userId: ids.users["analyst@ravens.example"], teamId: teamOf(ids, team), role: "analyst" };
    await ensureDemoSticks(analyst, seasonSticks.filter((s) => s.team === team).map((s) => ({ ...s, ownerId: s.ownerEmail ? ids.users[s.ownerEmail] : null })));
  }
}

async function stickIdOf(teamId: string, label: string | null) {
  if (!label) return null;
  const [row] = await db().select({ id: stick.id }).from(stick).where(and(eq(stick.teamId, teamId), eq(stick.label, label)));
  return row?.id ?? null;
}

/** One season clip, from footage to published results (or to the state the plan leaves it in). */
async function seedSeasonClip(ids: DemoIds, c: SeasonClip) {
  const teamId = teamOf(ids, c.team);
  const analyst = ids.users["analyst@ravens.example"];
  const stickId = await stickIdOf(teamId, c.stickLabel);
  const filmed = vancouverTime(c.session.date, c.session.start, c.minute);
  const { id, outcome } = await ingestDemoClip({
    teamId, userId: analyst, scenes: c.shots.map((s) => s.scene), extract: c.state !== "extracting" && c.state !== "failed",
    meta: {
      title: c.title, newSession: { date: c.session.date, venue: c.session.venue, drill: c.session.drill }, playerId: ids.users[c.playerEmail], shotType: c.shotType,
      stickId, cameraView: "side", captureFps: c.captureFps, captureFpsConfirmed: c.state !== "rateUnconfirmed",
      notes: c.captureFps >= 1000 ? "Lab camera square to the lane, 4 m back. Synthetic demo footage." : "Phone on a tripod at the boards, slow motion. Synthetic demo footage.",
    },
  });
  // Uploaded the evening (or morning) of the session; the shots' dates follow their clip's session.
  const uploaded = vancouverTime(c.session.date, c.session.start, c.minute + 45);
  await db().update(clip).set({ createdAt: uploaded, updatedAt: uploaded }).where(eq(clip.id, id));
  if (c.state === "failed") await updateClip(id, { status: "failed", failureReason: FAILED_REASON });
  if (c.state === "extracting" || c.state === "failed" || c.state === "rateUnconfirmed") return;
  if (outcome !== "ready") throw new Error(`The demo clip "${c.title}" did not extract (${outcome}); see the log above.`);

  const truths = clipTruth(c.shots.map((s) => s.scene));
  const noise = normalSource(`season:${c.title}`);
  const jitter = (v: number) => v + CLICK_SCATTER_PX * noise();
  if (c.state !== "notDigitised") await calibrateDemoClip(id, truths[0], jitter);
  for (const [i, s] of c.shots.entries()) {
    const t = truths[i];
    const shotId = await repo.insertShot({ teamId, clipId: id, label: s.label, frameStart: t.firstFrame, frameEnd: t.lastFrame, playerId: ids.users[c.playerEmail], stickId, userId: analyst });
    const made = new Date(uploaded.getTime() + (20 + 6 * i) * 60_000);
    if (c.state !== "notDigitised") {
      await repo.saveMarks(shotId, 1, scatteredMarks(t, jitter), t.events, analyst);
      await recomputeShot(shotId);
    }
    // Reviewed and published by the coach the next morning, except what still waits.
    const published = c.state === "done" ? vancouverTime(c.session.date, "08:30", 24 * 60 + 5 * i) : null;
    await db().update(shot).set({ createdAt: filmed, updatedAt: made, publishedAt: published, publishedBy: published ? ids.users["coach@ravens.example"] : null }).where(eq(shot.id, shotId));
  }
  log.debug({ title: c.title }, "season clip seeded");
}

async function seedSeasonShares(ids: DemoIds) {
  for (const s of seasonShares) {
    const c = seasonClips.find((x) => x.state === "done" && s.clip(x));
    if (!c) throw new Error("A demo share names no published season clip");
    const teamId = teamOf(ids, c.team);
    const [row] = await db().select({ id: shot.id }).from(shot).innerJoin(clip, eq(clip.id, shot.clipId)).where(and(eq(clip.teamId, teamId), eq(clip.title, c.title), eq(shot.label, s.label)));
    if (!row) throw new Error(`No demo shot "${s.label}" in "${c.title}" to share`);
    await db().insert(shotShare).values({ shotId: row.id, userId: ids.users[s.withEmail], teamId, sharedBy: ids.users["coach@ravens.example"], createdAt: new Date(s.at) }).onConflictDoNothing();
  }
}

/** The base demo's clips were "uploaded" when seeded: in the season they were filmed the evening of their session. */
async function settleBaseDemoClips(ids: DemoIds) {
  const base = await db().select({ id: clip.id, date: trainingSession.date, createdAt: clip.createdAt }).from(clip).innerJoin(trainingSession, eq(trainingSession.id, clip.sessionId))
    .where(and(eq(clip.teamId, ids.teamId), inArray(clip.title, [DEMO_CLIP_TITLE, ...DEMO_CLIPS.map((c) => c.title)])));
  for (const [i, c] of base.entries()) {
    const at = vancouverTime(c.date, "19:05", 8 * i);
    if (c.createdAt.getTime() === at.getTime()) continue;
    await db().update(clip).set({ createdAt: at, updatedAt: at }).where(eq(clip.id, c.id));
    await db().update(shot).set({ createdAt: at, publishedAt: sql`case when ${shot.publishedAt} is null then null else ${vancouverTime(c.date, "08:30", 24 * 60)}::timestamptz end` }).where(eq(shot.clipId, c.id));
  }
}

async function seedSeason(ids: DemoIds, o: SeedOptions) {
  await seedSeasonPeople(ids);
  await settleBaseDemoClips(ids);
  await seedSeasonSticks(ids);
  const titles = seasonClips.map((c) => c.title);
  const [{ n }] = await db().select({ n: sql<number>`count(*)::int` }).from(clip).where(and(inArray(clip.teamId, [ids.teamId, ids.secondTeamId]), inArray(clip.title, titles)));
  if (n === titles.length) return;
  const started = Date.now();
  // Two clips at a time: one renders or waits on PostgreSQL while the other's ffmpeg runs.
  let next = 0, done = 0;
  const worker = async () => {
    while (next < seasonClips.length) {
      const c = seasonClips[next++];
      const [found] = await db().select({ id: clip.id }).from(clip).where(and(eq(clip.teamId, teamOf(ids, c.team)), eq(clip.title, c.title)));
      if (!found) await seedSeasonClip(ids, c);
      if (++done % 10 === 0 || done === seasonClips.length) o.progress?.(`demo season: ${done} of ${seasonClips.length} clips (${Math.round((Date.now() - started) / 1000)} s)`);
    }
  };
  await Promise.all([worker(), worker()]);
  await seedSeasonShares(ids);
}

/** Demo-data steps for the season; run by scripts/start's seed unless DEMO_SEASON=off. */
export const seasonSeedSteps: { name: string; run: (ids: DemoIds, o: SeedOptions) => Promise<void> }[] = [{ name: "demo season", run: seedSeason }];
