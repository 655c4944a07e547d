// Sub-pixel refinement against a smooth pattern with a known sub-pixel shift.
// Source: the analytic pattern's own formula, sampled at pixel centres.
import seedrandom from "seedrandom";
import { expect, it } from "vitest";
import { refinePlacement } from "../../../shared/tracking/refine";
import type { GrayFrame } from "../../../shared/tracking/types";
import { refinePlain } from "./support/refine-plain";

const pattern = (x: number, y: number) => 128 + 50 * Math.sin(x / 4.3) * Math.cos(y / 5.1) + 30 * Math.sin((x + y) / 7.7);
const sample = (w: number, h: number, ox: number, oy: number): GrayFrame => ({
  width: w,
  height: h,
  data: Uint8Array.from({ length: w * h }, (_, i) => Math.round(pattern(ox + (i % w) + 0.5, oy + Math.floor(i / w) + 0.5))),
});

it.each([
  [20.37, 15.79],
  [21.5, 14.02],
  [19.86, 16.44],
])("finds a template cut at (%f, %f) from a start 1 px off", (tx, ty) => {
  const frame = sample(80, 60, 0, 0);
  const template = sample(24, 24, tx, ty);
  const r = refinePlacement(frame, template, Math.round(tx) + 0.6, Math.round(ty) - 0.5);
  expect(r).not.toBeNull();
  expect(Math.abs(r!.x - tx)).toBeLessThan(0.03);
  expect(Math.abs(r!.y - ty)).toBeLessThan(0.03);
});

it("gives up on a flat template", () => {
  const flat: GrayFrame = { width: 16, height: 16, data: new Uint8Array(256).fill(90) };
  expect(refinePlacement(sample(60, 60, 0, 0), flat, 10, 10)).toBeNull();
});

// Working memory kept between calls (decision 157) must not move a single result: every
// refinement equals the plain form's to the bit, over templates of changing sizes (the memory
// grows and is then reused by smaller ones, whose stale tail must not count), with and without
// masks, starting near and far from the true placement. Source: the plain form itself
// (support/refine-plain.ts, the code as it was).
it("gives the same result to the bit as the plain form, call after call", () => {
  const rng = seedrandom("refine identity");
  const frame = sample(160, 120, 3.3, -2.1);
  let compared = 0;
  let refined = 0;
  for (let k = 0; k < 300; k++) {
    const size = [12, 48, 24, 64, 9, 33][k % 6];
    const tx = 5 + rng() * (150 - size), ty = 5 + rng() * (110 - size);
    const template = sample(size, size, 3.3 + tx, -2.1 + ty);
    // A noisy template now and then, so the steps do not all converge at once.
    if (k % 3 === 0) for (let i = 0; i < template.data.length; i++) template.data[i] = Math.max(0, Math.min(255, template.data[i] + Math.round((rng() - 0.5) * 40)));
    const mask = k % 2 ? { width: size, height: size, data: Uint8Array.from({ length: size * size }, () => (rng() < 0.7 ? 255 : 0)) } : null;
    const ox = tx + (rng() - 0.5) * 3, oy = ty + (rng() - 0.5) * 3;
    const got = refinePlacement(frame, template, ox, oy, mask);
    const want = refinePlain(frame, template, ox, oy, mask);
    expect(got).toEqual(want);
    if (got) expect([Object.is(got.x, want!.x), Object.is(got.y, want!.y)]).toEqual([true, true]);
    compared++;
    if (got) refined++;
  }
  expect(compared).toBe(300);
  expect(refined).toBeGreaterThan(200);
});
