// Clip ingest end to end on real PostgreSQL, real ffmpeg and the tus endpoint: upload → probe →
// stored by id → extraction job → frames, strip and original served; edit, retry, delete.
import { uploadDir, makeClip, tusUpload, clipMeta, waitFor, tusLeftovers, storedClipDirs } from "./clips-support";
import { createHash } from "node:crypto";
import { readFileSync, readdirSync } from "node:fs";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Client, EMAILS, seedWorld, startServer, waitForMail, type TestServer } from "./helpers";
import { startJobs, stopJobs } from "../../server/jobs/runtime";

let srv: TestServer;
let world: Awaited<ReturnType<typeof seedWorld>>;
let coach: Client;
let player: Client;
let clipId: string;
const file = makeClip("demo.mp4", { frames: 48, fps: 30, size: "320x180" });

beforeAll(async () => {
  srv = await startServer();
  world = await seedWorld();
  await startJobs({ work: true });
  coach = await new Client(srv.url).signIn(EMAILS.coach);
  player = await new Client(srv.url).signIn(EMAILS.player);
});
afterAll(async () => {
  await stopJobs();
  await srv.close();
});

const team = () => `/api/teams/${world.teamId}`;
const playerId = () => world.users[EMAILS.player];

describe("a clip from upload to frames", () => {
  it("uploads, probes and stores by id, then extracts every frame", async () => {
    const meta = clipMeta({ playerId: playerId(), title: "Point shot, side", captureFps: 3200, captureFpsConfirmed: true });
    const r = await tusUpload(srv.url, coach, file, { teamId: world.teamId, filename: "demo.mp4", meta: JSON.stringify(meta) });
    expect(r.ok, JSON.stringify(r.body)).toBe(true);
    expect(r.status).toBe(200);
    clipId = r.body.clip.id;
    expect(r.body.clip).toMatchObject({ status: "extracting", storedFps: 30, captureFps: 3200, captureFpsConfirmed: true, frameCount: 48, width: 320, height: 180 });
    expect(tusLeftovers()).toEqual([]);
    // stored by id, never by the client's name
    expect(readdirSync(path.join(uploadDir, "clips", clipId))).toContain("original");
    const ready = await waitFor("ready", async () => {
      const c = (await coach.get(`${team()}/clips/${clipId}`)).json;
      if (c.status === "failed") throw new Error(c.failureReason);
      return c.status === "ready" && c;
    });
    expect(ready.frameCount).toBe(48);
    expect(ready.framesDone).toBe(48);
    expect(ready.frameTimes).toHaveLength(48);
    // 30 fps stored: 1/30 s apart (ffmpeg's own timestamps, [CP])
    expect(ready.frameTimes[47]).toBeCloseTo(47 / 30, 3);
    expect(readdirSync(path.join(uploadDir, "clips", clipId, "frames"))).toHaveLength(48);
    const sha = createHash("sha256").update(readFileSync(file)).digest("hex");
    expect(createHash("sha256").update(readFileSync(path.join(uploadDir, "clips", clipId, "original"))).digest("hex")).toBe(sha);
  });

  it("serves frames as immutable JPEGs, with nosniff", async () => {
    const r = await fetch(`${srv.url}${team()}/clips/${clipId}/frames/1`, { headers: { cookie: (await import("./clips-support")).cookieOf(coach) } });
    expect(r.status).toBe(200);
    expect(r.headers.get("content-type")).toBe("image/jpeg");
    expect(r.headers.get("cache-control")).toMatch(/immutable/);
    expect(r.headers.get("x-content-type-options")).toBe("nosniff");
    const bytes = Buffer.from(await r.arrayBuffer());
    expect(bytes.subarray(0, 3)).toEqual(Buffer.from([0xff, 0xd8, 0xff])); // JPEG SOI marker (ITU-T T.81)
    const missing = await coach.get(`${team()}/clips/${clipId}/frames/49`);
    expect(missing.status).toBe(404);
    expect(missing.json.code).toBe("no_such_frame");
    expect((await coach.get(`${team()}/clips/${clipId}/frames/0`)).status).toBe(422);
    const strip = await coach.get(`${team()}/clips/${clipId}/strip`);
    expect(strip.status).toBe(200);
    expect(strip.headers.get("content-type")).toBe("image/jpeg");
    expect((await coach.get(`${team()}/clips/${clipId}/thumbnail`)).status).toBe(200);
  });

  it("serves the original with byte ranges (RFC 9110)", async () => {
    const whole = readFileSync(file);
    const part = await coach.request("GET", `${team()}/clips/${clipId}/original`, undefined, { headers: { range: "bytes=10-19" } });
    expect(part.status).toBe(206);
    expect(part.headers.get("content-range")).toBe(`bytes 10-19/${whole.length}`);
    expect(part.headers.get("accept-ranges")).toBe("bytes");
    expect(Buffer.from(part.text, "latin1").length).toBeGreaterThan(0);
    const tail = await fetch(`${srv.url}${team()}/clips/${clipId}/original`, { headers: { range: "bytes=-16", cookie: (await import("./clips-support")).cookieOf(coach) } });
    expect(tail.status).toBe(206);
    expect(Buffer.from(await tail.arrayBuffer())).toEqual(whole.subarray(whole.length - 16));
    const bad = await coach.request("GET", `${team()}/clips/${clipId}/original`, undefined, { headers: { range: `bytes=${whole.length + 5}-` } });
    expect(bad.status).toBe(416);
    expect(bad.headers.get("content-range")).toBe(`bytes */${whole.length}`);
  });

  it("mails the uploader when the clip is ready", async () => {
    const m = await waitForMail(EMAILS.coach, /Clip ready: Point shot, side/, 5000, `/clips/${clipId}`);
    expect(m.text).toContain("48 frames");
    expect(m.text).toContain(`/clips/${clipId}`);
  });

  it("lists with names, rates and progress; filters and sorts on the server", async () => {
    const page = (await coach.get(`${team()}/clips?sort=title&dir=asc&pageSize=10`)).json;
    expect(page.total).toBe(1);
    expect(page.items[0]).toMatchObject({ id: clipId, player: { id: playerId(), name: "Theo Marchetti" }, shotType: "slap", storedFps: 30, captureFps: 3200, progress: 1 });
    expect(page.items[0].session).toMatchObject({ date: "2026-03-14", venue: "Lakeport rink" });
    expect(page.items[0].thumbnailUrl).toBe(`${team()}/clips/${clipId}/thumbnail`);
    expect((await coach.get(`${team()}/clips?shotType=wrist`)).json.total).toBe(0);
    expect((await coach.get(`${team()}/clips?status=ready&playerId=${playerId()}`)).json.total).toBe(1);
    // The total comes with the page's rows; a page past the end has none and still says it.
    expect((await coach.get(`${team()}/clips?page=3&pageSize=10`)).json).toMatchObject({ items: [], total: 1, page: 3 });
    expect((await coach.get(`${team()}/clips?sort=nonsense`)).status).toBe(422);
  });

  it("a player sees clips of their own shots only", async () => {
    expect((await player.get(`${team()}/clips`)).json.total).toBe(1);
    const other = await new Client(srv.url).signIn(EMAILS.player2);
    expect((await other.get(`${team()}/clips`)).json.total).toBe(0);
    expect((await other.get(`${team()}/clips/${clipId}`)).status).toBe(404);
    expect((await other.get(`${team()}/clips/${clipId}/frames/1`)).status).toBe(404);
    expect((await player.patch(`${team()}/clips/${clipId}`, { notes: "mine" })).status).toBe(403);
  });

  it("edits metadata and confirms the capture rate", async () => {
    const r = await coach.patch(`${team()}/clips/${clipId}`, { captureFps: 1000, shotType: "wrist", notes: "Lab camera B" });
    expect(r.status, r.text).toBe(200);
    expect(r.json).toMatchObject({ captureFps: 1000, captureFpsConfirmed: true, shotType: "wrist", notes: "Lab camera B", storedFps: 30 });
    const bad = await coach.patch(`${team()}/clips/${clipId}`, { captureFps: -5 });
    expect(bad.status).toBe(422);
    expect(bad.json.errors[0].path).toBe("captureFps");
    const foreign = await coach.patch(`${team()}/clips/${clipId}`, { playerId: world.users[EMAILS.coach] });
    expect(foreign.status).toBe(422);
    expect(foreign.json.errors[0].path).toBe("playerId");
  });

  it("reports progress as JSON and as Server-Sent Events", async () => {
    const j = await coach.get(`${team()}/clips/${clipId}/progress`);
    expect(j.json).toMatchObject({ status: "ready", framesDone: 48, frameCount: 48, progress: 1 });
    const sse = await coach.request("GET", `${team()}/clips/${clipId}/progress`, undefined, { headers: { accept: "text/event-stream" } });
    expect(sse.headers.get("content-type")).toMatch(/text\/event-stream/);
    expect(sse.text).toMatch(/^event: progress\ndata: \{.*"status":"ready"/);
  });

  it("refuses a retry of a clip that did not fail", async () => {
    const r = await coach.post(`${team()}/clips/${clipId}/retry`);
    expect(r.status).toBe(409);
    expect(r.json.code).toBe("not_failed");
  });

  it("says what deleting the clip takes with it: its frames, its shots and every mark on them", async () => {
    const none = await coach.get(`${team()}/clips/${clipId}/deletion`);
    expect(none.status, none.text).toBe(200);
    expect(none.json).toEqual({ frames: 48, shots: 0, marks: 0 });
    const a = (await coach.post(`${team()}/clips/${clipId}/shots`, { frameStart: 1, frameEnd: 40 })).json;
    const b = (await coach.post(`${team()}/clips/${clipId}/shots`, { frameStart: 5, frameEnd: 30 })).json;
    const marked = await coach.put(`${team()}/shots/${a.id}/marks`, { baseVersion: 1, marks: { puck: [[10, 50, 60], [11, 55, 60], [12, 61, 60]], bladeHeel: [[10, 40, 90]] }, events: {} });
    expect(marked.status, marked.text).toBe(200);
    expect((await coach.put(`${team()}/shots/${b.id}/marks`, { baseVersion: 1, marks: { topHand: [[6, 10, 10], [7, 11, 10]] }, events: {} })).status).toBe(200);
    expect((await coach.get(`${team()}/clips/${clipId}/deletion`)).json).toEqual({ frames: 48, shots: 2, marks: 6 });
    // A player may not delete clips, so is not told what a deletion would take.
    expect((await player.get(`${team()}/clips/${clipId}/deletion`)).status).toBe(403);
  });

  it("deletes the clip, every derived file and records it in the audit log", async () => {
    expect((await coach.del(`${team()}/clips/${clipId}`)).status).toBe(204);
    expect(storedClipDirs()).not.toContain(clipId);
    expect((await coach.get(`${team()}/clips/${clipId}`)).status).toBe(404);
    const admin = await new Client(srv.url).signIn(EMAILS.admin);
    const audit = (await admin.get(`${team()}/audit`)).json;
    expect(JSON.stringify(audit)).toContain("clip.deleted");
  });
});
