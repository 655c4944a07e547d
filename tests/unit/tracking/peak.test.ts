// Peak finding on score maps. Sources: a sampled quadratic surface, whose least-squares quadratic
// fit is the surface itself, so its maximum is known exactly; Gaussian bumps of known heights.
import { describe, expect, it } from "vitest";
import { findPeak } from "../../../shared/tracking/peak";
import type { ScoreMap } from "../../../shared/tracking/matcher";

const map = (w: number, h: number, f: (x: number, y: number) => number): ScoreMap => ({
  width: w,
  height: h,
  data: Float32Array.from({ length: w * h }, (_, i) => f(i % w, Math.floor(i / w))),
});

describe("findPeak", () => {
  it("finds the maximum of a tilted quadratic bowl to sub-pixel precision", () => {
    // 0.9 − a·dx² − b·dx·dy − c·dy², maximum at (5.3, 4.6); the cross term tilts the ellipse.
    const q = map(11, 9, (x, y) => 0.9 - 0.02 * (x - 5.3) ** 2 - 0.012 * (x - 5.3) * (y - 4.6) - 0.03 * (y - 4.6) ** 2);
    const p = findPeak(q, 2);
    expect(p.x).toBeCloseTo(5.3, 3);
    expect(p.y).toBeCloseTo(4.6, 3);
    expect(p.onBorder).toBe(false);
  });

  it("reports the highest rival peak outside the exclusion radius", () => {
    const bump = (x: number, y: number, cx: number, cy: number, h: number) => h * Math.exp(-((x - cx) ** 2 + (y - cy) ** 2) / 4);
    const twin = map(30, 20, (x, y) => Math.max(bump(x, y, 6, 8, 0.9), bump(x, y, 20, 10, 0.7)));
    expect(findPeak(twin, 4).sideLobe).toBeCloseTo(0.7, 5);
    expect(findPeak(twin, 20).sideLobe).toBeNull();
  });

  it("flags a maximum on the edge of the map and skips non-numbers", () => {
    const ramp = map(8, 8, (x, y) => (x === 3 && y === 3 ? Number.NaN : x / 10 + y / 100));
    const p = findPeak(ramp, 2);
    expect([p.x, p.y, p.onBorder]).toEqual([7, 7, true]);
    expect(p.score).toBeCloseTo(0.77, 5);
  });
});
