// Shot readout, list, side by side and progress on real PostgreSQL: the numbers are the engine's,
// a player sees own and shared shots only, comparing across teams or reading a deleted shot gives a
// clear message and nothing of the other shot.
import { createHash } from "node:crypto";
import { sql } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Client, EMAILS, seedWorld, startServer, type TestServer } from "./helpers";
import { insertReadyClip } from "./routes/shots";
import { insertShotWithResults, scene } from "./routes/readout";

let srv: TestServer;
let world: Awaited<ReturnType<typeof seedWorld>>;
let analyst: Client, coach: Client, player: Client, player2: Client, outsider: Client;

beforeAll(async () => {
  srv = await startServer();
  world = await seedWorld();
  analyst = await new Client(srv.url).signIn(EMAILS.analyst);
  coach = await new Client(srv.url).signIn(EMAILS.coach);
  player = await new Client(srv.url).signIn(EMAILS.player);
  player2 = await new Client(srv.url).signIn(EMAILS.player2);
  outsider = await new Client(srv.url).signIn(world.outsiderEmail);
});
afterAll(() => srv.close());

const R = () => `/api/teams/${world.teamId}/readout`;
const uid = (email: string) => world.users[email];

describe("shot readout", () => {
  it("reads back what the shots API stored, with the events timed by the capture rate", async () => {
    // Digitised the way Digitise does it: marks saved, then the clip calibrated (each recomputes).
    const s = scene();
    const clipId = await insertReadyClip(world.teamId, { playerId: uid(EMAILS.player), frameCount: 400, width: 2000, height: 720, captureFps: 3200 });
    const shot = (await analyst.post(`/api/teams/${world.teamId}/clips/${clipId}/shots`, { frameStart: 1, frameEnd: 400, label: "Real path" })).json;
    expect((await analyst.put(`/api/teams/${world.teamId}/shots/${shot.id}/marks`, { baseVersion: 1, marks: s.marks, events: s.events })).status).toBe(200);

    expect((await coach.put(`${R()}/shots/${shot.id}/publication`, { notify: false })).status).toBe(200);
    const before = await player.get(`${R()}/shots/${shot.id}`);
    expect(before.status, before.text).toBe(200);
    expect(before.json.results).toBeNull();
    expect(before.json.missing).toMatch(/calibration/);

    expect((await analyst.put(`/api/teams/${world.teamId}/clips/${clipId}/calibration`, { calibration: s.calibration })).status).toBe(200);
    const stored = (await analyst.get(`/api/teams/${world.teamId}/shots/${shot.id}`)).json.storedResult.results;
    const r = await player.get(`${R()}/shots/${shot.id}`);
    expect(r.status).toBe(200);
    expect(r.json.missing).toBeNull();
    expect(r.json.stale).toBe(false);
    expect(r.json.results.puckExitSpeed.valueMps).toBe(stored.puckExitSpeed.valueMps);
    // [CP] the synthetic scene's known exit speed (30 m/s), to 1 %.
    expect(Math.abs(r.json.results.puckExitSpeed.valueMps - s.truth.exitSpeedMps) / s.truth.exitSpeedMps).toBeLessThan(0.01);
    const ev = Object.fromEntries(r.json.events.map((e: { key: string }) => [e.key, e]));
    // Times come from the capture rate: (frame − puck strike) / 3200 fps.
    expect(ev.release.tFromStrikeMs).toBeCloseTo(((s.events.release - s.events.puckStrike) / 3200) * 1000, 9);
    expect(ev.release.tFromStrikeMs).toBeCloseTo(r.json.results.contactTimeMs, 9);
    expect(ev.iceStrike.tMs).toBeCloseTo(((s.events.iceStrike - 1) / 3200) * 1000, 9);
    expect(r.json.results.series.puckSpeed.frame.length).toBeGreaterThan(100);
    expect(r.json.can).toEqual({ edit: false, share: false, publish: false });
    expect((await coach.get(`${R()}/shots/${shot.id}`)).json.can).toEqual({ edit: true, share: true, publish: true });
  });

  it("a player cannot open another player's shot: the same 404 as a shot that does not exist", async () => {
    const theirs = await insertShotWithResults({ teamId: world.teamId, playerId: uid(EMAILS.player2), label: "Jonah private" });
    const r = await player.get(`${R()}/shots/${theirs.shotId}`);
    expect(r.status).toBe(404);
    expect(r.json.detail).toMatch(/not found in this team.*not be shared with you/);
    expect(r.text).not.toContain("Jonah private");
    const none = await player.get(`${R()}/shots/${crypto.randomUUID()}`);
    expect(none.status).toBe(404);
    expect(none.json.detail).toBe(r.json.detail);
    expect((await player.get(`${R()}/shots/not-an-id`)).status).toBe(404);
  });

  it("a deleted shot behind an old link: staff learn when and by whom, a player gets the plain 404", async () => {
    const gone = await insertShotWithResults({ teamId: world.teamId, playerId: uid(EMAILS.player), label: "Soon deleted" });
    expect((await analyst.del(`/api/teams/${world.teamId}/shots/${gone.shotId}`)).status).toBe(204);
    const staff = await coach.get(`${R()}/shots/${gone.shotId}`);
    expect(staff.status).toBe(410);
    expect(staff.json.code).toBe("shot_deleted");
    expect(staff.json.detail).toMatch(/deleted on \d{4}-\d\d-\d\d by Priya Lindqvist/);
    const own = await player.get(`${R()}/shots/${gone.shotId}`);
    expect(own.status).toBe(404);
    expect(own.json.detail).toMatch(/may have been deleted/);
  });
});

