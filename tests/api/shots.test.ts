// Shots API on real PostgreSQL: creating, the optimistic-concurrency autosave, validation at the
// point of entry (nothing stored on a refusal), read-only players, and recomputed results.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Client, EMAILS, seedWorld, startServer, type TestServer } from "./helpers";
import { insertReadyClip } from "./routes/shots";

let srv: TestServer;
let world: Awaited<ReturnType<typeof seedWorld>>;
let analyst: Client, coach: Client, player: Client, player2: Client;

beforeAll(async () => {
  srv = await startServer();
  world = await seedWorld();
  analyst = await new Client(srv.url).signIn(EMAILS.analyst);
  coach = await new Client(srv.url).signIn(EMAILS.coach);
  player = await new Client(srv.url).signIn(EMAILS.player);
  player2 = await new Client(srv.url).signIn(EMAILS.player2);
});
afterAll(() => srv.close());

const T = () => `/api/teams/${world.teamId}`;
const playerId = () => world.users[EMAILS.player];

async function newShot(body: Record<string, unknown> = { frameStart: 1, frameEnd: 300 }, clip: Parameters<typeof insertReadyClip>[1] = {}) {
  const clipId = await insertReadyClip(world.teamId, { playerId: playerId(), ...clip });
  const r = await analyst.post(`${T()}/clips/${clipId}/shots`, body);
  expect(r.status, r.text).toBe(201);
  return { clipId, shot: r.json };
}

describe("creating shots", () => {
  it("defaults the player and stick to the clip's, and stores a result saying what is missing", async () => {
    const { db } = await import("../../server/db/client");
    const { stick } = await import("../../server/db/schema");
    const [s] = await db().insert(stick).values({ teamId: world.teamId, label: "Fixture 85", ratedFlex: 85 }).returning();
    const { clipId, shot } = await newShot({ frameStart: 5, frameEnd: 250, label: "First slap" }, { stickId: s.id });
    expect(shot).toMatchObject({ clipId, label: "First slap", frameStart: 5, frameEnd: 250, version: 1, playerId: playerId(), playerName: "Theo Marchetti", stickId: s.id });
    expect(shot.stick).toMatchObject({ label: "Fixture 85", flex: 85, flexSource: "rated" });
    expect(shot.storedResult.results).toBeNull();
    expect(shot.storedResult.error).toMatch(/calibration.*puck strike.*release.*3 puck marks/);
    const list = await analyst.get(`${T()}/clips/${clipId}/shots`);
    expect(list.json.shots.map((x: { id: string }) => x.id)).toEqual([shot.id]);
    expect(list.json.clip).toMatchObject({ id: clipId, captureFps: 3200, frameCount: 400, width: 1280, height: 720 });
    expect(list.json.canEdit).toBe(true);
  });

  it("refuses a frame range beyond the clip, a clip that is not ready and a stick of another team", async () => {
    const clipId = await insertReadyClip(world.teamId, { frameCount: 100 });
    const far = await analyst.post(`${T()}/clips/${clipId}/shots`, { frameStart: 1, frameEnd: 101 });
    expect(far.status).toBe(422);
    expect(far.json.errors[0].path).toBe("frameEnd");
    const backwards = await analyst.post(`${T()}/clips/${clipId}/shots`, { frameStart: 50, frameEnd: 10 });
    expect(backwards.status).toBe(422);
    const zero = await analyst.post(`${T()}/clips/${clipId}/shots`, { frameStart: 0, frameEnd: 10 });
    expect(zero.status).toBe(422);
    expect(zero.json.detail).toMatch(/first frame is 1/);
    const { db } = await import("../../server/db/client");
    const { clip, stick } = await import("../../server/db/schema");
    const [foreign] = await db().insert(stick).values({ teamId: world.otherTeamId, label: "Not ours" }).returning();
    const wrongStick = await analyst.post(`${T()}/clips/${clipId}/shots`, { frameStart: 1, frameEnd: 10, stickId: foreign.id });
    expect(wrongStick.status).toBe(422);
    expect(wrongStick.json.errors[0].path).toBe("stickId");
    const [pending] = await db().insert(clip).values({ teamId: world.teamId, captureFps: 240, status: "extracting" }).returning();
    const notReady = await analyst.post(`${T()}/clips/${pending.id}/shots`, { frameStart: 1, frameEnd: 10 });
    expect(notReady.status).toBe(409);
    expect(notReady.json.code).toBe("clip_not_ready");
    expect((await analyst.get(`${T()}/clips/${clipId}/shots`)).json.shots).toEqual([]);
  });
});

