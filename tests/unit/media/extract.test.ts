// extractFrames() with the real ffmpeg on clips generated here: every frame once, real
// timestamps, rotation applied exactly once, frames announced as they land, typed failures.
import { existsSync } from "node:fs";
import { readdir, readFile } from "node:fs/promises";
import path from "node:path";
import sharp from "sharp";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { FfmpegError } from "../../../server/media/errors";
import { extractFrames, type ExtractProgress } from "../../../server/media/extract";
import { probe, type ProbeResult } from "../../../server/media/probe";
import { blankMdat, makeClip, makeRotatedClip, makeVfrClip, standIn, tempDir, testMedia } from "./helpers";

const media = testMedia();
let dir: string;
let cleanup: () => Promise<void>;
beforeAll(async () => ({ dir, cleanup } = await tempDir("extract")));
afterAll(() => cleanup());

const out = (name: string) => path.join(dir, "out", name);
// A complete JPEG ends with the EOI marker FF D9 (ITU-T T.81, B.1.1.3).
const isCompleteJpeg = (b: Buffer) => b[0] === 0xff && b[1] === 0xd8 && b.at(-2) === 0xff && b.at(-1) === 0xd9;

async function rgbAt(file: string, x: number, y: number) {
  const { data, info } = await sharp(file).raw().toBuffer({ resolveWithObject: true });
  const i = (y * info.width + x) * info.channels;
  return { rgb: [data[i], data[i + 1], data[i + 2]], width: info.width, height: info.height };
}

describe("a 480-frame high-rate clip", () => {
  let input: string;
  let p: ProbeResult;
  beforeAll(async () => {
    input = await makeClip(dir, "hfr.mp4", { frames: 480, size: "640x360", rate: 240 });
    p = await probe(media, input);
  });

  it("yields exactly 480 frames, each announced once in order when complete, with real increasing timestamps, and a strip", async () => {
    const ready: number[] = [];
    const incomplete: number[] = [];
    let announcedBeforeEnd = false;
    const progress: ExtractProgress[] = [];
    const outDir = out("hfr");
    const r = await extractFrames(media, {
      input, probe: p, outDir,
      onFrameReady: async (index, file) => {
        ready.push(index);
        if (!isCompleteJpeg(await readFile(file))) incomplete.push(index);
        if (!existsSync(path.join(outDir, "frames", "000480.jpg"))) announcedBeforeEnd = true;
      },
      onProgress: (x) => progress.push(x),
    });

    expect(r.frameCount).toBe(480);
    expect((await readdir(r.framesDir)).sort()).toEqual(Array.from({ length: 480 }, (_, i) => `${String(i + 1).padStart(6, "0")}.jpg`));
    expect(ready).toEqual(Array.from({ length: 480 }, (_, i) => i + 1));
    expect(incomplete).toEqual([]);
    expect(announcedBeforeEnd).toBe(true);
    expect(r.firstFrameMs).not.toBeNull();

    // 240 fps: frame i at i/240 s (generated that way; 1/240 s is 64 ticks of the 1/15360 time base).
    expect(r.timestampSource).toBe("packets");
    r.frameTimes.forEach((t, i) => expect(t).toBeCloseTo(i / 240, 5));

    const done = progress.map((x) => x.framesDone);
    expect(done).toEqual([...done].sort((a, b) => a - b));
    expect(progress.at(-1)).toEqual({ framesDone: 480, totalFrames: 480, percent: 100 });
    expect(progress.slice(0, -1).every((x) => x.percent < 100)).toBe(true);

    // The strip: 20 evenly picked thumbnails, 90 px high (640x360 → 160x90).
    const meta = await sharp(r.stripPath!).metadata();
    expect({ w: meta.width, h: meta.height, f: meta.format }).toEqual({ w: 20 * 160, h: 90, f: "jpeg" });
  });

  it("a second run into the same folder overwrites by index instead of adding frames", async () => {
    const small = await makeClip(dir, "again.mp4", { frames: 24 });
    const opts = { input: small, probe: await probe(media, small), outDir: out("again"), strip: false as const };
    await extractFrames(media, opts);
    const r = await extractFrames(media, opts);
    expect(r.frameCount).toBe(24);
    expect(await readdir(r.framesDir)).toHaveLength(24);
  });

  it("can be cancelled mid-way", async () => {
    const ac = new AbortController();
    const err = await extractFrames(media, {
      input, probe: p, outDir: out("cancel"), signal: ac.signal,
      onFrameReady: (i) => { if (i === 5) ac.abort(); },
    }).catch((e) => e);
    expect(err).toBeInstanceOf(FfmpegError);
    expect(err.kind).toBe("aborted");
  });
});

