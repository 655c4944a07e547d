// Auto-digitise through the API on real PostgreSQL, the real queue and ffmpeg: seeds on one frame
// of a generated slap shot → a tracking run on the queue → tracks, events and a scale bar
// proposed, stored apart from the marks. Two analysts starting at once run it once; a cancel or a
// deleted clip leaves nothing half-written; bad seeds answer 422 naming the field.
// Source of truth: the scene's analytic positions and events (scripts/demo/shot-scene.ts).
import { uploadDir, waitFor } from "./clips-support";
import { existsSync, readdirSync } from "node:fs";
import path from "node:path";
import { sql } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Client, EMAILS, seedWorld, startServer, type TestServer } from "./helpers";
import { newShot, publish, renderedShot, runOf, seedsOf, untilFinished, uploadReadyClip } from "./tracking-support";
import { startJobs, stopJobs } from "../../server/jobs/runtime";
import { db } from "../../server/db/client";

let srv: TestServer;
let world: Awaited<ReturnType<typeof seedWorld>>;
let analyst: Client;
let coach: Client;
let player: Client;
let clipId: string;
let truth: Awaited<ReturnType<typeof renderedShot>>["truth"];

beforeAll(async () => {
  srv = await startServer();
  world = await seedWorld();
  await startJobs({ work: true });
  analyst = await new Client(srv.url).signIn(EMAILS.analyst);
  coach = await new Client(srv.url).signIn(EMAILS.coach);
  player = await new Client(srv.url).signIn(EMAILS.player);
  const shot = await renderedShot(240);
  truth = shot.truth;
  clipId = await uploadReadyClip(srv.url, analyst, world.teamId, world.users[EMAILS.player], shot.file, 240);
}, 300_000);
afterAll(async () => {
  await stopJobs();
  await srv.close();
});

const team = () => `/api/teams/${world.teamId}`;
const start = (who: Client, shotId: string, body: unknown) => who.post(`${team()}/shots/${shotId}/tracking`, body);

describe("a tracking run from seeds on the first frame", () => {
  it("two analysts pressing at once run it once; it proposes every landmark, the events and a scale bar, and leaves the marks alone", async () => {
    const shotId = await newShot(analyst, world.teamId, clipId, truth.frameCount);
    const before = (await analyst.get(`${team()}/shots/${shotId}`)).json;
    const body = { seedFrame: 1, seeds: seedsOf(truth, 1) };
    const [a, b] = await Promise.all([start(analyst, shotId, body), start(coach, shotId, body)]);
    expect([a.status, b.status].sort()).toEqual([200, 202]);
    expect(a.json.run.id).toBe(b.json.run.id);
    expect([a.json.started, b.json.started].sort()).toEqual([false, true]);

    const run = await untilFinished(analyst, world.teamId, shotId);
    expect(run.status, run.failureReason).toBe("done");
    const rows = await db().execute<{ n: number }>(sql`select count(*)::int as n from pgboss.job where name = 'shot.track' and data->>'shotId' = ${shotId}`);
    expect(rows.rows[0].n).toBe(1);

    const p = run.proposals;
    for (const [k, t] of Object.entries(truth.tracks)) {
      const track = p.tracks[k];
      expect(track, k).toBeDefined();
      const at = new Map(t.map((m) => [m[0], m]));
      const errors = track.marks.map(([f, x, y]: number[]) => Math.hypot(x - at.get(f)![1], y - at.get(f)![2]));
      expect(errors.reduce((s: number, e: number) => s + e, 0) / errors.length, k).toBeLessThan(0.5);
      expect(track.marks.every((m: number[]) => m[3] >= 0.7 && m[3] <= 1)).toBe(true);
    }
    for (const k of ["iceStrike", "puckStrike", "peakBend", "release"] as const) expect(Math.abs(p.events[k].frame - truth.events[k]), k).toBeLessThanOrEqual(1);
    // No calibration on the clip: the puck at rest proposes one, its diameter within 0.5 %.
    const bar = p.scaleBar;
    expect(bar.lengthMm).toBe(76.2);
    expect(Math.abs(Math.hypot(bar.b[0] - bar.a[0], bar.b[1] - bar.a[1]) / (76.2 / truth.mmPerPx) - 1)).toBeLessThan(0.005);

    // Proposals are stored apart: the shot's marks and version did not move.
    const after = (await analyst.get(`${team()}/shots/${shotId}`)).json;
    expect(after.version).toBe(before.version);
    expect(after.marks).toEqual(before.marks);
    // A player who may see the shot reads the run (once published: in review it is a 404 to them);
    // a second start after it finished is a new run.
    expect((await player.get(`${team()}/shots/${shotId}/tracking`)).status).toBe(404);
    await publish(coach, world.teamId, shotId);
    expect((await player.get(`${team()}/shots/${shotId}/tracking`)).status).toBe(200);
    const again = await start(analyst, shotId, body);
    expect(again.status).toBe(202);
    expect(again.json.run.id).not.toBe(run.id);
    await untilFinished(analyst, world.teamId, shotId);
  });

  it("streams progress as server-sent events, ending with the finished run", async () => {
    const shotId = await newShot(analyst, world.teamId, clipId, truth.frameCount);
    await start(analyst, shotId, { seedFrame: 1, seeds: { puck: seedsOf(truth, 1).puck } });
    const res = await fetch(`${srv.url}${team()}/shots/${shotId}/tracking`, { headers: { accept: "text/event-stream", cookie: (await import("./clips-support")).cookieOf(analyst) } });
    expect(res.headers.get("content-type")).toMatch(/text\/event-stream/);
    const text = await res.text();
    const events = [...text.matchAll(/event: run\ndata: (.*)\n/g)].map((m) => JSON.parse(m[1]));
    expect(events.length).toBeGreaterThan(0);
    const last = events.at(-1);
    expect(last.status).toBe("done");
    expect(last.proposals.tracks.puck.marks.length).toBeGreaterThan(20);
  });
});

