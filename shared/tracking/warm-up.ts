// A tracking process's first shot paid for loading OpenCV's WebAssembly (compiled on V8's helper
// threads) and for running the tracker's code before V8 had optimised it, in all about 0.7 CPU-s
// more than any later shot (decisions 156, 157). A worker does that once when it starts instead:
// OpenCV loaded and a small made-up shot tracked, so the tracker's paths (the turning search, the
// puck's mask, sub-pixel refinement) have run before a job waits on them.
import type { Landmark } from "../schemas/shot-document";
import type { Vec2 } from "./regions";
import { trackShot } from "./shot-tracker";
import type { FrameSource, GrayFrame } from "./types";

const W = 320;
const H = 200;
const FRAMES = 24;

/** Smooth texture with a dark disc (a puck) on it; frame n is the picture moved n px right. */
function scene(): (n: number) => GrayFrame {
  const texture = (x: number, y: number) => 128 + 50 * Math.sin(x * 0.31 + Math.cos(y * 0.17) * 2) * Math.cos(y * 0.23 + Math.sin(x * 0.11));
  return (n) => {
    const data = new Uint8Array(W * H);
    for (let y = 0; y < H; y++)
      for (let x = 0; x < W; x++) {
        const sx = x - n;
        const puck = (sx - 160) ** 2 / 225 + (y - 150) ** 2 / 25 <= 1;
        data[y * W + x] = puck ? 20 : Math.round(texture(sx, y));
      }
    return { width: W, height: H, data };
  };
}

/** Seeds spread over the picture, the puck on its disc. */
const SEEDS: Record<Landmark, Vec2> = {
  puck: [160, 150],
  bladeHeel: [120, 130],
  bladeToe: [200, 128],
  bottomHand: [110, 80],
  topHand: [100, 45],
  buttEnd: [96, 30],
};

/** Loads OpenCV and tracks a small made-up shot (every landmark over every frame when all is well); never throws. */
export async function warmUpTracker(): Promise<{ seconds: number; landmarkFrames: number; error?: string }> {
  const t0 = performance.now();
  const frameAt = scene();
  const frames: FrameSource = { length: FRAMES + 1, frame: async (n) => frameAt(n) };
  try {
    const r = await trackShot({ frames, first: 1, last: FRAMES, seedFrame: FRAMES / 2, seeds: SEEDS });
    const landmarkFrames = Object.values(r.tracks).reduce((n, t) => n + t!.proposals.length, 0);
    return { seconds: (performance.now() - t0) / 1000, landmarkFrames };
  } catch (err) {
    return { seconds: (performance.now() - t0) / 1000, landmarkFrames: 0, error: (err as Error).message };
  }
}