describe("saving marks: versions and conflicts", () => {
  const marksA = { puck: [[10, 100.25, 200.75]], bladeHeel: [[10, 300, 400]] };

  it("saves with the version it started from and answers the next version", async () => {
    const { shot } = await newShot();
    const r = await analyst.put(`${T()}/shots/${shot.id}/marks`, { baseVersion: 1, marks: marksA, events: { iceStrike: 8 } });
    expect(r.status, r.text).toBe(200);
    expect(r.json).toMatchObject({ version: 2, updatedByName: "Priya Lindqvist" });
    const got = (await coach.get(`${T()}/shots/${shot.id}`)).json;
    expect(got.marks).toEqual(marksA);
    expect(got.events).toEqual({ iceStrike: 8 });
    expect(got.version).toBe(2);
  });

  it("is idempotent: the same edits sent again (a lost answer) change nothing", async () => {
    const { shot } = await newShot();
    const body = { baseVersion: 1, marks: marksA, events: {} };
    const first = await analyst.put(`${T()}/shots/${shot.id}/marks`, body);
    const again = await analyst.put(`${T()}/shots/${shot.id}/marks`, body);
    expect(first.json.version).toBe(2);
    expect(again.status).toBe(200);
    expect(again.json.version).toBe(2);
  });

  it("a stale version gets 409 version_conflict naming who saved last and when; nothing is overwritten", async () => {
    const { shot } = await newShot();
    const mine = await analyst.put(`${T()}/shots/${shot.id}/marks`, { baseVersion: 1, marks: marksA, events: {} });
    expect(mine.json.version).toBe(2);
    const theirs = { puck: [[11, 50, 60]] };
    const stale = await coach.put(`${T()}/shots/${shot.id}/marks`, { baseVersion: 1, marks: theirs, events: {} });
    expect(stale.status).toBe(409);
    expect(stale.headers.get("content-type")).toMatch(/problem\+json/);
    expect(stale.json).toMatchObject({ code: "version_conflict", currentVersion: 2, savedBy: "Priya Lindqvist" });
    expect(Date.parse(stale.json.savedAt)).toBeGreaterThan(Date.now() - 60_000);
    expect(stale.json.detail).toMatch(/Priya Lindqvist saved this shot/);
    expect((await coach.get(`${T()}/shots/${shot.id}`)).json.marks).toEqual(marksA);
    // Having seen the conflict, the coach may save on top of version 2 on purpose.
    const onPurpose = await coach.put(`${T()}/shots/${shot.id}/marks`, { baseVersion: 2, marks: theirs, events: {} });
    expect(onPurpose.json).toMatchObject({ version: 3, updatedByName: "Morgan Ashby" });
  });
});

