// Reads frames a few steps ahead so decoding the next frame overlaps matching this one.
import type { FrameSource, GrayFrame } from "./types";

export function createPrefetcher(frames: FrameSource, order: (k: number) => number, count: number, depth: number, signal?: AbortSignal) {
  const pending = new Map<number, Promise<GrayFrame>>();
  const request = (k: number) => {
    if (k > count || pending.has(k)) return;
    const p = Promise.resolve().then(() => frames.frame(order(k), signal));
    p.catch(() => {}); // surfaced when awaited; a frame never awaited must not reject unhandled
    pending.set(k, p);
  };
  return {
    /** The k-th frame of the run (1-based), asking for the next `depth` frames as well. */
    get(k: number): Promise<GrayFrame> {
      for (let j = k; j <= k + depth; j++) request(j);
      const p = pending.get(k)!;
      pending.delete(k);
      return p;
    },
  };
}
