// Masks from shapes [calc]: which template pixels belong to an object, and the masked match
// against the TM_CCOEFF_NORMED formula over the kept pixels only (OpenCV's documentation).
import seedrandom from "seedrandom";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createCvMatcher, type Matcher } from "../../../shared/tracking/matcher";
import { loadOpenCv } from "../../../shared/tracking/opencv";
import { contains, coverage, rasterMask } from "../../../shared/tracking/regions";
import { bladeBand } from "../../../shared/tracking/shot-tracker";
import type { GrayFrame } from "../../../shared/tracking/types";

describe("regions", () => {
  it("a box, a ring and a convex polygon in either turning order", () => {
    const ring = { kind: "box" as const, cx: 10, cy: 10, halfW: 6, halfH: 3, inner: { halfW: 4, halfH: 1 } };
    expect(contains(ring, 10, 10)).toBe(false);
    expect(contains(ring, 15, 10)).toBe(true);
    expect(contains(ring, 10, 12.5)).toBe(true);
    expect(contains(ring, 17, 10)).toBe(false);
    expect(contains(ring, 17, 10, 1.5)).toBe(true);
    const square: [number, number][] = [[0, 0], [10, 0], [10, 10], [0, 10]];
    for (const pts of [square, [...square].reverse()]) {
      const poly = { kind: "polygon" as const, points: pts };
      expect(contains(poly, 5, 5)).toBe(true);
      expect(contains(poly, 11, 5)).toBe(false);
      expect(contains(poly, 11, 5, 1.5)).toBe(true);
    }
  });

  it("the blade's band lies above the heel–toe line, whichever way the blade points", () => {
    for (const [heel, toe] of [[[100, 200], [200, 200]], [[200, 200], [100, 200]]] as [[number, number], [number, number]][]) {
      const band = bladeBand(heel, toe, 20, 3, 5);
      expect(contains(band, 150, 190)).toBe(true);
      expect(contains(band, 150, 210)).toBe(false);
      expect(contains(band, 150, 202)).toBe(true);
      expect(contains(band, 97, 195)).toBe(true);
    }
  });

  it("rasterMask keeps included pixels and drops excluded ones grown by the margin", () => {
    const m = rasterMask(10, 4, 0, 0, [{ kind: "box", cx: 5, cy: 2, halfW: 5, halfH: 2 }], [{ kind: "box", cx: 9, cy: 2, halfW: 1, halfH: 2 }], 1);
    expect(Array.from(m.data.slice(0, 10)).map((v) => (v ? 1 : 0))).toEqual([1, 1, 1, 1, 1, 1, 1, 0, 0, 0]);
    expect(coverage(m)).toBeCloseTo(0.7, 9);
  });
  it("rasterMask gives, pixel for pixel, what contains says (polygons in either order, boxes, rings, margins)", () => {
    const rng = seedrandom("raster-vs-contains");
    const around = (cx: number, cy: number, r: number, k: number, dir: 1 | -1): [number, number][] =>
      Array.from({ length: k }, (_, i) => [cx + r * Math.cos((dir * 2 * Math.PI * i) / k), cy + r * Math.sin((dir * 2 * Math.PI * i) / k)] as [number, number]);
    for (let trial = 0; trial < 40; trial++) {
      const polygon = { kind: "polygon" as const, points: around(20 * rng(), 20 * rng(), 4 + 12 * rng(), 3 + Math.floor(4 * rng()), rng() < 0.5 ? 1 : -1) };
      const ring = { kind: "box" as const, cx: 20 * rng(), cy: 20 * rng(), halfW: 9, halfH: 5, inner: { halfW: 6, halfH: 2 } };
      const other = { kind: "polygon" as const, points: around(20 * rng(), 20 * rng(), 3 + 8 * rng(), 4, 1) };
      const margin = 2 * rng();
      const [x0, y0] = [-3 + 0.5 * Math.floor(6 * rng()), -2.25];
      const mask = rasterMask(28, 24, x0, y0, [polygon, ring], [other], margin);
      for (let j = 0; j < 24; j++)
        for (let i = 0; i < 28; i++) {
          const [x, y] = [x0 + i + 0.5, y0 + j + 0.5];
          const want = (contains(polygon, x, y) || contains(ring, x, y)) && !contains(other, x, y, margin);
          expect(mask.data[j * 28 + i], `trial ${trial}, pixel ${i},${j}`).toBe(want ? 255 : 0);
        }
    }
  });
});

describe("masked matching", () => {
  let matcher: Matcher;
  beforeAll(async () => void (matcher = createCvMatcher((await loadOpenCv()).cv)));
  afterAll(() => matcher.dispose());

  it("scores the kept pixels by TM_CCOEFF_NORMED, and a flat placement −1", () => {
    const rng = seedrandom("masked");
    const frame: GrayFrame = { width: 40, height: 30, data: Uint8Array.from({ length: 1200 }, () => Math.floor(rng() * 256)) };
    const tpl: GrayFrame = { width: 8, height: 6, data: Uint8Array.from({ length: 48 }, () => Math.floor(rng() * 256)) };
    const mask: GrayFrame = { width: 8, height: 6, data: Uint8Array.from({ length: 48 }, (_, i) => (i % 3 ? 255 : 0)) };
    const window = { x: 5, y: 4, width: 20, height: 14 };
    const map = matcher.match(frame, window, tpl, mask);
    const direct = (u: number, v: number) => {
      const a: number[] = [], b: number[] = [];
      for (let j = 0; j < 6; j++) for (let i = 0; i < 8; i++) if (mask.data[j * 8 + i]) {
        a.push(tpl.data[j * 8 + i]);
        b.push(frame.data[(window.y + v + j) * 40 + window.x + u + i]);
      }
      const ma = a.reduce((s, x) => s + x, 0) / a.length, mb = b.reduce((s, x) => s + x, 0) / b.length;
      let sab = 0, saa = 0, sbb = 0;
      for (let k = 0; k < a.length; k++) { sab += (a[k] - ma) * (b[k] - mb); saa += (a[k] - ma) ** 2; sbb += (b[k] - mb) ** 2; }
      return sab / Math.sqrt(saa * sbb);
    };
    let worst = 0;
    for (let v = 0; v < map.height; v++) for (let u = 0; u < map.width; u++) worst = Math.max(worst, Math.abs(map.data[v * map.width + u] - direct(u, v)));
    expect(worst).toBeLessThan(1e-3);
    const flat: GrayFrame = { width: 40, height: 30, data: new Uint8Array(1200).fill(90) };
    expect(Array.from(matcher.match(flat, window, tpl, mask).data).every((s) => s === -1)).toBe(true);
  });
});
