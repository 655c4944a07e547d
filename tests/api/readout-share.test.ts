// Sharing a shot: share rows, the audit entry, and the e-mail through the local mail sink in the
// recipient's units, unless the recipient turned that kind of e-mail off.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Client, EMAILS, linkIn, mailsTo, seedWorld, startServer, waitForMail, type TestServer } from "./helpers";
import { insertShotWithResults } from "./routes/readout";
import { mpsToMph } from "../../shared/units";

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

describe("sharing a shot", () => {
  it("with its player: a share row, an audit entry, and an e-mail in the player's units with a working link", async () => {
    expect((await player.patch("/api/me/prefs", { units: "imperial", notifyShotShared: true })).status).toBe(200);
    // A label of this run only: the mail sink keeps earlier runs' messages.
    const label = `Shared slap ${Date.now()}`;
    const s = await insertShotWithResults({ teamId: world.teamId, playerId: uid(EMAILS.player), label });
    const r = await coach.post(`${R()}/shots/${s.shotId}/shares`, { player: true });
    expect(r.status, r.text).toBe(201);
    expect(r.json.recipients).toEqual([{ userId: uid(EMAILS.player), name: "Theo Marchetti", role: "player", added: true, mailed: true, note: null }]);

    const mail = await waitForMail(EMAILS.player, new RegExp(`Morgan Ashby shared a shot with you: ${label}$`));
    const mph = mpsToMph(s.results!.puckExitSpeed.valueMps).toFixed(1);
    expect(mail.text).toContain(`Puck exit speed ${mph} ±`);
    expect(mail.text).toMatch(/ mph\./);
    const link = linkIn(mail.text.slice(mail.text.indexOf("Open the readout")));
    expect(link).toContain(`/readout/${s.shotId}?team=${world.teamId}`);
    const u = new URL(link);
    const opened = await player.get(`/api/teams/${u.searchParams.get("team")}/readout/shots/${u.pathname.split("/").pop()}`);
    expect(opened.status).toBe(200);
    expect(opened.json.shares.map((x: { userId: string; sharedByName: string }) => [x.userId, x.sharedByName])).toEqual([[uid(EMAILS.player), "Morgan Ashby"]]);

    const audit = (await admin.get(`/api/teams/${world.teamId}/audit`)).json;
    expect(audit.entries.find((e: { action: string; targetId: string }) => e.action === "shot.shared" && e.targetId === s.shotId)).toMatchObject({
      detail: { title: label, with: [uid(EMAILS.player)], added: [uid(EMAILS.player)] },
    });

    // Sharing again adds nothing and sends nothing new.
    const again = await coach.post(`${R()}/shots/${s.shotId}/shares`, { player: true });
    expect(again.json.recipients[0]).toMatchObject({ added: false, mailed: false, note: "already shared; no new e-mail" });
  });

  it("can be taken back: the share row goes, the audit log says so, and a second time is 404", async () => {
    const label = `Unshared ${Date.now()}`;
    const s = await insertShotWithResults({ teamId: world.teamId, playerId: uid(EMAILS.player), label });
    expect((await coach.post(`${R()}/shots/${s.shotId}/shares`, { player: true })).status).toBe(201);
    expect((await player.get(`${R()}/shots/${s.shotId}`)).json.shares).toHaveLength(1);
    const path = `${R()}/shots/${s.shotId}/shares/${uid(EMAILS.player)}`;
    expect((await player.del(path)).status).toBe(403);
    expect((await coach.del(path)).status).toBe(204);
    expect((await coach.get(`${R()}/shots/${s.shotId}`)).json.shares).toEqual([]);
    const again = await coach.del(path);
    expect(again.status).toBe(404);
    expect(again.json.detail).toMatch(/not shared with that person/);
    const audit = (await admin.get(`/api/teams/${world.teamId}/audit`)).json;
    expect(audit.entries.find((e: { action: string; targetId: string }) => e.action === "shot.unshared" && e.targetId === s.shotId)).toMatchObject({
      detail: { title: label, userId: uid(EMAILS.player), name: "Theo Marchetti" },
    });
  });

  it("with the staff too; nobody is mailed who turned shot e-mails off", async () => {
    expect((await player2.patch("/api/me/prefs", { notifyShotShared: false })).status).toBe(200);
    const label = `Quiet share ${Date.now()}`;
    const s = await insertShotWithResults({ teamId: world.teamId, playerId: uid(EMAILS.player2), label });
    const r = await coach.post(`${R()}/shots/${s.shotId}/shares`, { player: true, staff: true });
    expect(r.status, r.text).toBe(201);
    const by = Object.fromEntries(r.json.recipients.map((x: { userId: string }) => [x.userId, x]));
    expect(Object.keys(by).sort()).toEqual([uid(EMAILS.admin), uid(EMAILS.analyst), uid(EMAILS.player2)].sort()); // not the coach who shares
    expect(by[uid(EMAILS.player2)]).toMatchObject({ added: true, mailed: false, note: "has turned off e-mails about shared shots" });
    expect(by[uid(EMAILS.analyst)]).toMatchObject({ added: true, mailed: true });
    // The analyst's copy arrives; by then the player's would have too, had it been sent.
    const staffMail = await waitForMail(EMAILS.analyst, new RegExp(label));
    expect(staffMail.text).toContain(`shared the shot "${label}" with you`);
    expect((await mailsTo(EMAILS.player2)).filter((m) => m.subject.includes(label))).toEqual([]);
    // The share stands all the same: the player sees it in the readout.
    expect((await player2.get(`${R()}/shots/${s.shotId}`)).json.shares.map((x: { userId: string }) => x.userId)).toEqual([uid(EMAILS.player2)]);
    // Staff see everyone it went to.
    expect((await analyst.get(`${R()}/shots/${s.shotId}`)).json.shares).toHaveLength(3);
  });

  it("only a coach or team admin shares; bad bodies and a shot without a player are refused, nothing stored", async () => {
    const { db } = await import("../../server/db/client");
    const { shotShare } = await import("../../server/db/schema");
    const { eq } = await import("drizzle-orm");
    const s = await insertShotWithResults({ teamId: world.teamId, playerId: uid(EMAILS.player) });
    expect((await analyst.post(`${R()}/shots/${s.shotId}/shares`, { player: true })).status).toBe(403);
    const own = await player.post(`${R()}/shots/${s.shotId}/shares`, { player: true });
    expect(own.status).toBe(403);
    expect(own.json.detail).toMatch(/coach or a team admin/);
    const nobody = await coach.post(`${R()}/shots/${s.shotId}/shares`, { player: false, staff: false });
    expect(nobody.status).toBe(422);
    expect(nobody.json.detail).toMatch(/choose whom to share with/);
    expect((await coach.post(`${R()}/shots/${s.shotId}/shares`, { player: "yes" })).status).toBe(422);
    expect((await coach.post(`${R()}/shots/${s.shotId}/shares`, { player: true, extra: 1 })).status).toBe(422);
    const noPlayer = await insertShotWithResults({ teamId: world.teamId, playerId: null });
    const np = await coach.post(`${R()}/shots/${noPlayer.shotId}/shares`, { player: true });
    expect(np.status).toBe(422);
    expect(np.json.errors[0]).toMatchObject({ path: "player" });
    expect(np.json.detail).toMatch(/no player yet/);
    const rows = await db().select().from(shotShare).where(eq(shotShare.shotId, s.shotId));
    const rows2 = await db().select().from(shotShare).where(eq(shotShare.shotId, noPlayer.shotId));
    expect([...rows, ...rows2]).toEqual([]);
    // A shot of another team: not found, as if it did not exist.
    const foreign = await insertShotWithResults({ teamId: world.otherTeamId, label: "Foxes" });
    expect((await coach.post(`${R()}/shots/${foreign.shotId}/shares`, { player: true })).status).toBe(404);
  });
});