describe("list of shots", () => {
  it("staff see the team's shots; a player sees own and shared ones only, with filters", async () => {
    const { db } = await import("../../server/db/client");
    const { shotShare, stick } = await import("../../server/db/schema");
    const [st] = await db().insert(stick).values({ teamId: world.teamId, label: "List 75", ratedFlex: 75 }).returning();
    const own = await insertShotWithResults({ teamId: world.teamId, playerId: uid(EMAILS.player), label: "List own", stickId: st.id, shotType: "wrist" });
    const other = await insertShotWithResults({ teamId: world.teamId, playerId: uid(EMAILS.player2), label: "List other" });
    const shared = await insertShotWithResults({ teamId: world.teamId, playerId: uid(EMAILS.player2), label: "List shared" });
    await db().insert(shotShare).values({ shotId: shared.shotId, userId: uid(EMAILS.player), teamId: world.teamId, sharedBy: uid(EMAILS.coach) });

    const mine = (await player.get(`${R()}/shots`)).json;
    const ids = mine.shots.map((s: { id: string }) => s.id);
    expect(ids).toContain(own.shotId);
    expect(ids).toContain(shared.shotId);
    expect(ids).not.toContain(other.shotId);
    expect(mine.shots.find((s: { id: string }) => s.id === shared.shotId)).toMatchObject({ sharedWithMe: true, shareCount: 0 });
    expect(mine.shots.find((s: { id: string }) => s.id === own.shotId)).toMatchObject({ sharedWithMe: false, hasResults: true, stickLabel: "List 75", shotType: "wrist" });

    const all = (await coach.get(`${R()}/shots`)).json.shots.map((s: { id: string }) => s.id);
    expect(all).toEqual(expect.arrayContaining([own.shotId, other.shotId, shared.shotId]));
    const wrist = (await coach.get(`${R()}/shots?shotType=wrist`)).json.shots;
    expect(wrist.every((s: { shotType: string }) => s.shotType === "wrist")).toBe(true);
    expect(wrist.map((s: { id: string }) => s.id)).toContain(own.shotId);
    const byStick = (await coach.get(`${R()}/shots?stickId=${st.id}`)).json.shots.map((s: { id: string }) => s.id);
    expect(byStick).toEqual([own.shotId]);
    const bad = await coach.get(`${R()}/shots?shotType=lob`);
    expect(bad.status).toBe(422);
    expect(bad.json.errors[0].path).toBe("shotType");
  });
});

