import { useCallback, useEffect, useRef, useState } from "react";
import type { FrameClock } from "@shared/frame-clock";
import { defaultFraction, fractionChoices } from "./speed";

// Playback in time, not in frames: the position advances by wall time × the speed fraction and the
// page shows the frame its clock puts at that moment (shared/frame-clock.ts), so a clip with dropped
// frames or a variable rate plays at an even pace, and two clips play together (decision 136).

export interface PlaybackTarget {
  /** Capture time now, seconds, on the target's own clock. */
  now(): number;
  /** Show the frame at this capture time; false once the time is beyond either end (playback stops). */
  seek(tS: number): boolean;
}

/** Play forward or back at a fraction of real time; the default speed follows the capture rate until the person picks one. */
export function usePlayback(target: PlaybackTarget, captureFps: number) {
  const [dir, setDir] = useState<0 | 1 | -1>(0);
  const [picked, setPicked] = useState<{ fps: number; fraction: number } | null>(null);
  const fraction = picked && picked.fps === captureFps ? picked.fraction : defaultFraction(captureFps);
  const raf = useRef(0);
  const targetRef = useRef(target);
  targetRef.current = target;

  useEffect(() => {
    if (!dir) return;
    let last = performance.now();
    let pos = targetRef.current.now();
    const tick = (now: number) => {
      // A frame's timestamp can precede the performance.now() taken when play began.
      pos += (dir * Math.max(0, now - last) * fraction) / 1000;
      last = Math.max(last, now);
      if (!targetRef.current.seek(pos)) return setDir(0);
      raf.current = requestAnimationFrame(tick);
    };
    raf.current = requestAnimationFrame(tick);
    return () => cancelAnimationFrame(raf.current);
  }, [dir, fraction]);

  const setFraction = useCallback((f: number) => setPicked({ fps: captureFps, fraction: f }), [captureFps]);
  const toggle = useCallback((d: 1 | -1) => setDir((cur) => (cur === d ? 0 : d)), []);
  const stop = useCallback(() => setDir(0), []);
  const change = (step: 1 | -1) => {
    const choices = fractionChoices(captureFps);
    const i = choices.findIndex((x) => x >= fraction - 1e-12);
    setFraction(choices[Math.min(choices.length - 1, Math.max(0, (i < 0 ? choices.length - 1 : i) + step))]);
  };
  return { dir, fraction, choices: fractionChoices(captureFps), setFraction, toggle, stop, slower: () => change(-1), faster: () => change(1) };
}
export type Playback = ReturnType<typeof usePlayback>;

/**
 * A target that steps frames on a clock: it shows the frame nearest each time, stops past either
 * end, and stops when the frame on screen is not the one it last showed (the person stepped).
 */
export function frameTarget(clock: FrameClock, get: () => { frame: number; first: number; last: number }, goto: (f: number) => void): PlaybackTarget {
  let shown: number | null = null;
  return {
    now: () => {
      shown = get().frame;
      return clock.t(shown);
    },
    seek: (tS) => {
      const { frame, first, last } = get();
      if (shown !== null && frame !== shown) return false;
      shown = clock.frameAt(tS, first, last);
      goto(shown);
      return tS >= clock.t(first) && tS <= clock.t(last);
    },
  };
}
