// The home page's "what needs me now?" by role, on real PostgreSQL: each item appears when there is
// something of its kind, with the right count and links, and goes when it is dealt with; a player's
// home shows their own results, bests (an implausible result left out) and recent shares, and never
// a staff task.
import { sql } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Client, EMAILS, seedWorld, startServer, type TestServer } from "./helpers";
import { insertReadyClip } from "./routes/shots";
import { insertShotWithResults } from "./routes/readout";
import { db } from "../../server/db/client";
import { benchTest, clip, stick, trackingRun } from "../../server/db/schema";
import type { HomeResponse, HomeTask } from "../../shared/schemas/home";

let srv: TestServer;
let world: Awaited<ReturnType<typeof seedWorld>>;
let admin: Client, coach: Client, analyst: Client, player: Client, player2: Client;

beforeAll(async () => {
  srv = await startServer();
  world = await seedWorld();
  [admin, coach, analyst, player, player2] = await Promise.all(
    [EMAILS.admin, EMAILS.coach, EMAILS.analyst, EMAILS.player, EMAILS.player2].map((e) => new Client(srv.url).signIn(e)),
  );
}, 120_000);
afterAll(async () => srv.close());

const home = async (c: Client) => {
  const r = await c.get(`/api/teams/${world.teamId}/home`);
  expect(r.status, r.text).toBe(200);
  return r.json as HomeResponse;
};
const task = (h: HomeResponse, key: HomeTask["key"]) => h.tasks.find((t) => t.key === key);
const id = (email: string) => world.users[email];

describe("staff", () => {
  it("an empty team asks nothing of its staff; each kind of waiting work then shows with its count and links", async () => {
    for (const c of [coach, analyst]) expect((await home(c)).tasks).toEqual([]);

    const unconfirmed = await insertReadyClip(world.teamId, { playerId: id(EMAILS.player) });
    await db().update(clip).set({ captureFpsConfirmed: false, title: "Rate unknown" }).where(sql`${clip.id} = ${unconfirmed}`);
    const failedId = await insertReadyClip(world.teamId);
    await db().update(clip).set({ status: "failed", failureReason: "not a video", title: "Broken upload" }).where(sql`${clip.id} = ${failedId}`);
    const ready = await insertReadyClip(world.teamId);
    await db().update(clip).set({ captureFpsConfirmed: true, title: "Waiting for marks" }).where(sql`${clip.id} = ${ready}`);
    const review = await insertShotWithResults({ teamId: world.teamId, playerId: id(EMAILS.player), label: "Needs a look", published: false });
    const [soft] = await db().insert(stick).values({ teamId: world.teamId, label: "Soft 85", ratedFlex: 85 }).returning({ id: stick.id });
    await db().insert(benchTest).values({ teamId: world.teamId, stickId: soft.id, testedOn: "2026-11-20", spanMm: 600, loadPointMm: 300, readings: [], fit: {}, measuredFlex: 68, eiNm2: 100 });
    await db().insert(trackingRun).values({ teamId: world.teamId, shotId: review.shotId, seedFrame: 1, seeds: {}, frameStart: 1, frameEnd: 10 });

    const h = await home(coach);
    expect(h.player).toBeNull();
    expect(task(h, "rateUnconfirmed")).toMatchObject({ count: 1, examples: [{ label: "Rate unknown", href: `/clips/${unconfirmed}` }] });
    expect(task(h, "clipsFailed")).toMatchObject({ count: 1, href: "/clips?status=failed", examples: [{ label: "Broken upload", href: `/clips/${failedId}` }] });
    expect(task(h, "clipsNotDigitised")?.examples).toContainEqual({ label: "Waiting for marks", href: `/clips/${ready}/shots` });
    // The clip of the shot with results is digitised; the unconfirmed one is listed under its rate.
    expect(task(h, "clipsNotDigitised")?.examples.map((e) => e.href)).not.toContain(`/clips/${review.clipId}/shots`);
    expect(task(h, "clipsNotDigitised")?.examples.map((e) => e.href)).not.toContain(`/clips/${unconfirmed}/shots`);
    expect(task(h, "shotsToReview")).toMatchObject({ count: 1, href: "/readout?review=waiting", examples: [{ href: `/readout/${review.shotId}` }] });
    expect(task(h, "shotsToReview")?.examples[0].label).toMatch(/^Needs a look — /);
    expect(task(h, "sticksBelowAlert")).toMatchObject({ count: 1, examples: [{ label: "Soft 85", href: `/sticks/${soft.id}` }] });
    expect(task(h, "sticksBelowAlert")?.title).toMatch(/85 % of rated flex/);
    expect(task(h, "trackingRunning")).toMatchObject({ count: 1, examples: [{ label: "Needs a look — queued", href: `/clips/${review.clipId}/shots/${review.shotId}/digitise` }] });
    // A player is never handed a staff task, even with all of them waiting.
    const theo = await home(player);
    expect(theo.tasks).toEqual([]);
    expect(theo.player).not.toBeNull();
    // Roster items are the team admin's alone.
    expect(task(h, "invitationsPending")).toBeUndefined();
    expect(task(h, "staffSeats")).toBeUndefined();

    // Dealt with, each goes.
    expect((await coach.put(`/api/teams/${world.teamId}/readout/shots/${review.shotId}/publication`, { notify: false })).status).toBe(200);
    await db().update(clip).set({ captureFpsConfirmed: true }).where(sql`${clip.id} = ${unconfirmed}`);
    await db().update(trackingRun).set({ status: "done" }).where(sql`${trackingRun.shotId} = ${review.shotId}`);
    const after = await home(analyst);
    expect(task(after, "shotsToReview")).toBeUndefined();
    expect(task(after, "rateUnconfirmed")).toBeUndefined();
    expect(task(after, "trackingRunning")).toBeUndefined();
  });

  it("a team admin also sees pending invitations and the club's staff seats", async () => {
    const email = `home-${Date.now()}@ravens.example`;
    expect((await admin.post(`/api/teams/${world.teamId}/invitations`, { email, role: "coach" })).status).toBe(201);
    const h = await home(admin);
    expect(task(h, "invitationsPending")).toMatchObject({ href: "/roster" });
    expect(task(h, "invitationsPending")?.examples.map((e) => e.label)).toContain(`${email} (coach)`);
    expect(task(h, "staffSeats")?.title).toMatch(/^\d+ of \d+ staff seats taken on the \w+ plan$/);
    expect(task(h, "staffSeats")?.href).toBe("/billing");
  });
});

