// Correcting who took a shot and with which stick. Staff change a shot's player and stick; a
// clip's new player takes its shots along when staff say so; who sees what follows at once (the
// shot visibility rule reads shot.player_id on every request), and each change is in the audit log.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Client, EMAILS, seedWorld, startServer, type TestServer } from "./helpers";
import { insertReadyClip } from "./routes/shots";

let srv: TestServer;
let world: Awaited<ReturnType<typeof seedWorld>>;
let coach: Client, admin: Client, player: Client, player2: Client;

beforeAll(async () => {
  srv = await startServer();
  world = await seedWorld();
  [coach, admin, player, player2] = await Promise.all([EMAILS.coach, EMAILS.admin, EMAILS.player, EMAILS.player2].map((e) => new Client(srv.url).signIn(e)));
});
afterAll(() => srv.close());

const T = () => `/api/teams/${world.teamId}`;
const id = (email: string) => world.users[email];

async function stickNamed(label: string) {
  const r = await coach.post(`${T()}/sticks`, { label, ratedFlex: 85 });
  expect(r.status, r.text).toBe(201);
  return r.json.id as string;
}

async function clipWithShots(n: number, playerEmail: string = EMAILS.player) {
  const clipId = await insertReadyClip(world.teamId, { playerId: id(playerEmail) });
  const shots: string[] = [];
  for (let i = 0; i < n; i++) {
    const r = await coach.post(`${T()}/clips/${clipId}/shots`, { frameStart: 1 + i * 10, frameEnd: 9 + i * 10, label: `Shot ${i + 1}` });
    expect(r.status, r.text).toBe(201);
    // Published, so its player sees it (a shot in review is staff-only: tests/api/shot-publishing.test.ts).
    const p = await coach.put(`${T()}/readout/shots/${r.json.id}/publication`, { notify: false });
    expect(p.status, p.text).toBe(200);
    shots.push(r.json.id);
  }
  return { clipId, shots };
}

/** What a person reaches: each shot, the clip, and the ids in their Shots list. */
async function reach(c: Client, clipId: string, shots: string[]) {
  const list = (await c.get(`${T()}/readout/shots?pageSize=100`)).json;
  const listed = new Set<string>((list.shots ?? []).map((s: { id: string }) => s.id));
  return {
    shots: await Promise.all(shots.map(async (s) => (await c.get(`${T()}/shots/${s}`)).status)),
    readouts: await Promise.all(shots.map(async (s) => (await c.get(`${T()}/readout/shots/${s}`)).status)),
    clip: (await c.get(`${T()}/clips/${clipId}`)).status,
    listed: shots.filter((s) => listed.has(s)).length,
  };
}

async function auditEntries(action: string) {
  const r = await admin.get(`${T()}/audit`);
  expect(r.status, r.text).toBe(200);
  return r.json.entries.filter((e: { action: string }) => e.action === action);
}

describe("a shot's player and stick", () => {
  it("staff move a shot to another player and stick: the old player loses it at once, the new one sees it, and the log says so", async () => {
    const { clipId, shots } = await clipWithShots(2);
    const stickId = await stickNamed("Reassign 80");
    expect(await reach(player2, clipId, shots.slice(0, 1))).toMatchObject({ shots: [404], readouts: [404], listed: 0 });

    const r = await coach.patch(`${T()}/shots/${shots[0]}`, { playerId: id(EMAILS.player2), stickId });
    expect(r.status, r.text).toBe(200);
    expect(r.json).toMatchObject({ playerId: id(EMAILS.player2), stickId, stickLabel: "Reassign 80" });

    expect(await reach(player, clipId, shots.slice(0, 1))).toMatchObject({ shots: [404], readouts: [404], listed: 0 });
    expect(await reach(player2, clipId, shots.slice(0, 1))).toMatchObject({ shots: [200], readouts: [200], clip: 200, listed: 1 });
    // The other shot of the clip stays the first player's.
    expect(await reach(player, clipId, shots.slice(1))).toMatchObject({ shots: [200], listed: 1, clip: 200 });

    const [entry] = await auditEntries("shot.reassigned");
    expect(entry, "an audit entry for the change").toBeTruthy();
    expect(entry.targetId).toBe(shots[0]);
    expect(entry.detail).toMatchObject({ label: "Shot 1", player: { from: id(EMAILS.player), to: id(EMAILS.player2) }, stick: { from: null, to: stickId } });
  });

  it("a player cannot move a shot, and nobody moves one to someone outside the team", async () => {
    const { shots } = await clipWithShots(1);
    expect((await player.patch(`${T()}/shots/${shots[0]}`, { playerId: id(EMAILS.player2) })).status).toBe(403);
    const foreign = await coach.patch(`${T()}/shots/${shots[0]}`, { playerId: "a-person-of-no-team" });
    expect(foreign.status).toBe(422);
    expect((await coach.get(`${T()}/shots/${shots[0]}`)).json.playerId).toBe(id(EMAILS.player));
  });

  it("the same player and stick again changes nothing and logs nothing", async () => {
    const { shots } = await clipWithShots(1);
    const before = (await auditEntries("shot.reassigned")).length;
    expect((await coach.patch(`${T()}/shots/${shots[0]}`, { playerId: id(EMAILS.player) })).status).toBe(200);
    expect((await auditEntries("shot.reassigned")).length).toBe(before);
  });
});

