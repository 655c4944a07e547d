// Sub-pixel refinement against a smooth pattern with a known sub-pixel shift.
// Source: the analytic pattern's own formula, sampled at pixel centres.
import { expect, it } from "vitest";
import { refinePlacement } from "../../../shared/tracking/refine";
import type { GrayFrame } from "../../../shared/tracking/types";

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
