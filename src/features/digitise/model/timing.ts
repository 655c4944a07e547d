import { clockTimeBase, type TimingIrregularity } from "@shared/mechanics/time-base";
import type { FrameClock } from "@shared/frame-clock";
import type { ShotDetail } from "@shared/schemas/shots";

// Times on the clip's own frame clock in capture time (shared/frame-clock.ts, decision 135), never
// the stored (playback) rate nor frame index ÷ rate: across a dropped stretch the index is early.

/** Ms from the clip's first frame: the shot's start on the clip's clock plus the time from there. */
export const msSinceFirst = (frame: number, s: { clock: FrameClock; startMs: number; frameStart: number }) => s.startMs + s.clock.ms(frame, s.frameStart);
/** Ms from frame `from` to `frame`. */
export const msSince = (frame: number, from: number, clock: FrameClock) => clock.ms(frame, from);

/** "+12.500 ms" with a sign, digits enough to tell neighbouring frames apart. */
export function formatMs(ms: number, captureFps: number): string {
  const step = 1000 / captureFps;
  const digits = step >= 10 ? 1 : step >= 1 ? 2 : step >= 0.1 ? 3 : 4;
  const sign = ms > 0 ? "+" : ms < 0 ? "−" : "±";
  return `${sign}${Math.abs(ms).toFixed(digits)} ms`;
}

/**
 * Gaps and repeated frames in the shot's own frame clock (the same rule the engine's notes use),
 * for marks on the frame strip; none when the shot has no clock of its own.
 */
export function shotIrregularities(frameTimes: ShotDetail["frameTimes"], captureFps: number): TimingIrregularity[] {
  if (!frameTimes || frameTimes.seconds.length < 2) return [];
  const first = frameTimes.firstFrame;
  const last = first + frameTimes.seconds.length - 1;
  try {
    return clockTimeBase(frameTimes, captureFps, [first, last]).irregularities(first, last);
  } catch {
    return [];
  }
}
