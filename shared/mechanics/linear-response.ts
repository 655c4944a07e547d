import { EigenvalueDecomposition, Matrix } from "ml-matrix";
import { endPadLength, lfilterZi, zeroLagDesignCached, type Biquad } from "./butterworth";
import type { CalibrationMap } from "./calibration";
import type { Source } from "./sources";
import { gradientWeights, type GridSegment, type SmoothSegment } from "./track-smoothing";

// Gap filling, the zero-lag filter and differencing are all linear in the world marks, so a
// smoothed position or velocity at one frame is a weighted sum of the marks. The weights (one row
// of the operator) come from one adjoint pass over the segment; a Monte Carlo trial then costs a
// few multiply-adds instead of re-filtering — see docs/decisions/011-uncertainty-monte-carlo.md.

function causalPass(q: Biquad, buf: Float64Array, reverse: boolean): void {
  const n = buf.length;
  let z0 = 0;
  let z1 = 0;
  for (let k = 0; k < n; k++) {
    const i = reverse ? n - 1 - k : k;
    const x = buf[i];
    const y = q.b0 * x + z0;
    z0 = q.b1 * x - q.a1 * y + z1;
    z1 = q.b2 * x - q.a2 * y;
    buf[i] = y;
  }
}

/** Output of the filter with no input, started from the lfilter_zi state. */
function zeroInputResponse(q: Biquad, n: number): Float64Array {
  const g = new Float64Array(n);
  let [z0, z1] = lfilterZi(q);
  for (let i = 0; i < n; i++) {
    const y = z0;
    z0 = -q.a1 * y + z1;
    z1 = -q.a2 * y;
    g[i] = y;
  }
  return g;
}

/**
 * Aᵀv where A x = filtfilt(q, x, padlen). With E the odd extension, F the zero-state pass, g the
 * zero-input response and R reversal, A = C·(RFR + Rg·e_lastᵀ)·(F + g·e_0ᵀ)·E, and FᵀR = RF.
 */
export function filtfiltAdjoint(q: Biquad, v: Float64Array, padlen: number): Float64Array {
  const n = v.length;
  if (n < 2) return Float64Array.from(v);
  const p = Math.min(padlen, n - 1);
  const N = n + 2 * p;
  const g = zeroInputResponse(q, N);
  const u = new Float64Array(N);
  u.set(v, p);
  // (F + e_last·(Rg)ᵀ) u
  let s1 = 0;
  for (let i = 0; i < N; i++) s1 += g[N - 1 - i] * u[i];
  causalPass(q, u, false);
  u[N - 1] += s1;
  // (RFR + e_0·gᵀ) u
  let s2 = 0;
  for (let i = 0; i < N; i++) s2 += g[i] * u[i];
  causalPass(q, u, true);
  u[0] += s2;
  // Eᵀ u
  const x = u.slice(p, p + n);
  for (let i = 0; i < p; i++) {
    x[0] += 2 * u[i];
    x[p - i] -= u[i];
    x[n - 1] += 2 * u[p + n + i];
    x[n - 2 - i] -= u[p + n + i];
  }
  return x;
}

/** Grid weights → weights on the segment's marks (adjoint of the straight-line gap filling). */
export function gridToMarkWeights(seg: GridSegment, wg: Float64Array): Float64Array {
  const wm = new Float64Array(seg.i1 - seg.i0);
  let m = -1;
  let last = 0;
  let next = 0;
  for (let j = 0; j < seg.frames.length; j++) {
    if (seg.marked[j]) {
      wm[++m] += wg[j];
      last = j;
      continue;
    }
    if (next <= j) for (next = j + 1; !seg.marked[next]; next++);
    const u = (seg.tS[j] - seg.tS[last]) / (seg.tS[next] - seg.tS[last]);
    wm[m] += (1 - u) * wg[j];
    wm[m + 1] += u * wg[j];
  }
  return wm;
}

/** Grid coefficients of gradientMps at index i (velocity in m/s from mm), at the samples' own times. */
function gradientRow(tS: Float64Array, i: number): Float64Array {
  const c = new Float64Array(tS.length);
  const { from, w } = gradientWeights(tS, i);
  for (let k = 0; k < w.length; k++) c[from + k] = w[k] / 1000;
  return c;
}

/** Weights on the segment's marks that give the smoothed position and velocity at grid index i. */
export function stateWeights(seg: SmoothSegment, i: number): { pos: Float64Array; vel: Float64Array | null } {
  const n = seg.frames.length;
  const filtered = seg.cutoffHz !== null && n >= 3;
  const q = filtered ? zeroLagDesignCached(seg.cutoffHz!, seg.fsHz) : null;
  const smoothT = (c: Float64Array) => (q ? filtfiltAdjoint(q, c, endPadLength(q)) : c);
  const e = new Float64Array(n);
  e[i] = 1;
  const pos = gridToMarkWeights(seg, smoothT(e));
  const vel = n >= 2 ? gridToMarkWeights(seg, smoothT(gradientRow(seg.tS, i))) : null;
  return { pos, vel };
}

export interface State {
  x: number;
  y: number;
  vx: number;
  vy: number;
}

export interface LinearState {
  nominal: State;
  /** The state under a trial calibration plus digitising noise of every contributing mark. */
  sample(cal: CalibrationMap, normal: () => number): State;
}

/** Weights below this fraction of the largest are dropped: the filter's memory has died out. */
const WEIGHT_FLOOR = 1e-12;

