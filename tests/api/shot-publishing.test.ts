// Review before players see: a shot reaches its player only once a coach publishes it (or the
// team publishes by itself once results exist); staff share it with teammates, and un-sharing or
// taking it back to review removes that access at once. Real HTTP, real PostgreSQL, real mail sink.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Client, EMAILS, seedWorld, startServer, waitForMail, type TestServer } from "./helpers";
import { insertShotWithResults } from "./routes/readout";

let srv: TestServer;
let world: Awaited<ReturnType<typeof seedWorld>>;
let admin: Client, coach: Client, analyst: Client, player: Client, player2: Client;

beforeAll(async () => {
  srv = await startServer();
  world = await seedWorld();
  admin = await new Client(srv.url).signIn(EMAILS.admin);
  coach = await new Client(srv.url).signIn(EMAILS.coach);
  analyst = await new Client(srv.url).signIn(EMAILS.analyst);
  player = await new Client(srv.url).signIn(EMAILS.player);
  player2 = await new Client(srv.url).signIn(EMAILS.player2);
});
afterAll(() => srv.close());

const R = () => `/api/teams/${world.teamId}/readout`;
const uid = (email: string) => world.users[email];
const inReview = (label: string, playerEmail: string = EMAILS.player) => insertShotWithResults({ teamId: world.teamId, playerId: uid(playerEmail), label, published: false });
const listed = async (c: Client, id: string) => ((await c.get(`${R()}/shots?pageSize=100`)).json.shots as { id: string }[]).some((s) => s.id === id);

