// The puck at rest, found in the picture from the analyst's mark on it: the darkest object there,
// grown from the mark, measured edge to edge at half the step from puck to ice. Its length seen
// side-on is the puck's diameter (76.2 mm), so it proposes a scale bar; its box is the puck
// template's mask (the puck's own edge, not the blade or ice around it).
import type { GrayFrame } from "./types";

export interface PuckSilhouette {
  /** Centre of the measured box, frame px. */
  cx: number;
  cy: number;
  /** Edge to edge along the rows (the diameter seen side-on) and along the columns (the thickness). */
  widthPx: number;
  heightPx: number;
  /** The scale bar along the diameter through the centre. */
  bar: { a: [number, number]; b: [number, number] };
  /** Grey levels of the puck and of the ice around it. */
  puckLevel: number;
  backgroundLevel: number;
  /** Why it is not trusted as a scale bar (null when it is): merged with something, an odd shape. */
  doubt: string | null;
}

/** How far from the mark the search for the puck's darkest pixel goes. */
const SEED_REACH = 6;
/** A side-on puck is 76.2 × 25.4 mm: width / height 3; tilted a little, up to the face showing. */
const ASPECT_RANGE: [number, number] = [1.8, 4.2];
const MAX_SIDE = 400;

export function findPuckSilhouette(frame: GrayFrame, x: number, y: number): PuckSilhouette | null {
  const { width: W, height: H, data } = frame;
  const px = (i: number, j: number) => data[j * W + i];
  // The darkest pixel near the mark (the mark may sit on a light print).
  let sx = Math.floor(x), sy = Math.floor(y), darkest = 256;
  for (let j = Math.max(0, sy - SEED_REACH); j <= Math.min(H - 1, sy + SEED_REACH); j++)
    for (let i = Math.max(0, sx - SEED_REACH); i <= Math.min(W - 1, sx + SEED_REACH); i++)
      if (px(i, j) < darkest) [darkest, sx, sy] = [px(i, j), i, j];
  if (darkest > 255) return null;

  // Ice: the upper quartile of a window around the mark (the puck is a small part of it).
  const r = 48;
  const around: number[] = [];
  for (let j = Math.max(0, sy - r); j < Math.min(H, sy + r); j += 2) for (let i = Math.max(0, sx - r); i < Math.min(W, sx + r); i += 2) around.push(px(i, j));
  around.sort((a, b) => a - b);
  const ice = around[Math.floor(around.length * 0.75)];
  if (ice - darkest < 30) return null;
  const cut = darkest + 0.5 * (ice - darkest);

  // Grow the dark region from that pixel (4-connected), bounded so a merged shadow cannot run away.
  const seen = new Set<number>();
  const stack = [sy * W + sx];
  let x0 = sx, x1 = sx, y0 = sy, y1 = sy;
  while (stack.length) {
    const k = stack.pop()!;
    if (seen.has(k)) continue;
    const i = k % W, j = (k - i) / W;
    if (data[k] > cut) continue;
    seen.add(k);
    x0 = Math.min(x0, i); x1 = Math.max(x1, i); y0 = Math.min(y0, j); y1 = Math.max(y1, j);
    if (x1 - x0 > MAX_SIDE || y1 - y0 > MAX_SIDE) return null;
    if (i > 0) stack.push(k - 1);
    if (i < W - 1) stack.push(k + 1);
    if (j > 0) stack.push(k - W);
    if (j < H - 1) stack.push(k + W);
  }
  if (x1 - x0 < 4 || y1 - y0 < 2) return null;

  // Local levels: the puck's inside (the darker half of the region) and the ice just outside its box.
  const inside = [...seen].map((k) => data[k]).sort((a, b) => a - b);
  const puckLevel = inside[Math.floor(inside.length * 0.25)];
  const ring: number[] = [];
  const pad = 3;
  for (let j = y0 - pad; j <= y1 + pad; j++)
    for (let i = x0 - pad; i <= x1 + pad; i++) {
      if (i < 0 || j < 0 || i >= W || j >= H) continue;
      if (i >= x0 - 1 && i <= x1 + 1 && j >= y0 - 1 && j <= y1 + 1) continue;
      ring.push(px(i, j));
    }
  ring.sort((a, b) => a - b);
  const backgroundLevel = ring.length ? ring[Math.floor(ring.length / 2)] : ice;
  const half = (puckLevel + backgroundLevel) / 2;

  // Edges at the half level, interpolated, from outside in: rows through the middle 40 % (clear of
  // the rounded corners) for the length, columns through the middle 40 % for the thickness.
  const across = (lines: [number, number], span: [number, number], n: number, at: (line: number, k: number) => number) => {
    const lengths: number[] = [], centres: number[] = [];
    const mid = (lines[0] + lines[1] + 1) / 2, reach = (lines[1] - lines[0] + 1) * 0.2;
    for (let line = Math.ceil(mid - reach - 0.5); line <= Math.floor(mid + reach - 0.5); line++) {
      const from = crossing((k) => at(line, k), span[0] - pad, span[1] + pad, half, n);
      const to = crossing((k) => at(line, k), span[1] + pad, span[0] - pad, half, n);
      if (from !== null && to !== null && to > from) {
        lengths.push(to - from);
        centres.push((from + to) / 2);
      }
    }
    return lengths.length ? { length: median(lengths), centre: median(centres) } : null;
  };
  const rows = across([y0, y1], [x0, x1], W, (j, i) => px(i, j));
  const cols = across([x0, x1], [y0, y1], H, (i, j) => px(i, j));
  if (!rows || !cols) return null;
  const [widthPx, cx, heightPx, cy] = [rows.length, rows.centre, cols.length, cols.centre];
  const aspect = widthPx / heightPx;
  let doubt: string | null = null;
  if (x0 - pad < 0 || y0 - pad < 0 || x1 + pad >= W || y1 + pad >= H) doubt = "the puck touches the frame edge";
  else if (aspect < ASPECT_RANGE[0] || aspect > ASPECT_RANGE[1])
    doubt = `the dark shape at the mark is ${widthPx.toFixed(1)} × ${heightPx.toFixed(1)} px, not a puck seen side-on (about 3 : 1): it may touch the blade or a shadow`;
  return { cx, cy, widthPx, heightPx, bar: { a: [cx - widthPx / 2, cy], b: [cx + widthPx / 2, cy] }, puckLevel, backgroundLevel, doubt };
}

/**
 * Where the profile `at(k)` first crosses `level` going from `from` (outside, bright) towards `to`,
 * as a pixel-edge coordinate: pixel k's value stands for its centre k + 0.5.
 */
function crossing(at: (k: number) => number, from: number, to: number, level: number, n: number): number | null {
  const step = to > from ? 1 : -1;
  let prev: number | null = null;
  for (let k = from; step > 0 ? k <= to : k >= to; k += step) {
    if (k < 0 || k >= n) continue;
    const v = at(k);
    if (prev !== null && prev > level && v <= level) {
      const t = (prev - level) / (prev - v);
      return k - step + 0.5 + step * t;
    }
    prev = v;
  }
  return null;
}

function median(v: number[]): number {
  const s = [...v].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}
