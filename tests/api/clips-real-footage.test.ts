// Issue 15: the files phones and lab cameras produce, each made here with ffmpeg to imitate them,
// through the real upload path (tus → probe → extraction): frame count = decoded count, the
// frame clock (coarse container clocks snapped, real gaps kept), the capture rate, warnings.
import { ffmpeg, makeClip, mediaDir, tusUpload, uploadDir } from "./clips-support";
import { execFileSync } from "node:child_process";
import { readdirSync, readFileSync, writeFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { clipUpload, teamPath, uploadReady, useCoachWorld } from "./coach-world";

const w = useCoachWorld();

const team = () => teamPath(w);
const md = (filename: string, over: Record<string, unknown> = {}) => clipUpload(w, filename, over);

/** Upload and wait for the clip to be ready (or failed, which throws with its reason). */
const ready = (file: string, over: Record<string, unknown> = {}) => uploadReady(w, file, path.basename(file), over);

/** Frames ffmpeg itself decodes from the file (the reference count). */
const decodedCount = (file: string) =>
  Number(execFileSync("ffprobe", ["-v", "error", "-select_streams", "v:0", "-count_frames", "-show_entries", "stream=nb_read_frames", "-of", "csv=p=0", file]).toString().trim());
const storedFrames = (clipId: string) => readdirSync(path.join(uploadDir, "clips", clipId, "frames")).length;


describe("frame clocks of real containers", () => {
  it("240 fps in a QuickTime file with a 600 time scale: snapped to 1/240 s, rate believed", async () => {
    const f = path.join(mediaDir, "phone-240.mov");
    ffmpeg("-f", "lavfi", "-i", "testsrc2=size=320x180:rate=240", "-frames:v", "240", "-c:v", "libx264", "-preset", "ultrafast", "-video_track_timescale", "600", f);
    const c = await ready(f);
    expect(c.frameCount).toBe(decodedCount(f));
    expect(storedFrames(c.id)).toBe(c.frameCount);
    expect(c.storedFps).toBe(240);
    expect(c.captureFps).toBe(240);
    expect(c.captureFpsConfirmed).toBe(true);
    expect(c.timing).toMatchObject({ clock: "snapped", gapCount: 0, repeatCount: 0, missingTail: null });
    c.frameTimes.forEach((t: number, i: number) => expect(t).toBeCloseTo(i / 240, 6));
  });

  it("Matroska at 1,200 fps (millisecond clock): every frame, the real rate, no retries", async () => {
    const f = path.join(mediaDir, "lab-1200.mkv");
    ffmpeg("-f", "lavfi", "-i", "testsrc2=size=320x180:rate=1200", "-frames:v", "600", "-c:v", "libx264", "-preset", "ultrafast", f);
    const t0 = Date.now();
    const c = await ready(f);
    expect(Date.now() - t0).toBeLessThan(30_000);
    expect(c.frameCount).toBe(600);
    expect(storedFrames(c.id)).toBe(600);
    expect(c.storedFps).toBe(1200);
    expect(c.captureFps).toBe(1200);
    expect(c.timing.repeatCount).toBe(0);
    expect(c.frameTimes[599]).toBeCloseTo(599 / 1200, 6);
  });

  it("WebM (VP9) at 2,000 fps", async () => {
    const f = path.join(mediaDir, "lab-2000.webm");
    ffmpeg("-f", "lavfi", "-i", "testsrc2=size=160x120:rate=2000", "-frames:v", "400", "-c:v", "libvpx-vp9", "-deadline", "realtime", "-cpu-used", "8", f);
    const c = await ready(f);
    expect(c.frameCount).toBe(decodedCount(f));
    expect(c.storedFps).toBe(2000);
  });

  it("Motion-JPEG in Matroska is video, not an image", async () => {
    const f = path.join(mediaDir, "lab-mjpeg.mkv");
    ffmpeg("-f", "lavfi", "-i", "testsrc2=size=320x180:rate=500", "-frames:v", "100", "-c:v", "mjpeg", "-q:v", "5", f);
    const c = await ready(f);
    expect(c.codec).toBe("mjpeg");
    expect(c.frameCount).toBe(100);
  });

  it("dropped frames stay gaps, named by frame; the stored rate is the grid's, not the average", async () => {
    const f = path.join(mediaDir, "dropped-240.mp4");
    ffmpeg("-f", "lavfi", "-i", "testsrc2=size=320x180:rate=240:duration=1", "-vf", "select='not(between(n,100,102))'", "-fps_mode", "passthrough", "-c:v", "libx264", "-preset", "ultrafast", f);
    const c = await ready(f);
    expect(c.frameCount).toBe(237);
    expect(c.storedFps).toBe(240);
    expect(c.timing.gaps).toEqual([{ after: 100, missing: 3 }]);
    expect(c.frameTimes[100] - c.frameTimes[99]).toBeCloseTo(4 / 240, 6);
  });

  it("a phone's capture-rate tag pre-fills the capture rate of a 30 fps file, still to be confirmed", async () => {
    const f = makeClip("android-slowmo.mp4", { frames: 30, extra: ["-movflags", "use_metadata_tags", "-metadata", "com.android.capture.fps=240.000000"] });
    const c = await ready(f);
    expect(c.storedFps).toBe(30);
    expect(c.captureFps).toBe(240);
    expect(c.captureFpsConfirmed).toBe(false);
    expect(c.needsCaptureRateConfirmation).toBe(true);
  });

  it("a Matroska file cut short is kept, with the missing frames named", async () => {
    const whole = path.join(mediaDir, "whole.mkv");
    ffmpeg("-f", "lavfi", "-i", "testsrc2=size=320x180:rate=30", "-frames:v", "120", "-c:v", "libx264", "-preset", "ultrafast", "-g", "10", whole);
    const cut = path.join(mediaDir, "cut.mkv");
    const bytes = readFileSync(whole);
    writeFileSync(cut, bytes.subarray(0, Math.floor(bytes.length * 0.4)));
    const c = await ready(cut);
    expect(c.frameCount).toBe(decodedCount(cut));
    expect(c.frameCount).toBeLessThan(120);
    expect(c.timing.missingTail).toEqual({ from: c.frameCount + 1, to: 120 });
    expect(storedFrames(c.id)).toBe(c.frameCount);
  });
});

describe("where a clip was filmed", () => {
  it("location tags are gone from the served original, which keeps its frames, rotation and capture-rate facts; the same upload is still a duplicate", async () => {
    const plain = makeClip("geo-plain.mp4", { frames: 20 });
    const f = path.join(mediaDir, "geo.mp4");
    ffmpeg(
      "-i", plain, "-c", "copy", "-metadata:s:v:0", "rotate=90", "-movflags", "use_metadata_tags",
      "-metadata", "location=+49.2827-123.1207/", "-metadata", "location-eng=+49.2827-123.1207/", "-metadata", "com.android.capture.fps=240", f,
    );
    expect(readFileSync(f).includes("+49.2827-123.1207")).toBe(true);
    const c = await ready(f);
    const served = await w.coach.get(`${team()}/clips/${c.id}/original`);
    expect(served.status).toBe(200);
    expect(served.text.length).toBeGreaterThan(1000);
    expect(served.text.includes("+49.2827")).toBe(false);
    expect(readFileSync(path.join(uploadDir, "clips", c.id, "original")).includes("+49.2827")).toBe(false);
    // The display matrix survives: ffprobe reads it as 90° counter-clockwise, 270° clockwise as stored here.
    expect(c.rotationDeg).toBe(270);
    expect([c.width, c.height]).toEqual([180, 320]);
    expect(c.frameCount).toBe(20);
    expect(c.captureFps).toBe(240);
    const again = await tusUpload(w.srv.url, w.coach, f, md("geo-again.mp4"));
    expect(again.body.code).toBe("duplicate_clip");
  });
});
