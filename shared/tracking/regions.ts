// Shapes in frame pixels that say which pixels of a template belong to the landmark's own object
// (an include mask, captured with the template) and which belong to another tracked object at the
// current frame (an exclusion: the blade beside the puck, the puck beside the blade's toe).
// Matching then ignores the other object, so a template never learns it and is never pulled by it.
import type { GrayFrame } from "./types";

export type Vec2 = [number, number];

export type Region =
  /** An axis-aligned box; with `inner`, only the ring between the two boxes (a silhouette's edge). */
  | { kind: "box"; cx: number; cy: number; halfW: number; halfH: number; inner?: { halfW: number; halfH: number } }
  /** A convex polygon, corners in either turning order. */
  | { kind: "polygon"; points: Vec2[] };

/** Whether (x, y) lies in the region grown by `margin` px (a ring's hole shrunk by it). */
export function contains(r: Region, x: number, y: number, margin = 0): boolean {
  if (r.kind === "box") {
    const dx = Math.abs(x - r.cx);
    const dy = Math.abs(y - r.cy);
    if (dx > r.halfW + margin || dy > r.halfH + margin) return false;
    if (!r.inner) return true;
    return dx > r.inner.halfW - margin || dy > r.inner.halfH - margin;
  }
  const p = r.points;
  let sign = 0;
  for (let i = 0; i < p.length; i++) {
    const [ax, ay] = p[i];
    const [bx, by] = p[(i + 1) % p.length];
    const len = Math.hypot(bx - ax, by - ay) || 1;
    // Signed distance from the edge's line; inside is the side all edges agree on.
    const d = ((bx - ax) * (y - ay) - (by - ay) * (x - ax)) / len;
    if (sign === 0) sign = area(p) >= 0 ? 1 : -1;
    if (sign * d < -margin) return false;
  }
  return true;
}

function area(p: Vec2[]): number {
  let a = 0;
  for (let i = 0; i < p.length; i++) {
    const [ax, ay] = p[i];
    const [bx, by] = p[(i + 1) % p.length];
    a += ax * by - bx * ay;
  }
  return a / 2;
}

/**
 * `contains` for one region and margin, with the polygon's edges (direction, length, turning
 * order) worked out once: a mask asks it for every pixel of a template. The same arithmetic per
 * pixel as `contains`, so the masks are the same to the bit.
 */
function containsFn(r: Region, margin: number): (x: number, y: number) => boolean {
  if (r.kind === "box") return (x, y) => contains(r, x, y, margin);
  const p = r.points;
  const sign = area(p) >= 0 ? 1 : -1;
  const edges = p.map(([ax, ay], i) => {
    const [bx, by] = p[(i + 1) % p.length];
    return { ax, ay, ex: bx - ax, ey: by - ay, len: Math.hypot(bx - ax, by - ay) || 1 };
  });
  return (x, y) => {
    for (const e of edges) if (sign * ((e.ex * (y - e.ay) - e.ey * (x - e.ax)) / e.len) < -margin) return false;
    return true;
  };
}

/**
 * A width × height mask (255 = use the pixel) for a patch whose top-left pixel corner sits at
 * frame point (x0, y0): pixels inside any `include` region (all pixels when there is none) and
 * inside no `exclude` region grown by `excludeMargin`.
 */
export function rasterMask(width: number, height: number, x0: number, y0: number, include: Region[] | null, exclude: Region[] = [], excludeMargin = 0): GrayFrame {
  const data = new Uint8Array(width * height);
  const inc = include?.map((r) => containsFn(r, 0)) ?? null;
  const exc = exclude.map((r) => containsFn(r, excludeMargin));
  for (let j = 0; j < height; j++) {
    const y = y0 + j + 0.5;
    for (let i = 0; i < width; i++) {
      const x = x0 + i + 0.5;
      const inside = !inc || inc.some((f) => f(x, y));
      if (inside && !exc.some((f) => f(x, y))) data[j * width + i] = 255;
    }
  }
  return { width, height, data };
}

/** Share of a mask's pixels in use. */
export function coverage(mask: GrayFrame): number {
  let n = 0;
  for (let i = 0; i < mask.data.length; i++) if (mask.data[i]) n++;
  return n / mask.data.length;
}

/** The two masks' common pixels (either may be absent: all pixels). */
export function intersect(a: GrayFrame | null, b: GrayFrame | null): GrayFrame | null {
  if (!a) return b;
  if (!b) return a;
  const data = new Uint8Array(a.data.length);
  for (let i = 0; i < data.length; i++) data[i] = a.data[i] && b.data[i] ? 255 : 0;
  return { width: a.width, height: a.height, data };
}

/** Whether a region could touch the box [x0, x0 + w] × [y0, y0 + h] (cheap bounding test). */
export function mayTouch(r: Region, x0: number, y0: number, w: number, h: number, margin = 0): boolean {
  let minX: number, maxX: number, minY: number, maxY: number;
  if (r.kind === "box") {
    [minX, maxX, minY, maxY] = [r.cx - r.halfW, r.cx + r.halfW, r.cy - r.halfH, r.cy + r.halfH];
  } else {
    const xs = r.points.map((p) => p[0]);
    const ys = r.points.map((p) => p[1]);
    [minX, maxX, minY, maxY] = [Math.min(...xs), Math.max(...xs), Math.min(...ys), Math.max(...ys)];
  }
  return maxX + margin >= x0 && minX - margin <= x0 + w && maxY + margin >= y0 && minY - margin <= y0 + h;
}
