// Every kind of bad upload, each a real file made here with ffmpeg or by hand: each gets its
// clear message and leaves nothing behind (no clip row, no stored file, no unfinished upload).
import { clipMeta, cookieOf as cookie, ffmpeg, makeClip, mediaDir, storedClipDirs, tusLeftovers, tusUpload, uploadDir, waitFor } from "./clips-support";
import { execFileSync } from "node:child_process";
import { readdirSync, readFileSync, statSync, truncateSync, writeFileSync } from "node:fs";
import path from "node:path";
import sharp from "sharp";
import { describe, expect, it } from "vitest";
import { Client, EMAILS } from "./helpers";
import { clipUpload, teamPath, useCoachWorld } from "./coach-world";

const w = useCoachWorld();

const team = () => teamPath(w);
const md = (filename: string, over: Record<string, unknown> = {}) => clipUpload(w, filename, over);
const clipCount = async () => (await w.coach.get(`${team()}/clips`)).json.total as number;

async function expectRejected(file: Buffer | string, name: string, status: number, code: string, message: RegExp) {
  const rowsBefore = await clipCount();
  const dirsBefore = storedClipDirs().length;
  const r = await tusUpload(w.srv.url, w.coach, file, md(name));
  expect(r.ok, JSON.stringify(r.body)).toBe(false);
  expect(r.status).toBe(status);
  expect(r.body.code).toBe(code);
  expect(r.body.detail).toMatch(message);
  expect(await clipCount()).toBe(rowsBefore);
  expect(storedClipDirs()).toHaveLength(dirsBefore);
  expect(tusLeftovers()).toEqual([]);
  return r;
}

async function accepted(file: string, name: string) {
  const r = await tusUpload(w.srv.url, w.coach, file, md(name));
  expect(r.ok, JSON.stringify(r.body)).toBe(true);
  return waitFor("clip ready", async () => {
    const c = (await w.coach.get(`${team()}/clips/${r.body.clip.id}`)).json;
    if (c.status === "failed") throw new Error(c.failureReason);
    return c.status === "ready" && c;
  });
}