describe("review before players see", () => {
  it("a shot in review is staff-only: its player gets the plain 404 and finds it in no list, progress or count", async () => {
    const s = await inReview(`In review ${Date.now()}`);
    const staffView = await analyst.get(`${R()}/shots/${s.shotId}`);
    expect(staffView.status).toBe(200);
    expect(staffView.json.publication).toBeNull();
    expect(staffView.json.can).toMatchObject({ publish: false, share: false });
    expect((await coach.get(`${R()}/shots/${s.shotId}`)).json.can).toMatchObject({ publish: true, share: true });

    const seen = await player.get(`${R()}/shots/${s.shotId}`);
    expect(seen.status).toBe(404);
    expect(await listed(player, s.shotId)).toBe(false);
    const progress = (await player.get(`${R()}/progress`)).json;
    expect(progress.points.map((p: { shotId: string }) => p.shotId)).not.toContain(s.shotId);
    expect(await listed(coach, s.shotId)).toBe(true);
    const row = ((await coach.get(`${R()}/shots?pageSize=100`)).json.shots as { id: string; published: boolean }[]).find((x) => x.id === s.shotId);
    expect(row?.published).toBe(false);
  });

  it("publishing lets the player in, e-mails them, and is written to the audit log; taking it back shuts them out again", async () => {
    expect((await player.patch("/api/me/prefs", { notifyShotShared: true })).status).toBe(200);
    const label = `Published ${Date.now()}`;
    const s = await inReview(label);
    expect((await analyst.put(`${R()}/shots/${s.shotId}/publication`, {})).status).toBe(403);
    const r = await coach.put(`${R()}/shots/${s.shotId}/publication`, {});
    expect(r.status, r.text).toBe(200);
    expect(r.json).toMatchObject({ mailed: true, note: null, publication: { publishedByName: "Morgan Ashby" } });
    await waitForMail(EMAILS.player, new RegExp(`${label}$`));
    expect((await player.get(`${R()}/shots/${s.shotId}`)).status).toBe(200);
    expect(await listed(player, s.shotId)).toBe(true);

    const twice = await coach.put(`${R()}/shots/${s.shotId}/publication`, {});
    expect(twice.json).toMatchObject({ mailed: false, note: "it was already published" });

    expect((await coach.del(`${R()}/shots/${s.shotId}/publication`)).status).toBe(200);
    expect((await player.get(`${R()}/shots/${s.shotId}`)).status).toBe(404);
    const audit = (await admin.get(`/api/teams/${world.teamId}/audit`)).json.entries as { action: string; targetId: string }[];
    expect(audit.filter((e) => e.targetId === s.shotId).map((e) => e.action).sort()).toEqual(["shot.published", "shot.unpublished"]);
  });

  it("sharing with a teammate publishes the shot and lets the teammate in; un-sharing removes that access", async () => {
    const s = await inReview(`Teammate share ${Date.now()}`);
    const path = `${R()}/shots/${s.shotId}`;
    expect((await player2.get(path)).status).toBe(404);
    const r = await coach.post(`${path}/shares`, { player: false, teammates: [uid(EMAILS.player2)] });
    expect(r.status, r.text).toBe(201);
    expect(r.json.published).toBe(true);
    expect(r.json.recipients.map((x: { userId: string }) => x.userId)).toEqual([uid(EMAILS.player2)]);

    const seen = await player2.get(path);
    expect(seen.status).toBe(200);
    expect(seen.json.shares.map((x: { userId: string }) => x.userId)).toEqual([uid(EMAILS.player2)]);
    const item = ((await player2.get(`${R()}/shots?pageSize=100`)).json.shots as { id: string; sharedWithMe: boolean }[]).find((x) => x.id === s.shotId);
    expect(item?.sharedWithMe).toBe(true);
    // Published by the share, so its own player sees it too.
    expect((await player.get(path)).status).toBe(200);

    expect((await coach.del(`${path}/shares/${uid(EMAILS.player2)}`)).status).toBe(204);
    expect((await player2.get(path)).status).toBe(404);
    expect(await listed(player2, s.shotId)).toBe(false);
    expect((await player.get(path)).status).toBe(200);
  });

  it("taking a shot back to review hides it from teammates as well; publishing again restores their share", async () => {
    const s = await inReview(`Back to review ${Date.now()}`);
    const path = `${R()}/shots/${s.shotId}`;
    expect((await coach.post(`${path}/shares`, { player: true, teammates: [uid(EMAILS.player2)] })).status).toBe(201);
    expect((await player2.get(path)).status).toBe(200);
    expect((await coach.del(`${path}/publication`)).status).toBe(200);
    expect((await player2.get(path)).status).toBe(404);
    expect((await player.get(path)).status).toBe(404);
    expect((await coach.put(`${path}/publication`, { notify: false })).status).toBe(200);
    expect((await player2.get(path)).status).toBe(200);
  });

  it("refuses teammates who are staff, the shot's own player, strangers, or too many, and stores nothing", async () => {
    const s = await inReview(`Bad share ${Date.now()}`);
    const path = `${R()}/shots/${s.shotId}/shares`;
    const cases: [unknown, RegExp][] = [
      [{ player: false, teammates: [uid(EMAILS.analyst)] }, /on the team's staff/],
      [{ player: false, teammates: [uid(EMAILS.player)] }, /took this shot/],
      [{ player: false, teammates: ["not-a-member-id"] }, /not a member of this team/],
      [{ player: false, teammates: Array.from({ length: 51 }, (_, i) => `u${i}`) }, /at most 50/],
      [{ player: false, teammates: "everyone" }, /list of member ids/],
      [{ player: false }, /choose whom to share with/],
    ];
    for (const [body, message] of cases) {
      const r = await coach.post(path, body);
      expect(r.status, JSON.stringify(body)).toBe(422);
      expect(JSON.stringify(r.json)).toMatch(message);
    }
    const after = (await coach.get(`${R()}/shots/${s.shotId}`)).json;
    expect(after.shares).toEqual([]);
    expect(after.publication).toBeNull();
  });

  it("a team that publishes automatically: switching it on publishes what has results; later results publish themselves", async () => {
    const waiting = await inReview(`Waiting ${Date.now()}`);
    const noResults = await insertShotWithResults({ teamId: world.teamId, playerId: uid(EMAILS.player), label: `No results ${Date.now()}`, published: false, uncalibrated: true });
    expect((await coach.patch(`${R()}/settings`, { autoPublish: true })).status).toBe(403);
    expect((await admin.patch(`${R()}/settings`, { autoPublish: "yes" })).status).toBe(422);
    const on = await admin.patch(`${R()}/settings`, { autoPublish: true });
    expect(on.json).toEqual({ autoPublish: true });
    expect((await player.get(`${R()}/shots/${waiting.shotId}`)).status).toBe(200);
    expect((await player.get(`${R()}/shots/${noResults.shotId}`)).status).toBe(404);

    // The clip gets its calibration: results appear and the shot publishes itself.
    const { db } = await import("../../server/db/client");
    const { clip } = await import("../../server/db/schema");
    const { eq } = await import("drizzle-orm");
    const { recomputeShot } = await import("../../server/shots/results");
    await db().update(clip).set({ calibration: noResults.scene.calibration }).where(eq(clip.id, noResults.clipId));
    await recomputeShot(noResults.shotId);
    expect((await player.get(`${R()}/shots/${noResults.shotId}`)).status).toBe(200);
    expect((await admin.patch(`${R()}/settings`, { autoPublish: false })).json).toEqual({ autoPublish: false });
  });
});