describe("players", () => {
  it("a brand-new player has no tasks and no shots; their own published results, bests and teammates' shares then show", async () => {
    const p2 = await home(player2);
    expect(p2).toEqual({ tasks: [], player: { latest: [], bests: [], shared: [], ownShots: 0 } });

    const mine = id(EMAILS.player2);
    const slow = await insertShotWithResults({ teamId: world.teamId, playerId: mine, label: "Slap 25", scene: { exitSpeedMps: 25 } });
    const fast = await insertShotWithResults({ teamId: world.teamId, playerId: mine, label: "Slap 32", scene: { exitSpeedMps: 32 } });
    const wrist = await insertShotWithResults({ teamId: world.teamId, playerId: mine, label: "Wrist 20", shotType: "wrist", scene: { exitSpeedMps: 20 } });
    // Above any recorded shot: flagged, so no personal best.
    await insertShotWithResults({ teamId: world.teamId, playerId: mine, label: "Slap 60", scene: { exitSpeedMps: 60 } });
    // Still in review: not theirs to see yet.
    await insertShotWithResults({ teamId: world.teamId, playerId: mine, label: "In review", published: false, scene: { exitSpeedMps: 40 } });
    const theirs = await insertShotWithResults({ teamId: world.teamId, playerId: id(EMAILS.player), label: "Theo's slap" });
    expect((await coach.post(`/api/teams/${world.teamId}/readout/shots/${theirs.shotId}/shares`, { player: false, teammates: [mine] })).status).toBe(201);

    const h = await home(player2);
    expect(h.tasks).toEqual([]);
    const me = h.player!;
    expect(me.ownShots).toBe(4);
    expect(me.latest).toHaveLength(3);
    expect(me.latest.map((s) => s.label)).not.toContain("In review");
    const bests = Object.fromEntries(me.bests.map((b) => [b.shotType, b]));
    expect(Object.keys(bests).sort()).toEqual(["slap", "wrist"]);
    expect(bests.slap.id).toBe(fast.shotId);
    expect(bests.slap.puckExitSpeedMps).toBeCloseTo(32, 0);
    expect(bests.slap.puckExitSpeedUMps).toBeGreaterThan(0);
    expect(bests.wrist.id).toBe(wrist.shotId);
    expect(me.bests.map((b) => b.id)).not.toContain(slow.shotId);
    expect(me.shared).toMatchObject([{ id: theirs.shotId, label: "Theo's slap", playerName: expect.any(String) }]);

    // Un-shared, it leaves their home at once; a share older than two weeks is no longer news.
    expect((await coach.del(`/api/teams/${world.teamId}/readout/shots/${theirs.shotId}/shares/${mine}`)).status).toBe(204);
    expect((await home(player2)).player!.shared).toEqual([]);
    expect((await coach.post(`/api/teams/${world.teamId}/readout/shots/${theirs.shotId}/shares`, { player: false, teammates: [mine] })).status).toBe(201);
    expect((await home(player2)).player!.shared).toHaveLength(1);
    await db().execute(sql`update shot_share set created_at = now() - interval '15 days' where user_id = ${mine}`);
    expect((await home(player2)).player!.shared).toEqual([]);
  });
});
