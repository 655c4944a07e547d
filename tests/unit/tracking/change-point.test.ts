// Two-phase regression on series whose change is known by construction [calc]: a kink from rest,
// a fall that stops, and how sure the fit says it is.
import seedrandom from "seedrandom";
import { describe, expect, it } from "vitest";
import { changeConfidence, findChange } from "../../../shared/tracking/change-point";

const rng = seedrandom("change-point");
const gauss = () => Math.sqrt(-2 * Math.log(rng() || 1e-12)) * Math.cos(2 * Math.PI * rng());

describe("findChange", () => {
  it("finds where a still point starts to move (constant, then a parabola), to a quarter frame", () => {
    const frames = Array.from({ length: 60 }, (_, i) => i + 1);
    const at = 37.5;
    const values = frames.map((f) => [f <= at ? 100 : 100 + 2.8 * (f - at) + 0.05 * (f - at) ** 2]);
    const fit = findChange({ frames, values }, { before: 0, after: 2, from: 30, to: 45, window: [10, 50] })!;
    expect(fit.at).toBeCloseTo(at, 6);
    expect(changeConfidence(fit)).toBeGreaterThan(0.99);
    expect(fit.slopeAfter[0]).toBeCloseTo(2.8, 6);
  });

  it("finds where a fall stops (a parabola, then constant) through noise, and is less sure when the kink is faint", () => {
    const frames = Array.from({ length: 80 }, (_, i) => i + 1);
    const at = 40;
    const series = (slope: number, noise: number) => frames.map((f) => [(f < at ? 300 - slope * (at - f) - 0.01 * (at - f) ** 2 : 300) + noise * gauss()]);
    const sharp = findChange({ frames, values: series(0.8, 0.1) }, { before: 2, after: 0, from: 30, to: 50, window: [16, 64] })!;
    expect(Math.abs(sharp.at - at)).toBeLessThanOrEqual(0.5);
    expect(changeConfidence(sharp)).toBeGreaterThan(0.95);
    const faint = findChange({ frames, values: series(0.02, 0.3) }, { before: 2, after: 0, from: 30, to: 50, window: [16, 64] })!;
    expect(changeConfidence(faint)).toBeLessThan(changeConfidence(sharp));
  });

  it("gives null when the window holds too few points for the two pieces", () => {
    expect(findChange({ frames: [1, 2, 3], values: [[0], [0], [1]] }, { before: 2, after: 2, from: 1, to: 3, window: [1, 3] })).toBeNull();
  });
});