describe("bad input is refused at the point of entry and nothing is stored", () => {
  const cases: [string, unknown, RegExp, string][] = [
    ["a click outside the frame", { puck: [[10, 1280.5, 100]] }, /outside the frame \(0–1280 × 0–720 px\)/, "marks.puck.0"],
    ["a negative coordinate", { bladeToe: [[10, -0.1, 100]] }, /outside the frame/, "marks.bladeToe.0"],
    ["a frame outside the shot", { puck: [[301, 10, 10]] }, /outside this shot's frames 1–300/, "marks.puck.0"],
    ["a frame marked twice", { topHand: [[10, 1, 1], [10, 2, 2]] }, /marked twice on frame 10/, "marks.topHand.1"],
    ["a coordinate that is not a number", { puck: [[10, "x", 1]] }, /finite/, "marks.puck.0.1"],
    ["an unknown landmark", { elbow: [[10, 1, 1]] }, /elbow|Unrecognized/i, ""],
  ];
  it.each(cases)("%s", async (_name, marks, message, path) => {
    const { shot } = await newShot();
    const r = await analyst.put(`${T()}/shots/${shot.id}/marks`, { baseVersion: 1, marks, events: {} });
    expect(r.status, r.text).toBe(422);
    expect(r.json.detail).toMatch(message);
    if (path) expect(r.json.errors[0].path).toBe(path);
    const got = (await analyst.get(`${T()}/shots/${shot.id}`)).json;
    expect(got.version).toBe(1);
    expect(got.marks).toEqual({});
  });

  const events: [string, unknown, RegExp][] = [
    ["release before puck strike", { puckStrike: 100, release: 90 }, /release \(frame 90\) must come after puck strike \(frame 100\)/],
    ["release on the puck-strike frame", { puckStrike: 100, release: 100 }, /must come after puck strike/],
    ["ice strike after puck strike", { iceStrike: 120, puckStrike: 100 }, /ice strike \(frame 120\) must not come after puck strike/],
    ["peak bend after release", { puckStrike: 100, release: 120, peakBend: 130 }, /peak bend \(frame 130\) must not come after release/],
    ["an event outside the shot", { release: 400 }, /outside this shot's frames/],
    ["an event that is not a whole frame", { release: 12.5 }, /whole frame/],
  ];
  it.each(events)("events: %s", async (_name, ev, message) => {
    const { shot } = await newShot();
    const r = await analyst.put(`${T()}/shots/${shot.id}/marks`, { baseVersion: 1, marks: {}, events: ev });
    expect(r.status, r.text).toBe(422);
    expect(r.json.detail).toMatch(message);
    expect((await analyst.get(`${T()}/shots/${shot.id}`)).json.events).toEqual({});
  });

  const cals: [string, unknown, RegExp][] = [
    ["two identical scale-bar ends", { type: "scaleBar", a: [100, 100], b: [100, 100], lengthMm: 76.2 }, /identical/],
    ["a zero length", { type: "scaleBar", a: [100, 100], b: [140, 100], lengthMm: 0 }, /above 0/],
    ["a negative length", { type: "scaleBar", a: [100, 100], b: [140, 100], lengthMm: -5 }, /above 0/],
    ["a scale-bar end outside the frame", { type: "scaleBar", a: [100, 100], b: [1300, 100], lengthMm: 76.2 }, /scale bar end b: .* outside the frame/],
    [
      "collinear plane points", { type: "plane", points: [[0, 0], [100, 0], [200, 0], [300, 0]].map((p, i) => ({ image: [100 + p[0], 300], world: [i * 100, i * 10] })) },
      /on one line/,
    ],
    ["a plane of three points", { type: "plane", points: [{ image: [1, 1], world: [0, 0] }, { image: [50, 1], world: [10, 0] }, { image: [1, 50], world: [0, 10] }] }, /at least 4 points/],
  ];
  it.each(cals)("calibration: %s", async (_name, calibration, message) => {
    const { clipId, shot } = await newShot();
    const r = await analyst.put(`${T()}/clips/${clipId}/calibration`, { calibration });
    expect(r.status, r.text).toBe(422);
    expect(r.json.detail).toMatch(message);
    expect((await analyst.get(`${T()}/shots/${shot.id}`)).json.clip.calibration).toBeNull();
  });

  it("keeps the length unit the analyst typed beside the length in mm", async () => {
    const { clipId, shot } = await newShot();
    const r = await analyst.put(`${T()}/clips/${clipId}/calibration`, { calibration: { type: "scaleBar", a: [100, 100], b: [140, 100], lengthMm: 3 * 25.4, lengthUnit: "in" } });
    expect(r.status, r.text).toBe(200);
    const cal = (await analyst.get(`${T()}/shots/${shot.id}`)).json.clip.calibration;
    expect(cal).toMatchObject({ type: "scaleBar", a: [100, 100], b: [140, 100], lengthUnit: "in" });
    expect(cal.lengthMm).toBeCloseTo(76.2, 9); // 3 in × 25.4 mm/in, exact by definition (NIST SP 811 B)
  });

  it("a frame-range change that would leave marks outside is refused", async () => {
    const { shot } = await newShot();
    await analyst.put(`${T()}/shots/${shot.id}/marks`, { baseVersion: 1, marks: { puck: [[250, 10, 10]] }, events: {} });
    const r = await analyst.patch(`${T()}/shots/${shot.id}`, { frameEnd: 200 });
    expect(r.status).toBe(422);
    expect(r.json.detail).toMatch(/leaves marks outside/);
    expect((await analyst.get(`${T()}/shots/${shot.id}`)).json.frameEnd).toBe(300);
  });
});

describe("players", () => {
  it("see their own shot read-only once a coach publishes it, and not another player's", async () => {
    const { shot } = await newShot();
    expect((await player.get(`${T()}/shots/${shot.id}`)).status).toBe(404);
    expect((await coach.put(`${T()}/readout/shots/${shot.id}/publication`, { notify: false })).status).toBe(200);
    const own = await player.get(`${T()}/shots/${shot.id}`);
    expect(own.status).toBe(200);
    expect(own.json.canEdit).toBe(false);
    const write = await player.put(`${T()}/shots/${shot.id}/marks`, { baseVersion: 1, marks: { puck: [[10, 1, 1]] }, events: {} });
    expect(write.status).toBe(403);
    expect((await player.del(`${T()}/shots/${shot.id}`)).status).toBe(403);
    expect((await player2.get(`${T()}/shots/${shot.id}`)).status).toBe(404);
    expect((await analyst.get(`${T()}/shots/${shot.id}`)).json.canEdit).toBe(true);
  });

  it("list only the shots of a clip that are theirs", async () => {
    const { clipId, shot } = await newShot();
    const other = await analyst.post(`${T()}/clips/${clipId}/shots`, { frameStart: 1, frameEnd: 10, playerId: world.users[EMAILS.player2] });
    expect(other.status).toBe(201);
    // In review, the clip's list holds nothing for its players.
    expect((await player.get(`${T()}/clips/${clipId}/shots`)).json.shots).toEqual([]);
    for (const id of [shot.id, other.json.id]) expect((await coach.put(`${T()}/readout/shots/${id}/publication`, { notify: false })).status).toBe(200);
    const mine = (await player.get(`${T()}/clips/${clipId}/shots`)).json;
    expect(mine.shots.map((x: { id: string }) => x.id)).toEqual([shot.id]);
    expect(mine.canEdit).toBe(false);
    expect((await player2.get(`${T()}/clips/${clipId}/shots`)).json.shots.map((x: { id: string }) => x.id)).toEqual([other.json.id]);
    expect((await analyst.get(`${T()}/clips/${clipId}/shots`)).json.shots).toHaveLength(2);
  });
});

describe("deleting", () => {
  it("removes the shot and its result and writes the audit log", async () => {
    const { shot } = await newShot({ frameStart: 1, frameEnd: 50, label: "Gone soon" });
    expect((await coach.del(`${T()}/shots/${shot.id}`)).status).toBe(204);
    expect((await coach.get(`${T()}/shots/${shot.id}`)).status).toBe(404);
    const admin = await new Client(srv.url).signIn(EMAILS.admin);
    const audit = (await admin.get(`${T()}/audit`)).json;
    const rows = audit.entries;
    expect(rows.find((e: { action: string; targetId: string }) => e.action === "shot.deleted" && e.targetId === shot.id)).toMatchObject({ detail: { label: "Gone soon" } });
  });

  it("answers 404 for an id that is not a shot", async () => {
    expect((await analyst.get(`${T()}/shots/not-a-uuid`)).status).toBe(404);
    expect((await analyst.get(`${T()}/shots/${crypto.randomUUID()}`)).status).toBe(404);
  });
});
