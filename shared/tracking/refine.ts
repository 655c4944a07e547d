// Sub-pixel refinement of a template's placement by Gauss–Newton on the normalised intensity
// difference (Lucas & Kanade 1981, inverse-compositional form for a pure translation). The 3×3
// quadratic fit of the score map is biased along ridges (a bar's edge barely constrains motion
// along the bar); this uses every template pixel's gradient instead.
import type { GrayFrame } from "./types";

const MAX_ITERATIONS = 5;
const CONVERGED = 0.005;
/** Farther than this from the score-map peak (whose fit can be ~1 px off along a ridge), a refinement is not trusted. */
const MAX_SHIFT = 2;

/**
 * Working memory kept between calls (a shot refines some 3,000 placements; fresh arrays for each
 * were a good share of the worker's garbage). Grown when a larger template comes.
 */
let scratch = { use: new Int32Array(0), inFrame: new Int32Array(0), tn: new Float64Array(0), gx: new Float64Array(0), gy: new Float64Array(0), sample: new Float64Array(0) };
function scratchFor(n: number) {
  if (scratch.use.length < n) {
    const size = Math.max(n, 2 * scratch.use.length);
    scratch = { use: new Int32Array(size), inFrame: new Int32Array(size), tn: new Float64Array(size), gx: new Float64Array(size), gy: new Float64Array(size), sample: new Float64Array(size) };
  }
  return scratch;
}

/**
 * Refined top-left (continuous frame coordinates) of `tpl` whose current estimate is (ox, oy);
 * null when the template has no texture to refine on or the refinement wanders off. With `mask`,
 * only the template pixels it keeps take part. Each step's sums run in the same order as the
 * plain form (sample, normalise, then the error's dot products), so results are the same to the bit.
 */
export function refinePlacement(frame: GrayFrame, tpl: GrayFrame, ox: number, oy: number, mask?: GrayFrame | null): { x: number; y: number } | null {
  const { width: tw, height: th, data: t } = tpl;
  // Interior template pixels (gradients need both neighbours) that the mask keeps,
  // and where each sits in the frame, from the placement's top-left pixel.
  const { use, inFrame, tn, gx, gy, sample } = scratchFor(Math.max(0, (tw - 2) * (th - 2)));
  let n = 0;
  for (let j = 1; j < th - 1; j++)
    for (let i = 1; i < tw - 1; i++)
      if (!mask || mask.data[j * tw + i]) {
        use[n] = j * tw + i;
        inFrame[n++] = j * frame.width + i;
      }
  if (n < 16) return null;
  // Normalised to zero mean, unit spread.
  let sum = 0;
  for (let k = 0; k < n; k++) {
    const at = use[k];
    sum += tn[k] = t[at];
    gx[k] = (t[at + 1] - t[at - 1]) / 2;
    gy[k] = (t[at + tw] - t[at - tw]) / 2;
  }
  const spread = centre(tn, n, sum);
  if (spread === 0) return null;
  for (let q = 0; q < n; q++) tn[q] /= spread;
  let hxx = 0, hxy = 0, hyy = 0;
  for (let q = 0; q < n; q++) {
    gx[q] /= spread;
    gy[q] /= spread;
    hxx += gx[q] * gx[q]; hxy += gx[q] * gy[q]; hyy += gy[q] * gy[q];
  }
  const det = hxx * hyy - hxy * hxy;
  if (!(det > 1e-9 * (hxx + hyy) ** 2)) return null;

  let px = ox, py = oy;
  for (let it = 0; it < MAX_ITERATIONS; it++) {
    const sampled = sampleInto(frame, px, py, tw, th, inFrame, n, sample);
    if (sampled === null) return null;
    const s = centre(sample, n, sampled);
    if (s === 0) return null;
    let bx = 0, by = 0;
    for (let q = 0; q < n; q++) {
      const e = sample[q] / s - tn[q];
      bx += gx[q] * e; by += gy[q] * e;
    }
    const dx = (hyy * bx - hxy * by) / det;
    const dy = (hxx * by - hxy * bx) / det;
    px -= dx;
    py -= dy;
    if (Math.hypot(px - ox, py - oy) > MAX_SHIFT) return null;
    if (Math.hypot(dx, dy) < CONVERGED) break;
  }
  return { x: px, y: py };
}

/**
 * Subtracts the mean from the first n values (whose sum, added in order, is `sum`) and returns
 * their root-mean-square spread; the caller divides by it when it is not zero.
 */
function centre(v: Float64Array, n: number, sum: number): number {
  const mean = sum / n;
  let ss = 0;
  for (let q = 0; q < n; q++) {
    v[q] -= mean;
    ss += v[q] * v[q];
  }
  return Math.sqrt(ss / n);
}

/**
 * Bilinear samples of the frame under the first n template pixels at `inFrame` (j·frame width + i)
 * placed at top-left (px, py), and their sum (added in order); null if outside.
 */
function sampleInto(f: GrayFrame, px: number, py: number, tw: number, th: number, inFrame: Int32Array, n: number, out: Float64Array): number | null {
  // Template pixel (i, j) has its centre at (px + i + 0.5, py + j + 0.5): frame pixel index px + i.
  const x0 = Math.floor(px), y0 = Math.floor(py);
  const fx = px - x0, fy = py - y0;
  if (x0 < -1 || y0 < -1 || x0 + tw > f.width || y0 + th > f.height) return null;
  const w = f.width, d = f.data;
  const w00 = (1 - fx) * (1 - fy), w10 = fx * (1 - fy), w01 = (1 - fx) * fy, w11 = fx * fy;
  const origin = y0 * w + x0;
  let sum = 0;
  for (let k = 0; k < n; k++) {
    const at = origin + inFrame[k];
    sum += out[k] = w00 * d[at] + w10 * d[at + 1] + w01 * d[at + w] + w11 * d[at + w + 1];
  }
  return sum;
}
