import { useCallback, useEffect, useRef, useState } from "react";
import type { DigitiseStore } from "../model/store";
import { PLAYBACK_FRACTIONS, playbackAdvance } from "../model/timing";

/** Play forward or back at a fraction of real time, stopping at the shot's ends. */
export function usePlayback(store: DigitiseStore) {
  const [dir, setDir] = useState<0 | 1 | -1>(0);
  const [fraction, setFraction] = useState<number>(1 / 100);
  const raf = useRef(0);

  useEffect(() => {
    if (!dir) return;
    let last = performance.now();
    let carry = 0;
    const tick = (now: number) => {
      const st = store.getState();
      const r = playbackAdvance(carry, now - last, st.captureFps, fraction);
      carry = r.carry;
      last = now;
      if (r.frames > 0) {
        const next = st.frame + dir * r.frames;
        store.goto(next);
        if (next >= st.frameEnd || next <= st.frameStart) {
          setDir(0);
          return;
        }
      }
      raf.current = requestAnimationFrame(tick);
    };
    raf.current = requestAnimationFrame(tick);
    return () => cancelAnimationFrame(raf.current);
  }, [dir, fraction, store]);

  const toggle = useCallback((d: 1 | -1) => setDir((cur) => (cur === d ? 0 : d)), []);
  const stop = useCallback(() => setDir(0), []);
  const change = useCallback((step: 1 | -1) => {
    setFraction((f) => {
      const i = PLAYBACK_FRACTIONS.findIndex((x) => Math.abs(x - f) < 1e-12);
      return PLAYBACK_FRACTIONS[Math.min(PLAYBACK_FRACTIONS.length - 1, Math.max(0, i + step))];
    });
  }, []);
  return { dir, fraction, setFraction, toggle, stop, slower: () => change(-1), faster: () => change(1) };
}
export type Playback = ReturnType<typeof usePlayback>;