describe("the stick on a readout", () => {
  it("shows the rated flex until the stick is bench-tested, then the latest test's measured flex", async () => {
    const { db } = await import("../../server/db/client");
    const { benchTest, stick } = await import("../../server/db/schema");
    const [st] = await db().insert(stick).values({ teamId: world.teamId, label: "Readout 85", ratedFlex: 85 }).returning();
    const s = await insertShotWithResults({ teamId: world.teamId, playerId: uid(EMAILS.player), label: "Stick readout", stickId: st.id });
    const before = (await coach.get(`${R()}/shots/${s.shotId}`)).json.stick;
    expect(before).toMatchObject({ id: st.id, label: "Readout 85", flex: 85, flexSource: "rated", testedOn: null });
    const test = (testedOn: string, measuredFlex: number) => ({ teamId: world.teamId, stickId: st.id, testedOn, spanMm: 1000, loadPointMm: 500, readings: [], fit: {}, measuredFlex, eiNm2: 1 });
    await db().insert(benchTest).values([test("2026-02-01", 80), test("2026-03-01", 72.5), test("2026-01-01", 84)]);
    const after = (await coach.get(`${R()}/shots/${s.shotId}`)).json.stick;
    expect(after).toMatchObject({ flex: 72.5, flexSource: "measured", testedOn: "2026-03-01" });
  });
});

describe("the shots list in pages", () => {
  it("pages cover every shot once, newest first; the total and the filter choices count all shots, not one page", async () => {
    const { db } = await import("../../server/db/client");
    const { stick } = await import("../../server/db/schema");
    const [st] = await db().insert(stick).values({ teamId: world.teamId, label: "Pager 85", ratedFlex: 85 }).returning();
    for (let i = 0; i < 7; i++) await insertShotWithResults({ teamId: world.teamId, playerId: uid("player3@ravens.example"), label: `Paged ${i}`, stickId: i === 0 ? st.id : undefined });
    const filter = `playerId=${encodeURIComponent(uid("player3@ravens.example"))}`;
    const first = (await coach.get(`${R()}/shots?${filter}&pageSize=3`)).json;
    expect(first).toMatchObject({ total: 7, page: 1, pageSize: 3 });
    expect(first.shots).toHaveLength(3);
    const seen: string[] = [];
    for (let page = 1; page <= 3; page++) seen.push(...(await coach.get(`${R()}/shots?${filter}&pageSize=3&page=${page}`)).json.shots.map((s: { id: string }) => s.id));
    expect(seen).toHaveLength(7);
    expect(new Set(seen).size).toBe(7);
    // The stick of the one shot on the last page is offered on every page.
    expect(first.sticks.map((s: { label: string }) => s.label)).toContain("Pager 85");
    expect((await coach.get(`${R()}/shots?${filter}&pageSize=3&page=9`)).json).toMatchObject({ shots: [], total: 7 });
    const tooBig = await coach.get(`${R()}/shots?pageSize=5000`);
    expect(tooBig.status).toBe(422);
    expect(tooBig.json.errors[0].path).toBe("pageSize");
    expect((await coach.get(`${R()}/shots?page=0`)).status).toBe(422);
  });
});

