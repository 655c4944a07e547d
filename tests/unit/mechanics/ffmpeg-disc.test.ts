// Test 1 of issue 5: a clip made by ffmpeg (lavfi) of a bright disc moving a known number of
// pixels per frame. Source: synthetic clip whose motion is known by construction; the system ffmpeg
// encodes and decodes it. The file is stored as slow motion (30 fps playback of a 240 fps capture),
// so the speed is right only with the capture rate (REFERENCES.md, camera facts [P, generic]).
import { execFileSync } from "node:child_process";
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { computeShot, PUCK_DIAMETER_MM, type Mark } from "../../../shared/mechanics/index";

const W = 320;
const H = 96;
const CAPTURE_FPS = 240;
const PLAYBACK_FPS = 30;
const PX_PER_FRAME = 5.5;
const RADIUS_PX = 10;
const FRAMES = 36;
const START_X = 30;

const dir = mkdtempSync(path.join(tmpdir(), "mechanics-disc-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function makeClip(): string {
  const file = path.join(dir, "disc.mp4");
  const disc = `geq=lum='if(lt(hypot(X-(${START_X}+${PX_PER_FRAME}*N)\\,Y-${H / 2})\\,${RADIUS_PX})\\,235\\,16)'`;
  execFileSync("ffmpeg", [
    "-nostdin", "-v", "error",
    "-f", "lavfi", "-i", `color=c=black:s=${W}x${H}:r=${CAPTURE_FPS}:d=${FRAMES / CAPTURE_FPS},format=gray,${disc},setpts=N/(${PLAYBACK_FPS}*TB)`,
    "-r", String(PLAYBACK_FPS), "-c:v", "libx264", "-crf", "10", "-pix_fmt", "yuv420p", "-y", file,
  ]);
  return file;
}

function decodeGray(file: string): Buffer {
  return execFileSync("ffmpeg", ["-nostdin", "-v", "error", "-i", file, "-f", "rawvideo", "-pix_fmt", "gray", "pipe:1"], { maxBuffer: 64 << 20 });
}

/** Centroid of the pixels brighter than halfway between background and disc. */
function centroid(frame: Buffer): [number, number] {
  let sx = 0;
  let sy = 0;
  let n = 0;
  for (let y = 0; y < H; y++)
    for (let x = 0; x < W; x++)
      if (frame[y * W + x] > 125) {
        sx += x;
        sy += y;
        n++;
      }
  return [sx / n, sy / n];
}

describe("ffmpeg-generated clip of a moving disc", () => {
  it("puck exit speed within 0.5 % of the known motion, using the capture rate", () => {
    const raw = decodeGray(makeClip());
    const frameBytes = W * H;
    expect(raw.length).toBe(frameBytes * FRAMES);
    const puck: Mark[] = [];
    for (let f = 0; f < FRAMES; f++) puck.push([f, ...centroid(raw.subarray(f * frameBytes, (f + 1) * frameBytes))]);

    // The disc's diameter stands for a puck's 76.2 mm (IIHF Rule 13.1 [P]).
    const doc = {
      captureFps: CAPTURE_FPS,
      calibration: { type: "scaleBar" as const, a: [0, 0] as [number, number], b: [2 * RADIUS_PX, 0] as [number, number], lengthMm: PUCK_DIAMETER_MM },
      tracks: { puck },
      events: { puckStrike: 2, release: 4 },
      frameCount: FRAMES,
    };
    const truth = (PX_PER_FRAME * (PUCK_DIAMETER_MM / (2 * RADIUS_PX)) * CAPTURE_FPS) / 1000;
    const r = computeShot(doc);
    expect(Math.abs(r.puckExitSpeed.valueMps - truth) / truth).toBeLessThan(0.005);
    expect(r.puckExitSpeed.marksUsed).toBe(10);
    // The playback rate would read 8× too slow — and the engine flags such a low rate.
    const slow = computeShot({ ...doc, captureFps: PLAYBACK_FPS });
    expect(slow.puckExitSpeed.valueMps).toBeCloseTo(r.puckExitSpeed.valueMps / 8, 6);
    expect(slow.notes.map((n) => n.code)).toContain("CAPTURE_RATE_LOW");
  });
});
