// Best placement in a score map, refined to sub-pixel, and the strongest rival peak.
import type { ScoreMap } from "./matcher";

export interface Peak {
  /** Placement of the template's top-left corner in map cells, sub-pixel. */
  x: number;
  y: number;
  score: number;
  /** Highest other local maximum farther than the exclusion radius, or null when there is none. */
  sideLobe: number | null;
  /** The integer peak lies on the map's edge: the true peak may be outside the searched range. */
  onBorder: boolean;
}

export function findPeak(map: ScoreMap, exclusionRadius: number): Peak {
  const { width: w, height: h, data } = map;
  let best = 0;
  for (let i = 1; i < data.length; i++) if (data[i] > data[best] || !(data[best] === data[best])) best = i;
  const px = best % w;
  const py = (best - px) / w;
  const score = data[best];
  const onBorder = px === 0 || py === 0 || px === w - 1 || py === h - 1;
  const [dx, dy] = onBorder ? [0, 0] : quadraticOffset(data, w, px, py);
  return { x: px + dx, y: py + dy, score, sideLobe: sideLobe(map, px, py, exclusionRadius), onBorder };
}

/**
 * Offset of the maximum of the least-squares quadratic a + bx + cy + dx² + exy + fy² through the
 * 3×3 neighbourhood; falls back to one parabola per axis when that surface has no maximum.
 */
function quadraticOffset(z: Float32Array, w: number, px: number, py: number): [number, number] {
  const at = (dx: number, dy: number) => z[(py + dy) * w + px + dx];
  let colL = 0, colC = 0, colR = 0, rowT = 0, rowC = 0, rowB = 0;
  for (let k = -1; k <= 1; k++) {
    colL += at(-1, k); colC += at(0, k); colR += at(1, k);
    rowT += at(k, -1); rowC += at(k, 0); rowB += at(k, 1);
  }
  const b = (colR - colL) / 6;
  const c = (rowB - rowT) / 6;
  const d = (colL + colR) / 6 - colC / 3;
  const f = (rowT + rowB) / 6 - rowC / 3;
  const e = (at(1, 1) - at(1, -1) - at(-1, 1) + at(-1, -1)) / 4;
  const det = 4 * d * f - e * e;
  if (d < 0 && det > 0) {
    const ox = (e * c - 2 * f * b) / det;
    const oy = (e * b - 2 * d * c) / det;
    if (Math.abs(ox) <= 1 && Math.abs(oy) <= 1) return [ox, oy];
  }
  return [parabola(at(-1, 0), at(0, 0), at(1, 0)), parabola(at(0, -1), at(0, 0), at(0, 1))];
}

function parabola(l: number, c: number, r: number): number {
  const curve = l - 2 * c + r;
  if (!(curve < 0)) return 0;
  return Math.max(-0.5, Math.min(0.5, (l - r) / (2 * curve)));
}

function sideLobe(map: ScoreMap, px: number, py: number, radius: number): number | null {
  const { width: w, height: h, data } = map;
  const r2 = radius * radius;
  let best: number | null = null;
  for (let y = 0; y < h; y++) {
    for (let x = 0; x < w; x++) {
      if ((x - px) ** 2 + (y - py) ** 2 <= r2) continue;
      const v = data[y * w + x];
      if (best !== null && v <= best) continue;
      if (isLocalMax(data, w, h, x, y, v)) best = v;
    }
  }
  return best;
}

function isLocalMax(data: Float32Array, w: number, h: number, x: number, y: number, v: number): boolean {
  for (let dy = -1; dy <= 1; dy++) {
    const yy = y + dy;
    if (yy < 0 || yy >= h) continue;
    for (let dx = -1; dx <= 1; dx++) {
      const xx = x + dx;
      if ((dx || dy) && xx >= 0 && xx < w && data[yy * w + xx] > v) return false;
    }
  }
  return true;
}