describe("stored results not in the engine's shape", () => {
  it("read as no results yet, in the list, the readout and progress, instead of failing", async () => {
    const { db } = await import("../../server/db/client");
    const { shotResult } = await import("../../server/db/schema");
    const { eq } = await import("drizzle-orm");
    const s = await insertShotWithResults({ teamId: world.teamId, playerId: uid(EMAILS.player), label: "Odd stored result" });
    // Read once in the engine's shape first: the answer must follow the stored text, not a check made earlier.
    const before = await coach.get(`${R()}/shots/${s.shotId}`);
    expect(before.json.results.puckExitSpeed.valueMps).toBe(s.results!.puckExitSpeed.valueMps);
    await db().update(shotResult).set({ results: { shaftDeflection: { valueMm: 12 } } }).where(eq(shotResult.shotId, s.shotId));
    const list = await coach.get(`${R()}/shots`);
    expect(list.status, list.text).toBe(200);
    expect(list.json.shots.find((x: { id: string }) => x.id === s.shotId)).toMatchObject({ hasResults: false, puckExitSpeedMps: null });
    const one = await coach.get(`${R()}/shots/${s.shotId}`);
    expect(one.status).toBe(200);
    expect(one.json.results).toBeNull();
    expect(one.json.missing).toMatch(/not been computed/);
    expect((await coach.get(`${R()}/progress?playerId=${uid(EMAILS.player)}`)).status).toBe(200);
  });
});

describe("one shot's readout answered from the stored text", () => {
  it("is the readout the service builds, results as stored, key for key", async () => {
    const s = await insertShotWithResults({ teamId: world.teamId, playerId: uid(EMAILS.player), label: "Text readout" });
    // Shared with its player and the staff: the shares come with the row there (decision 178),
    // from their own query here; names, roles, times and order must agree.
    const shared = await coach.post(`${R()}/shots/${s.shotId}/shares`, { player: true, staff: true });
    expect(shared.status, shared.text).toBe(201);
    const r = await coach.get(`${R()}/shots/${s.shotId}`);
    expect(r.json.shares.length).toBeGreaterThanOrEqual(2);
    // The list's rows carry their shares too (decision 178): staff see how many.
    const listed = (await coach.get(`${R()}/shots?playerId=${uid(EMAILS.player)}&pageSize=100`)).json.shots.find((x: { id: string }) => x.id === s.shotId);
    expect(listed.shareCount).toBe(r.json.shares.length);
    expect(r.status, r.text).toBe(200);
    expect(r.headers.get("content-type")).toMatch(/^application\/json/);
    const { getReadout } = await import("../../server/readout/service");
    const built = await getReadout({ userId: uid(EMAILS.coach), teamId: world.teamId, role: "coach" }, s.shotId);
    expect(r.json).toEqual(JSON.parse(JSON.stringify(built)));
    expect(r.json.results).toEqual(JSON.parse(JSON.stringify(s.results)));
  });
});

