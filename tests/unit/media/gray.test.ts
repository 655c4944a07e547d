// Raw grey frames through the one ffmpeg wrapper: the same bytes as the plain ffmpeg command,
// numbered as extraction numbers them (a range keeps the clip's frame numbers), the decoder held
// back by a slow consumer without losing a frame, and clear failures. Source of truth: ffmpeg
// itself (`ffmpeg -i clip -f rawvideo -pix_fmt gray -`) on lavfi-generated clips.
import { execa } from "execa";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { buildGraySpec, decodeGrayFrames, FfmpegError } from "../../../server/media";
import { makeClip, makeRotatedClip, tempDir, testMedia } from "./helpers";

let dir: string;
let cleanup: () => Promise<void>;
let clip: string;
beforeAll(async () => {
  ({ dir, cleanup } = await tempDir("gray"));
  clip = await makeClip(dir, "gray.mp4", { frames: 40, size: "160x90" });
});
afterAll(() => cleanup());

async function plainFfmpeg(file: string): Promise<Buffer> {
  const { stdout } = await execa("ffmpeg", ["-nostdin", "-v", "error", "-i", file, "-fps_mode", "passthrough", "-f", "rawvideo", "-pix_fmt", "gray", "-"], { encoding: "buffer" });
  return Buffer.from(stdout);
}

describe("buildGraySpec", () => {
  it("maps the video stream, trims to the range (0-based, end exclusive) and writes raw grey to the pipe", () => {
    expect(buildGraySpec({ input: "/clips/a.mp4", videoStreamIndex: 1, first: 5, last: 9 }).outputs[0]).toEqual({
      path: "pipe:1",
      options: ["-map", "0:1", "-vf", "trim=start_frame=4:end_frame=9", "-fps_mode", "passthrough", "-f", "rawvideo", "-pix_fmt", "gray"],
    });
  });
});

describe("decodeGrayFrames", () => {
  it("gives every frame of a range with its clip frame number, byte for byte what ffmpeg gives", async () => {
    const all = await plainFfmpeg(clip);
    const size = 160 * 90;
    const got = new Map<number, Uint8Array>();
    const n = await decodeGrayFrames(testMedia(), { input: clip, videoStreamIndex: 0, first: 11, last: 30, width: 160, height: 90, onFrame: (f, d) => void got.set(f, d) });
    expect(n).toBe(20);
    expect([...got.keys()]).toEqual(Array.from({ length: 20 }, (_, i) => 11 + i));
    for (const [f, d] of got) expect(Buffer.from(d).equals(all.subarray((f - 1) * size, f * size)), `frame ${f}`).toBe(true);
  });

  it("holds the decoder back while the consumer is busy, and loses nothing", async () => {
    const seen: number[] = [];
    await decodeGrayFrames(testMedia(), {
      input: clip, videoStreamIndex: 0, first: 1, last: 40, width: 160, height: 90,
      onFrame: async (f) => {
        seen.push(f);
        await new Promise((r) => setTimeout(r, 5));
      },
    });
    expect(seen).toEqual(Array.from({ length: 40 }, (_, i) => i + 1));
  });

  it("frames of a rotated clip come out turned, at the displayed size", async () => {
    const rotated = await makeRotatedClip(dir, "rot.mp4", 90, 6);
    const probe = await execa("ffprobe", ["-v", "error", "-select_streams", "v:0", "-show_entries", "stream=width,height", "-of", "csv=p=0", rotated]);
    const [w, h] = probe.stdout.trim().split(",").map(Number);
    let count = 0;
    await decodeGrayFrames(testMedia(), { input: rotated, videoStreamIndex: 0, first: 1, last: 6, width: h, height: w, onFrame: () => void count++ });
    expect(count).toBe(6);
  });

  it("a wrong frame size ends with a message naming the size, a cancel as aborted", async () => {
    await expect(decodeGrayFrames(testMedia(), { input: clip, videoStreamIndex: 0, first: 1, last: 3, width: 150, height: 90, onFrame: () => {} })).rejects.toThrow(/150×90/);
    const abort = new AbortController();
    const run = decodeGrayFrames(testMedia(), { input: clip, videoStreamIndex: 0, first: 1, last: 40, width: 160, height: 90, signal: abort.signal, onFrame: (f) => void (f === 3 && abort.abort()) });
    await expect(run).rejects.toMatchObject({ kind: "aborted" });
    await expect(run).rejects.toBeInstanceOf(FfmpegError);
  });
});