/**
 * Smoothed state of `src` at grid index i of `seg`, as a linear function of the marks. Digitising
 * noise enters as one 4-D Gaussian (its exact covariance through the linear smoothing, with the
 * calibration's Jacobian at each mark); the calibration's own error by re-mapping the marks.
 */
export function linearState(src: Source, seg: SmoothSegment, i: number, nominalCal: CalibrationMap, sigmaPx: number): LinearState {
  const { pos, vel } = stateWeights(seg, i);
  let maxP = 0;
  let maxV = 0;
  for (let k = 0; k < pos.length; k++) {
    maxP = Math.max(maxP, Math.abs(pos[k]));
    maxV = Math.max(maxV, vel ? Math.abs(vel[k]) : 0);
  }
  const px: number[] = [];
  const py: number[] = [];
  const wp: number[] = [];
  const wv: number[] = [];
  const nx: number[] = [];
  const ny: number[] = [];
  const C = new Matrix(4, 4);
  const share = 1 / src.parts.length;
  for (let k = 0; k < pos.length; k++) {
    const vk = vel ? vel[k] : 0;
    if (Math.abs(pos[k]) <= WEIGHT_FLOOR * maxP && Math.abs(vk) <= WEIGHT_FLOOR * maxV) continue;
    for (const part of src.parts) {
      const p: [number, number] = [part.x[seg.i0 + k], part.y[seg.i0 + k]];
      const a = [pos[k] * share, vk * share];
      const [X, Y] = nominalCal.toWorld(p);
      px.push(p[0]);
      py.push(p[1]);
      wp.push(a[0]);
      wv.push(a[1]);
      nx.push(X);
      ny.push(Y);
      const [j00, j01, j10, j11] = nominalCal.jacobian(p);
      const jj = [
        [j00 * j00 + j01 * j01, j00 * j10 + j01 * j11],
        [j00 * j10 + j01 * j11, j10 * j10 + j11 * j11],
      ];
      for (let al = 0; al < 2; al++)
        for (let be = 0; be < 2; be++)
          for (let c = 0; c < 2; c++)
            for (let d = 0; d < 2; d++) C.set(al * 2 + c, be * 2 + d, C.get(al * 2 + c, be * 2 + d) + sigmaPx * sigmaPx * a[al] * a[be] * jj[c][d]);
    }
  }
  const evd = new EigenvalueDecomposition(C, { assumeSymmetric: true });
  const V = evd.eigenvectorMatrix;
  // Noise = L·z with z ~ N(0, I₄), L = V·√Λ (row-major).
  const L = Float64Array.from(V.mulRowVector(evd.realEigenvalues.map((l) => Math.sqrt(Math.max(0, l)))).to1DArray());

  const nominal: State = { x: seg.sx[i], y: seg.sy[i], vx: seg.vx[i], vy: seg.vy[i] };
  const sums = { pxp: 0, pyp: 0, wp: 0, pxv: 0, pyv: 0, wv: 0 };
  for (let t = 0; t < px.length; t++) {
    sums.pxp += wp[t] * px[t];
    sums.pyp += wp[t] * py[t];
    sums.wp += wp[t];
    sums.pxv += wv[t] * px[t];
    sums.pyv += wv[t] * py[t];
    sums.wv += wv[t];
  }
  const nomAff = nominalCal.affine;

  return {
    nominal,
    sample(cal, normal) {
      let dx = 0;
      let dy = 0;
      let dvx = 0;
      let dvy = 0;
      if (cal.affine && nomAff) {
        const dM = cal.affine.M.map((m, k) => m - nomAff.M[k]);
        const dt0 = cal.affine.t[0] - nomAff.t[0];
        const dt1 = cal.affine.t[1] - nomAff.t[1];
        dx = dM[0] * sums.pxp + dM[1] * sums.pyp + dt0 * sums.wp;
        dy = dM[2] * sums.pxp + dM[3] * sums.pyp + dt1 * sums.wp;
        dvx = dM[0] * sums.pxv + dM[1] * sums.pyv + dt0 * sums.wv;
        dvy = dM[2] * sums.pxv + dM[3] * sums.pyv + dt1 * sums.wv;
      } else if (cal.H) {
        const H = cal.H;
        for (let t = 0; t < px.length; t++) {
          const w = H[6] * px[t] + H[7] * py[t] + H[8];
          const X = (H[0] * px[t] + H[1] * py[t] + H[2]) / w;
          const Y = (H[3] * px[t] + H[4] * py[t] + H[5]) / w;
          dx += wp[t] * (X - nx[t]);
          dy += wp[t] * (Y - ny[t]);
          dvx += wv[t] * (X - nx[t]);
          dvy += wv[t] * (Y - ny[t]);
        }
      } else {
        for (let t = 0; t < px.length; t++) {
          const [X, Y] = cal.toWorld([px[t], py[t]]);
          dx += wp[t] * (X - nx[t]);
          dy += wp[t] * (Y - ny[t]);
          dvx += wv[t] * (X - nx[t]);
          dvy += wv[t] * (Y - ny[t]);
        }
      }
      const z0 = normal();
      const z1 = normal();
      const z2 = normal();
      const z3 = normal();
      const n = [0, 0, 0, 0];
      for (let r = 0; r < 4; r++) n[r] = L[4 * r] * z0 + L[4 * r + 1] * z1 + L[4 * r + 2] * z2 + L[4 * r + 3] * z3;
      return { x: nominal.x + dx + n[0], y: nominal.y + dy + n[1], vx: nominal.vx + dvx + n[2], vy: nominal.vy + dvy + n[3] };
    },
  };
}