describe("a clip's player", () => {
  it("moving the clip's shots with it: the old player sees nothing of it at once, the new player sees all of it", async () => {
    const { clipId, shots } = await clipWithShots(2);
    expect(await reach(player, clipId, shots)).toMatchObject({ shots: [200, 200], clip: 200, listed: 2 });

    const r = await coach.patch(`${T()}/clips/${clipId}`, { playerId: id(EMAILS.player2), moveShots: true });
    expect(r.status, r.text).toBe(200);
    expect(r.json.player?.id ?? r.json.playerId).toBe(id(EMAILS.player2));

    expect(await reach(player, clipId, shots)).toMatchObject({ shots: [404, 404], readouts: [404, 404], clip: 404, listed: 0 });
    expect(await reach(player2, clipId, shots)).toMatchObject({ shots: [200, 200], readouts: [200, 200], clip: 200, listed: 2 });

    const [entry] = (await auditEntries("clip.player_changed")).filter((e: { targetId: string }) => e.targetId === clipId);
    expect(entry.detail).toMatchObject({ from: id(EMAILS.player), to: id(EMAILS.player2), shotsMoved: 2 });
  });

  it("keeping the shots: they stay the old player's (and so does that player's view of them)", async () => {
    const { clipId, shots } = await clipWithShots(1);
    const r = await coach.patch(`${T()}/clips/${clipId}`, { playerId: id(EMAILS.player2), moveShots: false });
    expect(r.status, r.text).toBe(200);
    expect(await reach(player, clipId, shots)).toMatchObject({ shots: [200], listed: 1 });
    expect(await reach(player2, clipId, shots)).toMatchObject({ shots: [404], clip: 200, listed: 0 });
    const [entry] = (await auditEntries("clip.player_changed")).filter((e: { targetId: string }) => e.targetId === clipId);
    expect(entry.detail).toMatchObject({ shotsMoved: 0, shotsKept: 1 });
  });

  it("a new player on a clip with shots needs the choice, and nothing is stored without it", async () => {
    const { clipId, shots } = await clipWithShots(1);
    const r = await coach.patch(`${T()}/clips/${clipId}`, { playerId: id(EMAILS.player2), notes: "changed" });
    expect(r.status).toBe(422);
    expect(r.json.errors?.[0]?.path).toBe("moveShots");
    const c = (await coach.get(`${T()}/clips/${clipId}`)).json;
    expect(c.player?.id ?? c.playerId).toBe(id(EMAILS.player));
    expect(c.notes).not.toBe("changed");
    expect(await reach(player, clipId, shots)).toMatchObject({ shots: [200] });
  });

  it("shots of another player on the clip stay where they are", async () => {
    const { clipId, shots } = await clipWithShots(2);
    expect((await coach.patch(`${T()}/shots/${shots[1]}`, { playerId: id(EMAILS.admin) })).status).toBe(200);
    const r = await coach.patch(`${T()}/clips/${clipId}`, { playerId: id(EMAILS.player2), moveShots: true });
    expect(r.status, r.text).toBe(200);
    expect((await coach.get(`${T()}/shots/${shots[0]}`)).json.playerId).toBe(id(EMAILS.player2));
    expect((await coach.get(`${T()}/shots/${shots[1]}`)).json.playerId).toBe(id(EMAILS.admin));
  });
});
