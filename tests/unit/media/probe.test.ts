// probe() on real files made in the test: each unusable upload gets its stable code and a
// message a coach can act on; usable clips are described as displayed.
import { copyFile, readFile, writeFile } from "node:fs/promises";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { MediaInputError, type MediaInputCode } from "../../../server/media/errors";
import { probe } from "../../../server/media/probe";
import { blankMdat, ffmpeg, makeClip, makeRotatedClip, makeVfrClip, tempDir, testMedia } from "./helpers";

const media = testMedia();
let dir: string;
let cleanup: () => Promise<void>;
let clip: string; // 30 frames, 320x240, 30 fps, moov at the end (ffmpeg's default)

beforeAll(async () => {
  ({ dir, cleanup } = await tempDir("probe"));
  clip = await makeClip(dir, "clip.mp4", { frames: 30 });
});
afterAll(() => cleanup());

async function rejection(file: string, opts = {}): Promise<MediaInputError> {
  const err = await probe(media, file, opts).then(
    () => undefined,
    (e) => e,
  );
  expect(err).toBeInstanceOf(MediaInputError);
  return err as MediaInputError;
}

async function expectCode(file: string, code: MediaInputCode, message: RegExp, opts = {}) {
  const err = await rejection(file, opts);
  expect(err.code).toBe(code);
  expect(err.message).toMatch(message);
  expect(err.retryable).toBe(false);
}

describe("probe rejects", () => {
  it("a text file renamed .mp4", async () => {
    const f = path.join(dir, "notes.mp4");
    await writeFile(f, "Session notes: wrist shots from the slot, 12 reps.\n".repeat(40));
    await expectCode(f, "not_media", /not a video/);
  });

  it("a zero-byte file", async () => {
    const f = path.join(dir, "empty.mp4");
    await writeFile(f, "");
    await expectCode(f, "empty_file", /empty \(0 bytes\)/);
  });

  it("a truncated MP4 whose moov box never arrived", async () => {
    const f = path.join(dir, "cut.mp4");
    const bytes = await readFile(clip);
    await writeFile(f, bytes.subarray(0, Math.floor(bytes.length / 2)));
    await expectCode(f, "truncated_file", /incomplete.*moov/);
  });

  it("a truncated MP4 with its index first (faststart): the index promises more than the file holds", async () => {
    const fast = await makeClip(dir, "fast.mp4", { frames: 90, extra: ["-movflags", "+faststart"] });
    const bytes = await readFile(fast);
    const f = path.join(dir, "fast-cut.mp4");
    await writeFile(f, bytes.subarray(0, Math.floor(bytes.length * 0.6)));
    await expectCode(f, "truncated_file", /incomplete: it ends before the end of its video data/);
    await expect(probe(media, fast)).resolves.toMatchObject({ frameCount: 90 });
  });

  it("audio only", async () => {
    const f = path.join(dir, "tone.m4a");
    await ffmpeg(["-f", "lavfi", "-i", "sine=frequency=440:duration=1", "-c:a", "aac", f]);
    await expectCode(f, "audio_only", /only audio \(aac\)/);
  });

  it("audio with cover art (the picture is not a video)", async () => {
    const cover = path.join(dir, "cover.png");
    const f = path.join(dir, "tone-cover.mp3");
    await ffmpeg(["-f", "lavfi", "-i", "testsrc2=size=64x64", "-frames:v", "1", cover]);
    await ffmpeg([
      "-f", "lavfi", "-i", "sine=duration=1", "-i", cover, "-map", "0:a", "-map", "1:v",
      "-c:a", "libmp3lame", "-c:v", "png", "-disposition:v", "attached_pic", f,
    ]);
    await expectCode(f, "audio_only", /only audio/);
  });

  it("a still image, also when named .mp4", async () => {
    const png = path.join(dir, "still.png");
    const jpg = path.join(dir, "still.jpg");
    await ffmpeg(["-f", "lavfi", "-i", "testsrc2=size=320x240", "-frames:v", "1", png]);
    await ffmpeg(["-f", "lavfi", "-i", "testsrc2=size=320x240", "-frames:v", "1", jpg]);
    await expectCode(png, "image_not_video", /an image \(png\), not a video/);
    await expectCode(jpg, "image_not_video", /an image \(mjpeg\), not a video/);
    const disguised = path.join(dir, "still-as.mp4");
    await copyFile(png, disguised);
    await expectCode(disguised, "image_not_video", /not a video/);
  });

  it("a video whose frames cannot be decoded (payload zeroed, headers intact)", async () => {
    const f = await blankMdat(clip, path.join(dir, "blank.mp4"));
    await expectCode(f, "no_decodable_frames", /no frame that can be decoded/);
  });

  it("a file with a container but no stream at all", async () => {
    const f = path.join(dir, "nothing.mp4");
    await ffmpeg(["-f", "lavfi", "-i", "testsrc2", "-frames:v", "0", f]);
    await expectCode(f, "no_video_stream", /no video stream/);
  });

  it("frames beyond the configured pixel limit", async () => {
    const err = await rejection(clip, { maxPixels: 320 * 240 - 1 });
    expect(err.code).toBe("pixel_size_over_limit");
    expect(err.message).toMatch(/320 × 240 pixels/);
    expect(err.details).toMatchObject({ width: 320, height: 240 });
    await expect(probe(media, clip, { maxPixels: 320 * 240 })).resolves.toMatchObject({ width: 320 });
  });
});

describe("probe describes", () => {
  it("a plain clip, and keeps the raw ffprobe JSON", async () => {
    const p = await probe(media, clip);
    expect(p).toMatchObject({
      codec: "h264", width: 320, height: 240, storedFps: 30, frameCount: 30,
      rotationDeg: 0, variableFrameRate: false, hasAudio: false, pixelFormat: "yuv420p",
    });
    expect(p.durationS).toBeCloseTo(1, 2);
    expect(p.raw.streams?.[0]?.codec_name).toBe("h264");
    expect(JSON.stringify(p.raw)).not.toContain(dir); // no server paths in what the clip keeps
  });

  it("a rotated phone clip with its displayed size", async () => {
    const turns: number[] = [];
    for (const tag of [90, 270]) {
      const p = await probe(media, await makeRotatedClip(dir, `rot${tag}.mp4`, tag));
      turns.push(p.rotationDeg);
      expect({ w: p.width, h: p.height, sw: p.storedWidth, sh: p.storedHeight }).toEqual({ w: 240, h: 320, sw: 320, sh: 240 });
    }
    // Opposite quarter turns; which way each goes is checked on the pixels in extract.test.ts.
    expect(turns.sort()).toEqual([270, 90].sort());
  });

  it("a variable-frame-rate clip", async () => {
    const p = await probe(media, await makeVfrClip(dir, "vfr.mp4"));
    expect(p.variableFrameRate).toBe(true);
    expect(p.frameCount).toBe(90);
  });

  it("a clip with audio, and counts frames when the container has no count (Matroska)", async () => {
    const f = path.join(dir, "with-audio.mkv");
    await ffmpeg([
      "-f", "lavfi", "-i", "testsrc2=size=160x120:rate=25", "-f", "lavfi", "-i", "sine=duration=2",
      "-frames:v", "50", "-c:v", "libx264", "-preset", "ultrafast", "-c:a", "libopus", "-shortest", f,
    ]);
    const p = await probe(media, f);
    expect(p.hasAudio).toBe(true);
    expect(p.frameCount).toBe(50);
    expect(p.storedFps).toBe(25);
  });
});