describe("one shot's readout, its bytes (decisions 193, 199)", () => {
  // The answer's bytes, first read and kept, must be exactly the joined text of the readout the
  // service builds and the stored results, for every kind of reader: the service writes the
  // pieces straight into one buffer instead (decision 199). The ETag's hash of the results is the
  // MD5 PostgreSQL keeps: it must be the MD5 of the very text it sends.
  const md5 = (t: string) => createHash("md5").update(t).digest("hex");
  async function oldBytes(email: string, role: "coach" | "player", shotId: string) {
    const { getReadout } = await import("../../server/readout/service");
    const { weakTagOf } = await import("../../server/http/json-answer");
    const { db } = await import("../../server/db/client");
    const { results, ...rest } = await getReadout({ userId: uid(email), teamId: world.teamId, role }, shotId);
    const stored = results === null ? "null" : (await db().execute<{ t: string }>(sql`select results::text as t from shot_result where shot_id = ${shotId}`)).rows[0].t;
    const head = JSON.stringify(rest).slice(0, -1);
    const text = `${head},"results":${stored}}`;
    return { bytes: Buffer.from(text), tag: weakTagOf(text.length, head, results === null ? "" : md5(stored)) };
  }
  async function expectOldBytes(c: Client, email: string, role: "coach" | "player", shotId: string) {
    const want = await oldBytes(email, role, shotId);
    // A first read, a second (kept from there, decision 200), then the kept answer (decision 192).
    for (const read of ["first", "second", "kept"]) {
      const r = await c.get(`${R()}/shots/${shotId}`);
      expect(r.status, `${email} ${read}: ${r.text.slice(0, 200)}`).toBe(200);
      expect(Buffer.from(r.text).equals(want.bytes), `${email} ${read}: same bytes`).toBe(true);
      expect(r.headers.get("content-length")).toBe(String(want.bytes.length));
      expect(r.headers.get("etag"), `${email} ${read}`).toBe(want.tag);
    }
    return want.bytes;
  }

  it("staff and players, shared and not, with and without results: the bytes the joined text made", async () => {
    const { db } = await import("../../server/db/client");
    // Beyond Latin-1 in the head (the label) and in the stored results (a note with an astral
    // character, two UTF-16 units): the pieces' encodings and the ETag's length in UTF-16 units.
    const withResults = await insertShotWithResults({ teamId: world.teamId, playerId: uid(EMAILS.player), label: "Bytes — slap 𝛉" });
    await db().execute(sql`update shot_result set results = jsonb_set(results::jsonb, '{notes}', (results->'notes')::jsonb || '[{"code":"bytes","message":"± 2° — 𝛉 near the heel"}]') where shot_id = ${withResults.shotId}`);
    const noResults = await insertShotWithResults({ teamId: world.teamId, playerId: uid(EMAILS.player), label: "Bytes — no results", uncalibrated: true });
    const sharedOne = await insertShotWithResults({ teamId: world.teamId, playerId: uid(EMAILS.player), label: "Bytes — shared" });
    const unshaped = await insertShotWithResults({ teamId: world.teamId, playerId: uid(EMAILS.player), label: "Bytes — not the engine's shape" });
    await db().execute(sql`update shot_result set results = '{"puckExitSpeed": "fast"}' where shot_id = ${unshaped.shotId}`);
    const shared = await coach.post(`${R()}/shots/${sharedOne.shotId}/shares`, { player: true, teammates: [uid(EMAILS.player2)], staff: true });
    expect(shared.status, shared.text).toBe(201);

    const sent = await expectOldBytes(coach, EMAILS.coach, "coach", withResults.shotId);
    expect(sent.toString()).toContain("± 2° — 𝛉 near the heel");
    await expectOldBytes(player, EMAILS.player, "player", withResults.shotId);
    const none = await expectOldBytes(coach, EMAILS.coach, "coach", noResults.shotId);
    expect(none.toString()).toMatch(/,"results":null}$/);
    await expectOldBytes(player, EMAILS.player, "player", noResults.shotId);
    expect((await expectOldBytes(coach, EMAILS.coach, "coach", unshaped.shotId)).toString()).toMatch(/,"results":null}$/);
    const staffView = await expectOldBytes(coach, EMAILS.coach, "coach", sharedOne.shotId);
    const ownerView = await expectOldBytes(player, EMAILS.player, "player", sharedOne.shotId);
    const sharedView = await expectOldBytes(player2, EMAILS.player2, "player", sharedOne.shotId);
    // Each reader's own answer: staff see every share, a player only their own.
    expect(JSON.parse(staffView.toString()).shares.length).toBeGreaterThan(JSON.parse(sharedView.toString()).shares.length);
    expect(ownerView.equals(sharedView)).toBe(false);
  });
});

