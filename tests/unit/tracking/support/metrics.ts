// Position errors of proposals against a clip's known trajectory.
import type { Proposal } from "../../../../shared/tracking/types";
import type { Point } from "./synthetic-clips";

export interface ErrorStats {
  count: number;
  mean: number;
  max: number;
  /** Mean over the last `tail` proposals: drift shows up here first. */
  tailMean: number;
}

export function errorStats(proposals: Proposal[], truth: (frame: number) => Point, tail = 50): ErrorStats {
  const errs = proposals.map((p) => {
    const q = truth(p.frame);
    return Math.hypot(p.x - q.x, p.y - q.y);
  });
  const mean = (v: number[]) => (v.length ? v.reduce((a, b) => a + b, 0) / v.length : NaN);
  return { count: errs.length, mean: mean(errs), max: errs.length ? Math.max(...errs) : NaN, tailMean: mean(errs.slice(-tail)) };
}

/** What every whole-clip run must show: all frames proposed, under 1 px on average, no drift. */
export function expectAccurateThroughout(stop: { reason: string }, stats: ErrorStats, frames: number, expect: (v: unknown) => any) {
  expect(stop.reason).toBe("end-of-range");
  expect(stats.count).toBe(frames - 1);
  expect(stats.mean).toBeLessThan(1);
  // No drift: the last 50 frames are as good as the whole run, and no frame strays.
  expect(stats.tailMean).toBeLessThan(1);
  expect(stats.max).toBeLessThan(2);
}