describe("rotation", () => {
  // The clip's red square starts top-left. A clockwise quarter turn takes it top-right, a
  // counter-clockwise one bottom-left. Turning twice would put it bottom-right.
  it.each([90, 270])("rotate tag %i: frames come out turned once, as the probe says, in the displayed size", async (tag) => {
    const input = await makeRotatedClip(dir, `rot${tag}.mp4`, tag);
    const p = await probe(media, input);
    const r = await extractFrames(media, { input, probe: p, outDir: out(`rot${tag}`) });
    const frame = path.join(r.framesDir, "000001.jpg");
    const corners = {
      tl: await rgbAt(frame, 10, 10), tr: await rgbAt(frame, 229, 10),
      bl: await rgbAt(frame, 10, 309), br: await rgbAt(frame, 229, 309),
    };
    expect({ w: corners.tl.width, h: corners.tl.height }).toEqual({ w: p.width, h: p.height });
    expect({ w: p.width, h: p.height }).toEqual({ w: 240, h: 320 });
    const redCorner = p.rotationDeg === 90 ? "tr" : "bl";
    for (const [name, c] of Object.entries(corners)) {
      const [red, , blue] = c.rgb;
      if (name === redCorner) expect(red).toBeGreaterThan(200);
      else expect(blue).toBeGreaterThan(200);
    }
    const strip = await sharp(r.stripPath!).metadata();
    expect(strip.height).toBe(90);
    expect(strip.width).toBe(10 * 68); // 10 frames, each 240x320 scaled to 90 px high (even width)
  });

  it("keeps full-range colour: pure blue stays pure blue (BT.601 levels mapped to JPEG's full range)", async () => {
    const input = await makeRotatedClip(dir, "colour.mp4", 0, 3);
    const r = await extractFrames(media, { input, probe: await probe(media, input), outDir: out("colour"), strip: false });
    const { rgb } = await rgbAt(path.join(r.framesDir, "000001.jpg"), 200, 150);
    // Limited-range samples shown as full range would give about (16, 16, 240) [CP].
    expect(rgb[0]).toBeLessThan(8);
    expect(rgb[1]).toBeLessThan(8);
    expect(rgb[2]).toBeGreaterThan(247);
  });
});

describe("variable frame rate", () => {
  it("keeps each frame's real timestamp through a 30 → 120 fps ramp", async () => {
    const input = await makeVfrClip(dir, "vfr.mp4");
    const p = await probe(media, input);
    const r = await extractFrames(media, { input, probe: p, outDir: out("vfr") });
    expect(r.frameCount).toBe(90);
    // As generated: frames 0-29 at n/30 s, then 1 + (n-30)/120 s; the 1/1200 s time base holds both exactly.
    const expected = Array.from({ length: 90 }, (_, n) => (n < 30 ? n / 30 : 1 + (n - 30) / 120));
    r.frameTimes.forEach((t, i) => expect(t).toBeCloseTo(expected[i], 5));
  });
});

describe("formats and failures", () => {
  it("writes WebP when asked", async () => {
    const input = await makeClip(dir, "small.mp4", { frames: 12 });
    const r = await extractFrames(media, { input, probe: await probe(media, input), outDir: out("webp"), format: "webp" });
    expect(r.frameCount).toBe(12);
    expect((await sharp(path.join(r.framesDir, "000012.webp")).metadata()).format).toBe("webp");
  });

  it("a stream ffmpeg cannot decode is a deterministic failure, not retried", async () => {
    const input = await makeClip(dir, "to-blank.mp4", { frames: 30 });
    const blank = await blankMdat(input, path.join(dir, "blank.mp4"));
    const fakeProbe = { frameCount: 30, videoStreamIndex: 0, pixelFormat: "yuv420p", colorRange: null, timeBase: "1/15360" };
    const err = await extractFrames(media, { input: blank, probe: fakeProbe, outDir: out("blank") }).catch((e) => e);
    expect(err).toBeInstanceOf(FfmpegError);
    expect(err.kind).toBe("invalid_data");
    expect(err.retryable).toBe(false);
  });

  it("a hanging ffmpeg is killed by the time limit and reported as a retryable timeout", async () => {
    const sleeper = await standIn(dir, "ffmpeg-sleeps.sh", "sleep 30");
    const input = await makeClip(dir, "tiny.mp4", { frames: 5 });
    const err = await extractFrames(testMedia({ ffmpegPath: sleeper, killGraceMs: 200 }), {
      input, probe: await probe(media, input), outDir: out("hang"), timeoutMs: 500,
    }).catch((e) => e);
    expect(err).toBeInstanceOf(FfmpegError);
    expect(err.kind).toBe("timeout");
    expect(err.retryable).toBe(true);
  });
});
