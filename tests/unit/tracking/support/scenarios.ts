// The clips of the tracking tests and benchmark. The motion is the same in seconds at every
// capture rate, so a higher rate only means less motion per frame.
import { ballistic, barClip, circular, discClip, occluder, type ClipSpec } from "./synthetic-clips";

/** ffmpeg noise strength used by the tests: temporal noise of about 11 gray levels RMS on a 140-level disc. */
export const NOISE = 20;

/** A disc crossing the frame diagonally at constant speed (135 px/s). */
export const lineClip = (fps: number, frames = 500, noise = NOISE) =>
  discClip(`line-${fps}`, ballistic(40, 50, 115, 70), { fps, frames, noise });

/** A disc going round a circle of 80 px at 4.5 rad/s (360 px/s). */
export const arcClip = (fps: number, frames = 500, noise = NOISE) =>
  discClip(`arc-${fps}`, circular(160, 120, 80, 4.5), { fps, frames, noise });

/** A bar 80 px long turning about one end at 3 rad/s; the truth is the point 12 px short of the free end. */
export const shaftClip = (fps: number, frames = 500, noise = NOISE) =>
  barClip(`shaft-${fps}`, { fps, frames, noise, pivot: { x: 160, y: 120 }, length: 80, thickness: 8, angle0: 0.3, omega: 3, trackAt: 68 });

/** The line's disc growing from 6 to 13 px radius over 500 frames at 240 fps, as if coming closer. */
export const growingClip = (fps = 240, frames = 500, noise = NOISE) =>
  discClip(`growing-${fps}`, ballistic(60, 60, 100, 60), { fps, frames, noise, radius: 6, growth: 3.36 });

export const HIDDEN_FROM = 150;
export const HIDDEN_TO = 159;

/** The line clip with the disc hidden behind a dark box on frames 150 … 159 (ten frames). */
export function occludedClip(fps = 240, frames = 260, noise = NOISE): ClipSpec {
  const path = ballistic(40, 50, 115, 70);
  const o = { fps, frames, noise };
  return discClip(`hidden-${fps}`, path, o, occluder(o, path.at((HIDDEN_FROM + HIDDEN_TO) / 2 / fps), 40, HIDDEN_FROM, HIDDEN_TO));
}

/** The line clip with a dark box over the disc's right edge (about a quarter of it) on frames 150 … 159. */
export function grazedClip(fps = 240, frames = 260, noise = NOISE): ClipSpec {
  const path = ballistic(40, 50, 115, 70);
  const o = { fps, frames, noise };
  const at = path.at((HIDDEN_FROM + HIDDEN_TO) / 2 / fps);
  return discClip(`grazed-${fps}`, path, o, occluder(o, { x: at.x + 26, y: at.y }, 40, HIDDEN_FROM, HIDDEN_TO));
}

/** A fast disc (6 px per frame at 240 fps, curving down) that leaves through the right edge near frame 43. */
export const leavingClip = (fps = 240, frames = 80, noise = NOISE) =>
  discClip(`leaving-${fps}`, ballistic(60, 100, 6 * 240, 240, 0, 0.04 * 240 * 240), { fps, frames, noise });