describe("side by side", () => {
  it("two of one's own shots, each with its own capture rate", async () => {
    const a = await insertShotWithResults({ teamId: world.teamId, playerId: uid(EMAILS.player), label: "Cmp 3200" });
    const b = await insertShotWithResults({ teamId: world.teamId, playerId: uid(EMAILS.player), label: "Cmp 1000", scene: { captureFps: 1000 } });
    const r = await player.get(`${R()}/compare?a=${a.shotId}&b=${b.shotId}`);
    expect(r.status, r.text).toBe(200);
    expect(r.json.a.clip.captureFps).toBe(3200);
    expect(r.json.b.clip.captureFps).toBe(1000);
    expect(r.json.b.results.puckExitSpeed.valueMps).toBe(b.results!.puckExitSpeed.valueMps);
  });

  it("a player cannot put another player's shot beside their own; nothing of it comes back", async () => {
    const a = await insertShotWithResults({ teamId: world.teamId, playerId: uid(EMAILS.player), label: "Mine" });
    const b = await insertShotWithResults({ teamId: world.teamId, playerId: uid(EMAILS.player2), label: "Not mine" });
    const r = await player.get(`${R()}/compare?a=${a.shotId}&b=${b.shotId}`);
    expect(r.status).toBe(404);
    expect(r.json.detail).toMatch(/^Shot B was not found in this team/);
    expect(r.text).not.toContain("Not mine");
  });

  it("shots from different teams: a clear message, nothing of the other team's shot", async () => {
    const ours = await insertShotWithResults({ teamId: world.teamId, playerId: uid(EMAILS.player), label: "Ours" });
    const theirs = await insertShotWithResults({ teamId: world.otherTeamId, label: "Foxes secret" });
    const r = await coach.get(`${R()}/compare?a=${ours.shotId}&b=${theirs.shotId}`);
    expect(r.status).toBe(404);
    expect(r.json.detail).toMatch(/Shot B was not found in this team\. It may .* belong to another team/);
    expect(r.text).not.toContain("Foxes secret");
    expect(r.text).not.toContain(world.otherTeamId);
    // From the other side: the outsider is not a member of our team at all.
    const o = await outsider.get(`${R()}/compare?a=${ours.shotId}&b=${theirs.shotId}`);
    expect(o.status).toBe(404);
    expect(o.text).not.toContain("Ours");
    const same = await coach.get(`${R()}/compare?a=${ours.shotId}&b=${ours.shotId}`);
    expect(same.status).toBe(422);
    expect(same.json.detail).toMatch(/two different shots/);
  });

  it("a shot with no results yet still compares, saying what it is missing", async () => {
    const a = await insertShotWithResults({ teamId: world.teamId, playerId: uid(EMAILS.player) });
    const b = await insertShotWithResults({ teamId: world.teamId, playerId: uid(EMAILS.player), uncalibrated: true });
    const r = await player.get(`${R()}/compare?a=${a.shotId}&b=${b.shotId}`);
    expect(r.status).toBe(200);
    expect(r.json.b.results).toBeNull();
    expect(r.json.b.missing).toMatch(/calibration/);
  });
});