describe("unusable files are refused with their reason", () => {
  it("a text file renamed .mp4", async () => {
    const f = path.join(mediaDir, "notes.mp4");
    writeFileSync(f, "Drill plan: ten slap shots from the blue line.\n".repeat(40));
    await expectRejected(f, "notes.mp4", 422, "not_media", /not a video/);
  });

  it("a zero-byte file, before any byte is sent", async () => {
    await expectRejected(Buffer.alloc(0), "empty.mp4", 422, "empty_file", /empty/);
  });

  it("a truncated MP4 whose moov box never arrived", async () => {
    const f = makeClip("cut.mp4", { frames: 60 }); // moov is written at the end without faststart
    truncateSync(f, Math.floor(statSync(f).size * 0.6));
    await expectRejected(f, "cut.mp4", 422, "truncated_file", /incomplete/);
  });

  it("an audio-only file", async () => {
    const f = path.join(mediaDir, "sound.m4a");
    ffmpeg("-f", "lavfi", "-i", "sine=frequency=440:duration=1", "-c:a", "aac", f);
    await expectRejected(f, "sound.m4a", 422, "audio_only", /only audio/);
  });

  it("a still image", async () => {
    const f = path.join(mediaDir, "still.png");
    ffmpeg("-f", "lavfi", "-i", "testsrc2=size=320x180", "-frames:v", "1", f);
    await expectRejected(f, "still.mp4", 422, "image_not_video", /image/);
  });

  it("a video whose frames cannot be decoded", async () => {
    // A valid index (moov first) over a payload of zeros: every NAL unit has size 0.
    const f = makeClip("zeros.mp4", { frames: 30, faststart: true });
    const b = readFileSync(f);
    for (let i = 0; i < b.length; ) {
      const size = b.readUInt32BE(i);
      if (b.toString("latin1", i + 4, i + 8) === "mdat") b.fill(0, i + 8, i + size);
      i += size;
    }
    writeFileSync(f, b);
    await expectRejected(f, "zeros.mp4", 422, "no_decodable_frames", /no frame that can be decoded/);
  });

  it("frames larger than the configured pixel limit", async () => {
    const f = makeClip("huge.mp4", { frames: 2, size: "4400x2200" }); // 9.7 MP > DCI 4K (4096 × 2160) default
    await expectRejected(f, "huge.mp4", 422, "pixel_size_over_limit", /4400 × 2200/);
  });

  it("a file over the size limit, refused from its declared length alone", async () => {
    const r = await fetch(`${w.srv.url}/api/uploads`, {
      method: "POST",
      headers: {
        "tus-resumable": "1.0.0", "upload-length": String(5 * 1024 ** 3), cookie: cookie(w.coach), origin: "http://127.0.0.1:3000",
        "upload-metadata": metaHeader(md("big.mp4")),
      },
    });
    expect(r.status).toBe(413);
    const body = JSON.parse(await r.text());
    expect(body.code).toBe("too_large");
    expect(body.detail).toMatch(/at most 4\.0 GB/);
    expect(tusLeftovers()).toEqual([]);
  });

  it("an upload started without Upload-Metadata, or with a garbled one: 400 saying so, nothing stored", async () => {
    const start = (metadata?: string) =>
      fetch(`${w.srv.url}/api/uploads`, {
        method: "POST",
        headers: { "tus-resumable": "1.0.0", "upload-length": "1000", cookie: cookie(w.coach), origin: "http://127.0.0.1:3000", ...(metadata ? { "upload-metadata": metadata } : {}) },
      });
    const missing = await start();
    expect(missing.status).toBe(400);
    const body = JSON.parse(await missing.text());
    expect(body.code).toBe("metadata_missing");
    expect(body.detail).toMatch(/teamId/);
    // A garbled header is refused by tus itself, before our checks, with its own message.
    const garbled = await start("teamId !!!");
    expect(garbled.status).toBe(400);
    expect(await garbled.text()).toMatch(/metadata/i);
    expect(tusLeftovers()).toEqual([]);
  });

  it("an upload that would take the club over its plan's storage, before any byte arrives; nothing stored is touched", async () => {
    const { db } = await import("../../server/db/client");
    const { club, clip } = await import("../../server/db/schema");
    const { clubOfTeam } = await import("../../server/entities/club/repository");
    const { PLANS } = await import("../../shared/billing/plans");
    const { eq } = await import("drizzle-orm");
    const c = (await clubOfTeam(w.world.teamId))!;
    await db().update(club).set({ plan: "pond" }).where(eq(club.id, c.id));
    // The U16 side shares the club's storage: its clip counts too.
    const [big] = await db().insert(clip).values({ teamId: w.world.secondTeamId, captureFps: 240, status: "ready", sizeBytes: PLANS.pond.storageBytes - 1000, title: "big" }).returning();
    try {
      const f = makeClip("quota.mp4", { frames: 30 });
      const r = await expectRejected(f, "quota.mp4", 413, "quota_exceeded", /over the Pond plan's storage: 4\.99 GB of 5\.0 GB are in use/);
      expect(r.url).toBeNull(); // refused at creation: no upload URL was ever handed out
      expect(r.body.plan).toBe("pond");
      const [still] = await db().select({ id: clip.id }).from(clip).where(eq(clip.id, big!.id));
      expect(still).toBeTruthy();
    } finally {
      await db().delete(clip).where(eq(clip.id, big!.id));
      await db().update(club).set({ plan: c.plan }).where(eq(club.id, c.id));
    }
  });

  it("clip details that do not validate", async () => {
    const f = makeClip("meta.mp4", { frames: 10 });
    const r = await tusUpload(w.srv.url, w.coach, f, { ...md("meta.mp4"), meta: JSON.stringify(clipMeta({ shotType: "chip" })) });
    expect(r.status).toBe(422);
    expect(r.body.errors.map((e: { path: string }) => e.path).sort()).toEqual(["playerId", "shotType"]);
    const coachAsPlayer = await tusUpload(w.srv.url, w.coach, f, md("meta.mp4", { playerId: w.world.users[EMAILS.coach] }));
    expect(coachAsPlayer.status).toBe(422);
    expect(coachAsPlayer.body.errors[0]).toMatchObject({ path: "playerId", message: "Pick a player of this team" });
    expect(tusLeftovers()).toEqual([]);
  });
});

describe("uploads only for those who may, and only their own", () => {
  const f = () => makeClip("who.mp4", { frames: 10 });
  it("signed out → 401, player → 403, another team → 404", async () => {
    expect((await tusUpload(w.srv.url, new Client(w.srv.url), f(), md("who.mp4"))).status).toBe(401);
    const player = await new Client(w.srv.url).signIn(EMAILS.player);
    const p = await tusUpload(w.srv.url, player, f(), md("who.mp4"));
    expect(p.status).toBe(403);
    expect(p.body.code).toBe("forbidden");
    const outsider = await new Client(w.srv.url).signIn(w.world.outsiderEmail);
    expect((await tusUpload(w.srv.url, outsider, f(), md("who.mp4"))).status).toBe(404);
    expect(tusLeftovers()).toEqual([]);
  });

  it("someone else's unfinished upload is not found", async () => {
    const create = await fetch(`${w.srv.url}/api/uploads`, {
      method: "POST",
      headers: { "tus-resumable": "1.0.0", "upload-length": "1000", cookie: cookie(w.coach), origin: "http://127.0.0.1:3000", "upload-metadata": metaHeader(md("mine.mp4")) },
    });
    expect(create.status).toBe(201);
    const url = w.srv.url + create.headers.get("location");
    const analyst = await new Client(w.srv.url).signIn(EMAILS.analyst);
    const head = await fetch(url, { method: "HEAD", headers: { "tus-resumable": "1.0.0", cookie: cookie(analyst) } });
    expect(head.status).toBe(404);
    const own = await fetch(url, { method: "HEAD", headers: { "tus-resumable": "1.0.0", cookie: cookie(w.coach) } });
    expect(own.status).toBe(200);
    expect(own.headers.get("upload-offset")).toBe("0");
    expect((await fetch(url, { headers: { cookie: cookie(w.coach) } })).status).toBe(405); // no downloads of uploads
    const del = await fetch(url, { method: "DELETE", headers: { "tus-resumable": "1.0.0", cookie: cookie(w.coach), origin: "http://127.0.0.1:3000" } });
    expect(del.status).toBe(204);
    expect(tusLeftovers()).toEqual([]);
  });
});

describe("awkward files that are fine", () => {
  it("a rotated phone clip: rotation applied once, frames in display orientation", async () => {
    const plain = makeClip("phone-raw.mp4", { frames: 20, size: "320x180" });
    const f = path.join(mediaDir, "phone.mp4");
    ffmpeg("-i", plain, "-c", "copy", "-metadata:s:v:0", "rotate=90", f); // writes a display matrix (ffprobe shows it)
    const c = await accepted(f, "phone.mp4");
    expect([90, 270]).toContain(c.rotationDeg);
    expect([c.width, c.height]).toEqual([180, 320]);
    const frame = path.join(uploadDir, "clips", c.id, "frames", "000001.jpg");
    const meta = await sharp(frame).metadata();
    expect([meta.width, meta.height]).toEqual([180, 320]);
    // Same pixels as ffmpeg's own auto-rotated decode of frame 1 (reference: ffmpeg CLI) — not turned twice.
    const ref = path.join(mediaDir, "phone-ref.png");
    ffmpeg("-i", f, "-frames:v", "1", ref);
    const [a, b] = await Promise.all([frame, ref].map((p) => sharp(p).greyscale().resize(45, 80).raw().toBuffer()));
    const meanDiff = a.reduce((s, v, i) => s + Math.abs(v - b[i]), 0) / a.length;
    expect(meanDiff).toBeLessThan(8);
  });

  it("a variable-frame-rate clip keeps each frame's real timestamp", async () => {
    const f = path.join(mediaDir, "vfr.mp4");
    // 30 frames 1/30 s apart, then 30 frames 1/120 s apart.
    ffmpeg("-f", "lavfi", "-i", "testsrc2=size=320x180:rate=120", "-frames:v", "60", "-vf", "setpts='if(lt(N,30),N*4,120+(N-30))'",
      "-fps_mode", "passthrough", "-c:v", "mpeg4", "-q:v", "5", "-pix_fmt", "yuv420p", "-video_track_timescale", "1200", f);
    const c = await accepted(f, "vfr.mp4");
    expect(c.variableFrameRate).toBe(true);
    expect(c.frameCount).toBe(60);
    // Reference: ffprobe's decoded frame times of the same file.
    const ref = execFileSync("ffprobe", ["-v", "error", "-select_streams", "v", "-show_entries", "frame=pts_time", "-of", "csv=p=0", f], { encoding: "utf8" })
      .trim().split("\n").map(Number);
    expect(c.frameTimes).toHaveLength(ref.length);
    c.frameTimes.forEach((t: number, i: number) => expect(t).toBeCloseTo(ref[i] - ref[0], 4));
    expect(c.frameTimes[1] - c.frameTimes[0]).toBeCloseTo(1 / 30, 3);
    expect(c.frameTimes[59] - c.frameTimes[58]).toBeCloseTo(1 / 120, 3);
  });

  it("a file name with path separators and control characters is only a label", async () => {
    const f = makeClip("named.mp4", { frames: 10, size: "160x90" });
    const r = await tusUpload(w.srv.url, w.coach, f, md("../../etc\\pass\u0007wd\u202e\n.mp4"));
    expect(r.ok, JSON.stringify(r.body)).toBe(true);
    expect(r.body.clip.originalName).toBe("passwd.mp4");
    expect(readdirSync(path.join(uploadDir, "clips", r.body.clip.id))).toContain("original");
    const stored = execFileSync("find", [uploadDir], { encoding: "utf8" });
    expect(stored).not.toMatch(/passwd|etc/);
    expect(readdirSync(path.dirname(uploadDir)).filter((n) => /passwd/.test(n))).toEqual([]);
  });

  it("a second upload of the same file is reported, naming the first", async () => {
    const f = makeClip("twice.mp4", { frames: 12, size: "160x90" });
    const first = await tusUpload(w.srv.url, w.coach, f, md("twice.mp4", { title: "Wrist shot, first take" }));
    expect(first.ok).toBe(true);
    const r = await expectRejected(f, "twice-again.mp4", 409, "duplicate_clip", /already in the team as "Wrist shot, first take"/);
    expect(r.body.existingClipId).toBe(first.body.clip.id);
  });
});

function metaHeader(m: Record<string, string>) {
  return Object.entries(m).map(([k, v]) => `${k} ${Buffer.from(v).toString("base64")}`).join(",");
}
