// Generated slap shots for the shot tracker's tests and bench: the demo's scene renderer
// (scripts/demo/shot-scene.ts) with a camera's faults — motion blur over a quarter of the frame
// interval, focus blur, sensor noise, H.264 at a phone's quality — and a printed puck spinning at
// 40 revolutions a second from puck strike. Decoded to grey by the server's own ffmpeg wrapper, as
// the tracking job decodes. Renders are cached in the OS temp folder (the first run renders).
import { defaultMedia, renderClip, type RenderLook } from "../../../../scripts/demo/render-scene";
import type { SceneOptions, SceneTruth } from "../../../../scripts/demo/shot-scene";
import { decodeGrayFrames } from "../../../../server/media/gray";
import { probe } from "../../../../server/media/probe";
import type { FrameSource, GrayFrame } from "../../../../shared/tracking/types";

/**
 * Enough renders across the exposure that the blur is a smear, not separate copies: about one per
 * 1.5 px of the fastest motion (the puck, ~55 px a frame at 240 fps, ~13 at 1,000, ~4 at 3,200).
 */
export const TRACK_LOOKS: Record<240 | 1000 | 3200, RenderLook> = {
  240: { exposure: 0.25, subframes: 10, blurSigma: 0.7, noise: 6, crf: 20 },
  1000: { exposure: 0.25, subframes: 3, blurSigma: 0.7, noise: 6, crf: 20 },
  3200: { exposure: 0.25, subframes: 2, blurSigma: 0.7, noise: 6, crf: 20 },
};

/** One shot per capture rate: from before ice strike to the puck leaving the picture. The blade meets the ice at 1.5 m/s. */
export const TRACK_SHOTS: Record<240 | 1000 | 3200, SceneOptions> = {
  240: { captureFps: 240, frames: 44, iceStrikeFrame: 12, bladeDropMps: 1.5, puckSpinRps: 40, caption: "LF test camera" },
  1000: { captureFps: 1000, frames: 120, iceStrikeFrame: 20, bladeDropMps: 1.5, puckSpinRps: 40, caption: "LF test camera" },
  3200: { captureFps: 3200, frames: 280, iceStrikeFrame: 30, bladeDropMps: 1.5, puckSpinRps: 40, caption: "LF test camera" },
};

export interface ShotClip {
  mp4: string;
  truth: SceneTruth;
  /** frames[n] is clip frame n (the first is 1). */
  frames: GrayFrame[];
  source: FrameSource;
}

const cache = new Map<string, Promise<ShotClip>>();

export function shotClip(scene: SceneOptions, look: RenderLook = TRACK_LOOKS[scene.captureFps as 240] ?? TRACK_LOOKS[1000]): Promise<ShotClip> {
  const key = JSON.stringify([scene, look]);
  if (!cache.has(key)) cache.set(key, load(scene, look));
  return cache.get(key)!;
}

async function load(scene: SceneOptions, look: RenderLook): Promise<ShotClip> {
  const r = await renderClip([scene], { look });
  const truth = r.scenes[0];
  const frames: GrayFrame[] = [];
  // The clip's pixel format, as the job reads it from the clip's probe: the same decode path.
  const { pixelFormat, colorRange } = await probe(defaultMedia(), r.mp4);
  await decodeGrayFrames(defaultMedia(), {
    input: r.mp4, videoStreamIndex: 0, pixelFormat, colorRange, first: 1, last: r.frameCount, width: truth.width, height: truth.height,
    onFrame: (f, data) => void (frames[f] = { width: truth.width, height: truth.height, data }),
  });
  return { mp4: r.mp4, truth, frames, source: { length: frames.length, frame: async (i) => frames[i] } };
}

/** The truth of every landmark on one frame, as seeds. */
export function seedsAt(truth: SceneTruth, frame: number) {
  const seeds: Record<string, [number, number]> = {};
  for (const [k, t] of Object.entries(truth.tracks)) {
    const m = t.find((q) => q[0] === frame);
    if (m) seeds[k] = [m[1], m[2]];
  }
  return seeds;
}