describe("progress", () => {
  it("best and typical (median) over the player's sessions, one shot type by default, filtered by stick and shot type", async () => {
    const { db } = await import("../../server/db/client");
    const { member, stick } = await import("../../server/db/schema");
    const { createAccount } = await import("../../server/auth/accounts");
    // A player of our own, so other tests' shots do not count here.
    const { userId: pid } = await createAccount({ email: "progress@ravens.example", password: "ravens-demo-2026", name: "Pat Progress", emailVerified: true, signIn: false });
    await db().insert(member).values({ id: crypto.randomUUID(), organizationId: world.teamId, userId: pid, role: "player", createdAt: new Date() });
    const pat = await new Client(srv.url).signIn("progress@ravens.example");
    const [st] = await db().insert(stick).values({ teamId: world.teamId, label: "Prog 85", ratedFlex: 85 }).returning();
    const speeds = [20, 26, 23];
    const made = [];
    for (const [i, v] of speeds.entries())
      made.push(await insertShotWithResults({ teamId: world.teamId, playerId: pid, sessionDate: `2026-0${i + 1}-15`, stickId: i === 2 ? st.id : null, scene: { exitSpeedMps: v, seed: `p${i}` } }));
    await insertShotWithResults({ teamId: world.teamId, playerId: pid, uncalibrated: true, shotType: "wrist" });

    const r = await coach.get(`${R()}/progress?playerId=${pid}`);
    expect(r.status, r.text).toBe(200);
    const got = made.map((m) => m.results!.puckExitSpeed.valueMps);
    expect(r.json.points.map((p: { values: { puckExitSpeed: { value: number } } }) => p.values.puckExitSpeed.value)).toEqual(got); // in date order
    const sorted = [...got].sort((x, y) => x - y);
    expect(r.json.summary.puckExitSpeed).toMatchObject({ count: 3, best: sorted[2], typical: sorted[1], bestShotId: made[1].shotId, firstSession: got[0], lastSession: got[2] });
    // [CP] the scenes' known exit speeds, to 2 %: best is the 26 m/s shot.
    expect(Math.abs(r.json.summary.puckExitSpeed.best - 26) / 26).toBeLessThan(0.02);
    // Contact time: best is the shortest (all three scenes share 30 ms).
    expect(r.json.summary.contactTime.best).toBeCloseTo(30, 6);
    // One type at a time: by default the one shot most (three slap shots with results, no wrist shot with any).
    expect(r.json.shotType).toBe("slap");
    expect(r.json.shotTypeCounts).toEqual({ slap: 3 });
    expect(r.json.withoutResults).toBe(0);
    const every = (await coach.get(`${R()}/progress?playerId=${pid}&shotType=all`)).json;
    expect(every.shotType).toBeNull();
    expect(every.points).toHaveLength(3);
    expect(every.withoutResults).toBe(1);
    expect(r.json.sticks).toEqual([{ id: st.id, label: "Prog 85" }]);
    expect(r.json.shotTypes.sort()).toEqual(["slap", "wrist"]);

    const byStick = (await coach.get(`${R()}/progress?playerId=${pid}&stickId=${st.id}`)).json;
    expect(byStick.points.map((p: { shotId: string }) => p.shotId)).toEqual([made[2].shotId]);
    const wrist = (await coach.get(`${R()}/progress?playerId=${pid}&shotType=wrist`)).json;
    expect(wrist.points).toEqual([]);
    expect(wrist.withoutResults).toBe(1);

    // The player sees only themself; without a playerId they get their own.
    const self = await pat.get(`${R()}/progress`);
    expect(self.status).toBe(200);
    expect(self.json.player).toEqual({ id: pid, name: "Pat Progress" });
    const nosy = await pat.get(`${R()}/progress?playerId=${uid(EMAILS.player)}`);
    expect(nosy.status).toBe(403);
    expect(nosy.json.detail).toMatch(/own progress only/);
    expect((await coach.get(`${R()}/progress?playerId=not-a-member`)).status).toBe(404);
  });

  it("players to pick: staff get the team's players, a player only themself", async () => {
    const staff = (await coach.get(`${R()}/players`)).json.players.map((p: { name: string }) => p.name);
    expect(staff).toEqual(expect.arrayContaining(["Theo Marchetti", "Jonah Okafor", "Elin Sandberg"]));
    expect(staff).not.toContain("Casey Outsider");
    const self = (await player2.get(`${R()}/players`)).json.players;
    expect(self.map((p: { id: string }) => p.id)).toEqual([uid(EMAILS.player2)]);
  });
});

// API JSON is written in one piece with a weak ETag (server/http/json-answer.ts, decision 177):
// a client holding the current copy gets 304 and no body, any change of the answer a new tag,
// Content-Length counts bytes (not characters), HEAD sends no body.
// As a browser revalidates its cached copy. (fetch() given If-None-Match alone adds
// "Cache-Control: no-cache", which asks for a full answer: WHATWG Fetch, HTTP-network-or-cache fetch.)
const ifNoneMatch = (p: string, tag: string) => coach.request("GET", p, undefined, { headers: { "if-none-match": tag, "cache-control": "max-age=0" } });

