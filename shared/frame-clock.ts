// Time of a frame and frame at a time, on a clip's own frame clock (decisions 130, 131, 135).
// Every page that shows or uses a time (the readout chart, side by side, Digitise, playback) asks
// this one clock, so a clip with dropped frames or a phone's variable rate reads the same
// everywhere. Where the clip's times do not reach (or the clip has none: an even clock) a frame is
// one nominal interval, 1 ÷ capture rate, from its neighbour.

/** Capture times of frames firstFrame, firstFrame + 1, …, seconds (any origin, never decreasing). */
export interface FrameTimes {
  firstFrame: number;
  seconds: readonly number[];
}

export interface FrameClock {
  /** The capture rate: one nominal interval is 1 ÷ fps. */
  fps: number;
  /** True when the times are the clip's own, false when frame ÷ rate. */
  fromClock: boolean;
  /** Capture time of a frame, seconds on the clock's own origin (only differences count). */
  t(frame: number): number;
  /** Milliseconds from frame `from` to frame `frame` (negative when `frame` is earlier). */
  ms(frame: number, from: number): number;
  /** The frame nearest a time (seconds on the clock's origin) within first..last; ties go to the later frame. */
  frameAt(tS: number, first: number, last: number): number;
}

/** The clock of a clip's frames: its own times where it has them, else frame ÷ capture rate. */
export function frameClock(times: FrameTimes | null | undefined, captureFps: number): FrameClock {
  const seconds = times && times.seconds.length > 0 ? times.seconds : null;
  const first = times?.firstFrame ?? 1;
  const last = first + (seconds?.length ?? 1) - 1;
  const nominal = 1 / captureFps;
  const t = (f: number): number => {
    if (!seconds) return (f - 1) * nominal;
    if (f < first) return seconds[0] - (first - f) * nominal;
    if (f > last) return seconds[seconds.length - 1] + (f - last) * nominal;
    return seconds[f - first];
  };
  const frameAt = (tS: number, lo: number, hi: number): number => {
    const clamp = (f: number) => Math.min(hi, Math.max(lo, f));
    // Ties go to the later frame, as Math.round does; the 1e-9 keeps a float just under a tie from rounding down.
    const near = (from: number, fromS: number) => clamp(from + Math.round((tS - fromS) * captureFps + 1e-9));
    if (!seconds) return near(1, 0);
    if (tS <= seconds[0]) return near(first, seconds[0]);
    if (tS >= seconds[seconds.length - 1]) return near(last, seconds[seconds.length - 1]);
    // Binary search for the last frame at or before tS, then the nearer of it and the next.
    let a = 0;
    let b = seconds.length - 1;
    while (b - a > 1) {
      const m = (a + b) >> 1;
      if (seconds[m] <= tS) a = m;
      else b = m;
    }
    const nearest = tS - seconds[a] < seconds[b] - tS ? a : b;
    return clamp(first + nearest);
  };
  // Without times, whole frame counts over the rate: exact where the rate divides 1,000.
  const ms = seconds ? (frame: number, from: number) => (t(frame) - t(from)) * 1000 : (frame: number, from: number) => ((frame - from) * 1000) / captureFps;
  return { fps: captureFps, fromClock: !!seconds, t, ms, frameAt };
}