describe("a player reaches a clip through a shot", () => {
  it("sees the clip of their own shot even when the clip names another player; others still get 404", async () => {
    const { db } = await import("../../server/db/client");
    const { shot } = await import("../../server/db/schema");
    const { eq } = await import("drizzle-orm");
    const s = await insertShotWithResults({ teamId: world.teamId, playerId: uid(EMAILS.player2), label: `Two players ${Date.now()}` });
    const clipPath = `/api/teams/${world.teamId}/clips/${s.clipId}`;
    expect((await player.get(clipPath)).status).toBe(404);
    // a second shot on the same clip belongs to Theo: the clip now opens for him
    await db().insert(shot).values({ teamId: world.teamId, clipId: s.clipId, playerId: uid(EMAILS.player), label: "Theo on the same clip", frameStart: 1 });
    // Still in review: the shot does not open the clip for him yet.
    expect((await player.get(clipPath)).status).toBe(404);
    await db().update(shot).set({ publishedAt: new Date() }).where(eq(shot.label, "Theo on the same clip"));
    expect((await player.get(clipPath)).status).toBe(200);
    expect((await player2.get(clipPath)).status).toBe(200);
    await db().delete(shot).where(eq(shot.label, "Theo on the same clip"));
    expect((await player.get(clipPath)).status).toBe(404);
  });
});