describe("JSON answers: one write, a weak ETag, 304 while current", () => {
  it("one shot's readout: 304 while current; a new tag when the shot or its stored results change", async () => {
    const { db } = await import("../../server/db/client");
    const { shot, shotResult } = await import("../../server/db/schema");
    const { eq } = await import("drizzle-orm");
    const s = await insertShotWithResults({ teamId: world.teamId, playerId: uid(EMAILS.player), label: "Tir du poignet — élan" });
    const p = `${R()}/shots/${s.shotId}`;
    const first = await coach.get(p);
    expect(first.status).toBe(200);
    const tag = first.headers.get("etag")!;
    expect(tag).toMatch(/^W\/"[0-9a-f]+-[\w-]+"$/);
    expect(Number(first.headers.get("content-length"))).toBe(Buffer.byteLength(first.text));
    expect(first.json.shot.label).toBe("Tir du poignet — élan");

    const again = await ifNoneMatch(p, tag);
    expect(again.status).toBe(304);
    expect(again.text).toBe("");
    expect(again.headers.get("etag")).toBe(tag);

    const head = await coach.request("HEAD", p);
    expect(head.status).toBe(200);
    expect(head.text).toBe("");
    expect(head.headers.get("etag")).toBe(tag);
    expect(head.headers.get("content-length")).toBe(first.headers.get("content-length"));

    // The shot renamed (outside the results): a new tag, the new answer.
    await db().update(shot).set({ label: "Renamed" }).where(eq(shot.id, s.shotId));
    const renamed = await ifNoneMatch(p, tag);
    expect(renamed.status).toBe(200);
    expect(renamed.json.shot.label).toBe("Renamed");
    const tag2 = renamed.headers.get("etag")!;
    expect(tag2).not.toBe(tag);

    // Only the stored results changed, to a value of the same length: still a new tag.
    const v = s.results!.puckExitSpeed.valueMps;
    const nudged = Number((v + (v >= 10 ? -1 : 1)).toFixed(String(v).split(".")[1]?.length ?? 0));
    await db().update(shotResult).set({ results: { ...s.results!, puckExitSpeed: { ...s.results!.puckExitSpeed, valueMps: nudged } } }).where(eq(shotResult.shotId, s.shotId));
    const recomputed = await ifNoneMatch(p, tag2);
    expect(recomputed.status).toBe(200);
    expect(recomputed.json.results.puckExitSpeed.valueMps).toBe(nudged);
    expect(recomputed.headers.get("etag")).not.toBe(tag2);
  });

  it("the clip list (res.json): 304 while current, 200 with the new list after a change; writes carry no tag", async () => {
    const p = `/api/teams/${world.teamId}/clips?page=1&pageSize=25`;
    const first = await coach.get(p);
    expect(first.status).toBe(200);
    expect(first.headers.get("content-type")).toBe("application/json; charset=utf-8");
    const tag = first.headers.get("etag")!;
    expect(tag).toBeTruthy();
    expect(Number(first.headers.get("content-length"))).toBe(Buffer.byteLength(first.text));
    expect((await ifNoneMatch(p, tag)).status).toBe(304);

    const clipId = first.json.items[0].id;
    const patched = await coach.patch(`/api/teams/${world.teamId}/clips/${clipId}`, { title: "Renommé ✓" });
    expect(patched.status, patched.text).toBe(200);
    expect(patched.headers.get("etag")).toBeNull();
    const after = await ifNoneMatch(p, tag);
    expect(after.status).toBe(200);
    expect(after.json.items.find((c: { id: string }) => c.id === clipId).title).toBe("Renommé ✓");

    // A problem answer keeps its own type and no tag.
    const missing = await coach.get(`/api/teams/${world.teamId}/clips/00000000-0000-4000-8000-000000000000`);
    expect(missing.status).toBe(404);
    expect(missing.headers.get("content-type")).toMatch(/^application\/problem\+json/);
  });
});
