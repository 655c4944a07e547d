// Stepping two clips together, synced at puck strike and matched in time, not in frame count: one
// step is one frame of the faster clip; the slower clip shows its nearest frame at that moment
// (docs/decisions/091-*). Times come from each clip's own frame clock (decision 135), so a clip
// with dropped frames shows the frame taken at that moment, not the one at its index. Pure, so it
// is unit-tested without a browser.
import { frameClock, type FrameTimes } from "@shared/frame-clock";

export interface ClipClock {
  /** The camera's capture rate, frames per second. */
  fps: number;
  /** The clip's own frame times over the shot (ShotReadout.frameTimes); absent or null: frame ÷ rate. */
  times?: FrameTimes | null;
  /** Frame of puck strike: time zero. */
  strike: number;
  /** First and last frame of the shot. */
  first: number;
  last: number;
}

export interface SyncPlan {
  /** One step, ms: a frame of the faster clip. */
  stepMs: number;
  fastFps: number;
  /** Step indices covering both shots; step 0 is puck strike. */
  kMin: number;
  kMax: number;
}

export interface FrameAtStep {
  frame: number;
  /** The frame's own time from its puck strike, ms. */
  tMs: number;
  /** Where the step falls outside this shot's frames (the nearest end frame is shown). */
  outside: "before" | "after" | null;
}

const clockOf = (c: ClipClock) => frameClock(c.times, c.fps);
const msOf = (c: ClipClock, frame: number) => clockOf(c).ms(frame, c.strike);

export function syncPlan(a: ClipClock, b: ClipClock): SyncPlan {
  const fastFps = Math.max(a.fps, b.fps);
  const stepMs = 1000 / fastFps;
  const lo = Math.min(msOf(a, a.first), msOf(b, b.first));
  const hi = Math.max(msOf(a, a.last), msOf(b, b.last));
  // The small tolerance keeps a frame time that is an exact step from rounding outward.
  return { stepMs, fastFps, kMin: Math.floor(lo / stepMs + 1e-9), kMax: Math.ceil(hi / stepMs - 1e-9) };
}

/** Common time of a step, ms from puck strike. */
export const stepTimeMs = (p: SyncPlan, k: number) => (k * 1000) / p.fastFps;

/** The frame a clip shows at step k: the nearest one in time, held at the shot's first or last frame beyond it. */
export function frameAtStep(c: ClipClock, p: SyncPlan, k: number): FrameAtStep {
  const clock = clockOf(c);
  // An even clip in whole-number arithmetic (k·fps / fastFps), so equal rates give exactly one frame per step.
  const raw = c.times ? clock.frameAt(clock.t(c.strike) + k / p.fastFps, -Infinity, Infinity) : c.strike + Math.round((k * c.fps) / p.fastFps);
  const frame = Math.min(c.last, Math.max(c.first, raw));
  return { frame, tMs: clock.ms(frame, c.strike), outside: raw < c.first ? "before" : raw > c.last ? "after" : null };
}

/** The step nearest a time (ms from puck strike), inside the plan. */
export function stepNearest(p: SyncPlan, tMs: number): number {
  return Math.min(p.kMax, Math.max(p.kMin, Math.round(tMs / p.stepMs)));
}
