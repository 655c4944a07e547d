import type { ShotDocument } from "../schemas/shot-document";
import { MechanicsInputError } from "./errors";

// When each frame was captured. A clip's own frame clock (its presentation times scaled to
// capture time, docs/decisions/130-frame-clock.md) when the document carries it; else frame ÷
// capture rate. Every time the engine uses (fits, derivatives, load and contact time, series)
// comes from here, so dropped frames and damaged stretches cost no accuracy.

/** A step this many nominal intervals or more is a gap (frames missing); this few or less, a repeat. */
export const GAP_STEP_RATIO = 1.5;
export const REPEAT_STEP_RATIO = 0.5;

export interface TimingIrregularity {
  kind: "gap" | "repeat";
  /** The step runs from frame `from` to frame `from + 1`. */
  from: number;
  stepMs: number;
  /** Step ÷ nominal interval, e.g. 4 for three frames missing. */
  intervals: number;
}

export interface TimeBase {
  /** Capture time of a frame, seconds (any origin; only differences count). */
  t(frame: number): number;
  /** Seconds from frame a to frame b. */
  between(a: number, b: number): number;
  /** One frame interval at the capture rate, seconds. */
  nominalS: number;
  /** True when the times are the clip's own, false when frame ÷ rate. */
  fromClock: boolean;
  /** Uneven steps between frames a and b (inclusive), in frame order. */
  irregularities(a: number, b: number): TimingIrregularity[];
}

/** Frame ÷ capture rate: every step one nominal interval. */
export function rateTimeBase(captureFps: number): TimeBase {
  return { t: (f) => f / captureFps, between: (a, b) => (b - a) / captureFps, nominalS: 1 / captureFps, fromClock: false, irregularities: () => [] };
}

/**
 * The document's own times. Checks they cover the frames in `needed` and never run backwards;
 * two frames at the same time are allowed (a repeated frame) but not both marked in one track
 * (validate-shot checks that).
 */
export function clockTimeBase(frameTimes: NonNullable<ShotDocument["frameTimes"]>, captureFps: number, needed: [number, number]): TimeBase {
  const { firstFrame, seconds } = frameTimes;
  const last = firstFrame + seconds.length - 1;
  if (needed[0] < firstFrame || needed[1] > last)
    throw new MechanicsInputError(
      ["frameTimes"],
      `the frame times cover frames ${firstFrame}–${last} but the marks and events use frames ${needed[0]}–${needed[1]}`,
    );
  for (let i = 1; i < seconds.length; i++)
    if (!(seconds[i] >= seconds[i - 1]))
      throw new MechanicsInputError(["frameTimes", "seconds", i], `frame ${firstFrame + i} comes before frame ${firstFrame + i - 1} in time`);
  const nominalS = 1 / captureFps;
  const t = (f: number) => {
    const i = f - firstFrame;
    if (i < 0 || i >= seconds.length) throw new MechanicsInputError(["frameTimes"], `frame ${f} has no time`);
    return seconds[i];
  };
  return {
    t,
    between: (a, b) => t(b) - t(a),
    nominalS,
    fromClock: true,
    irregularities(a, b) {
      const out: TimingIrregularity[] = [];
      for (let f = Math.max(a, firstFrame); f < Math.min(b, last); f++) {
        const step = seconds[f + 1 - firstFrame] - seconds[f - firstFrame];
        const intervals = step / nominalS;
        if (intervals >= GAP_STEP_RATIO || intervals <= REPEAT_STEP_RATIO)
          out.push({ kind: intervals >= GAP_STEP_RATIO ? "gap" : "repeat", from: f, stepMs: step * 1000, intervals });
      }
      return out;
    },
  };
}

/** "a gap after frame 183 (3 frames missing)", "a repeated frame at 200" — for notes. */
export function describeIrregularity(g: TimingIrregularity): string {
  if (g.kind === "repeat") return `frame ${g.from + 1} repeats frame ${g.from} (${g.stepMs.toFixed(2)} ms apart)`;
  const missing = Math.round(g.intervals) - 1;
  return `a gap of ${g.stepMs.toFixed(2)} ms between frames ${g.from} and ${g.from + 1} (${missing >= 1 ? `about ${missing} frame${missing > 1 ? "s" : ""} missing` : "a long frame interval"})`;
}

/** Seconds of each of the given frames. */
export function timesOf(tb: TimeBase, frames: ArrayLike<number>): Float64Array {
  const out = new Float64Array(frames.length);
  for (let i = 0; i < frames.length; i++) out[i] = tb.t(frames[i]);
  return out;
}

/** Seconds from frame f to frame f + 1, or one nominal interval where the clock has no time for them. */
export function frameStepS(tb: TimeBase, f: number): number {
  try {
    const s = tb.between(f, f + 1);
    return s > 0 ? s : tb.nominalS;
  } catch {
    return tb.nominalS;
  }
}
