// The sub-pixel refinement in its plain form, pass by pass with fresh arrays for every call, as it
// was before refine.ts kept its working memory between calls (decision 157): the identity test's
// reference. Source: Lucas & Kanade 1981, inverse-compositional form for a pure translation.
import type { GrayFrame } from "../../../../shared/tracking/types";

export function refinePlain(frame: GrayFrame, tpl: GrayFrame, ox: number, oy: number, mask?: GrayFrame | null): { x: number; y: number } | null {
  const { width: tw, height: th, data: t } = tpl;
  const use: number[] = [];
  const inFrame: number[] = [];
  for (let j = 1; j < th - 1; j++)
    for (let i = 1; i < tw - 1; i++)
      if (!mask || mask.data[j * tw + i]) {
        use.push(j * tw + i);
        inFrame.push(j * frame.width + i);
      }
  const n = use.length;
  if (n < 16) return null;
  const tn = new Float64Array(use.map((at) => t[at]));
  const gx = new Float64Array(use.map((at) => (t[at + 1] - t[at - 1]) / 2));
  const gy = new Float64Array(use.map((at) => (t[at + tw] - t[at - tw]) / 2));
  const spread = normalise(tn);
  if (spread === 0) return null;
  gx.forEach((v, q) => (gx[q] = v / spread));
  gy.forEach((v, q) => (gy[q] = v / spread));
  // Sums taken left to right, as a loop takes them.
  const dot = (a: Float64Array, b: Float64Array) => a.reduce((s, v, q) => s + v * b[q], 0);
  const [hxx, hxy, hyy] = [dot(gx, gx), dot(gx, gy), dot(gy, gy)];
  const det = hxx * hyy - hxy * hxy;
  if (!(det > 1e-9 * (hxx + hyy) ** 2)) return null;
  let px = ox, py = oy;
  for (let it = 0; it < 5; it++) {
    const x0 = Math.floor(px), y0 = Math.floor(py);
    const fx = px - x0, fy = py - y0;
    if (x0 < -1 || y0 < -1 || x0 + tw > frame.width || y0 + th > frame.height) return null;
    const w = frame.width, d = frame.data;
    const sample = new Float64Array(inFrame.map((k) => {
      const at = y0 * w + x0 + k;
      return (1 - fx) * (1 - fy) * d[at] + fx * (1 - fy) * d[at + 1] + (1 - fx) * fy * d[at + w] + fx * fy * d[at + w + 1];
    }));
    if (normalise(sample) === 0) return null;
    const e = sample.map((v, q) => v - tn[q]);
    const [bx, by] = [dot(gx, e), dot(gy, e)];
    const dx = (hyy * bx - hxy * by) / det;
    const dy = (hxx * by - hxy * bx) / det;
    px -= dx;
    py -= dy;
    if (Math.hypot(px - ox, py - oy) > 2) return null;
    if (Math.hypot(dx, dy) < 0.005) break;
  }
  return { x: px, y: py };
}

function normalise(v: Float64Array): number {
  let sum = 0;
  for (let q = 0; q < v.length; q++) sum += v[q];
  const mean = sum / v.length;
  let ss = 0;
  for (let q = 0; q < v.length; q++) {
    v[q] -= mean;
    ss += v[q] * v[q];
  }
  const spread = Math.sqrt(ss / v.length);
  if (spread > 0) for (let q = 0; q < v.length; q++) v[q] /= spread;
  return spread;
}