describe("cancel, delete and bad seeds", () => {
  it("a cancelled run stores no proposals and says who cancelled it", async () => {
    const shotId = await newShot(analyst, world.teamId, clipId, truth.frameCount);
    await start(analyst, shotId, { seedFrame: 1, seeds: seedsOf(truth, 1) });
    expect((await coach.del(`${team()}/shots/${shotId}/tracking`)).status).toBe(204);
    const run = await untilFinished(analyst, world.teamId, shotId);
    expect(run.status).toBe("cancelled");
    expect(run.proposals).toBeNull();
    expect(run.failureReason).toMatch(/^Cancelled by /);
    // It stays cancelled: a worker that had it writes nothing after.
    await new Promise((r) => setTimeout(r, 1500));
    expect((await runOf(analyst, world.teamId, shotId)).status).toBe("cancelled");
  });

  it("a clip deleted while its shot is being tracked leaves no run, no proposals and no job folder", async () => {
    // A longer shot (3,200 fps, 280 frames), so the run is still going when the clip goes.
    const shot = await renderedShot(3200);
    const id = await uploadReadyClip(srv.url, analyst, world.teamId, world.users[EMAILS.player], shot.file, 3200);
    const shotId = await newShot(analyst, world.teamId, id, shot.truth.frameCount);
    await start(analyst, shotId, { seedFrame: 1, seeds: seedsOf(shot.truth, 1) });
    await waitFor("run started", async () => (await runOf(analyst, world.teamId, shotId))?.status === "running", 30_000);
    expect((await coach.del(`${team()}/clips/${id}`)).status).toBe(204);
    const left = await db().execute<{ n: number }>(sql`select count(*)::int as n from tracking_run where shot_id = ${shotId}`);
    expect(left.rows[0].n).toBe(0);
    await waitFor("job over", async () => {
      const r = await db().execute<{ state: string }>(sql`select state from pgboss.job where name = 'shot.track' and data->>'shotId' = ${shotId}`);
      return r.rows.every((j) => j.state === "completed");
    }, 30_000);
    const jobs = path.join(uploadDir, ".jobs");
    expect(existsSync(jobs) ? readdirSync(jobs).filter((d) => d.includes("track-")) : []).toEqual([]);
  });

  it("refuses seeds it cannot track, naming the field, and players", async () => {
    const shotId = await newShot(analyst, world.teamId, clipId, 30);
    const cases: [unknown, RegExp][] = [
      [{ seedFrame: 31, seeds: { puck: [600, 600] } }, /seedFrame: frame 31 is outside this shot's frames 1–30/],
      [{ seedFrame: 1, seeds: { puck: [1400, 600] } }, /seeds\.puck: Puck: \(1400\.0, 600\.0\) is outside the frame/],
      [{ seedFrame: 1, seeds: {} }, /place at least one landmark/],
      [{ seedFrame: 1, seeds: { stickTip: [1, 1] } }, /stickTip/],
      [{ seedFrame: 1.5, seeds: { puck: [1, 1] } }, /whole frame number/],
    ];
    for (const [body, message] of cases) {
      const r = await start(analyst, shotId, body);
      expect(r.status, JSON.stringify(body)).toBe(422);
      expect(r.json.detail).toMatch(message);
    }
    await publish(coach, world.teamId, shotId);
    expect((await start(player, shotId, { seedFrame: 1, seeds: { puck: [600, 600] } })).status).toBe(403);
    expect(await runOf(analyst, world.teamId, shotId)).toBeNull();
  });
});
