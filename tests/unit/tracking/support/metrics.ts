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
