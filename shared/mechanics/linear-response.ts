import { endPadLength, lfilterZi, passFromRest, passPairFromRest, zeroLagDesignCached, type Biquad } from "./butterworth";
import type { CalibrationMap } from "./calibration";
import type { Source } from "./sources";
import { gradientWeights, subSegment, velocityAt, type GridSegment, type SmoothSegment } from "./track-smoothing";

// Gap filling, the zero-lag filter and differencing are all linear in the world marks, so a
// smoothed position or velocity at one frame is a weighted sum of the marks. The weights (one row
// of the operator) come from one adjoint pass over the segment; a Monte Carlo trial then costs a
// few multiply-adds instead of re-filtering — see docs/decisions/011-uncertainty-monte-carlo.md.

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
  return filtfiltAdjointPair(q, v, null, padlen)[0];
}

/**
 * filtfiltAdjoint of two vectors of one length (a state's position and velocity rows): one
 * zero-input response for both and the passes side by side; each result as on its own.
 */
export function filtfiltAdjointPair(q: Biquad, v: Float64Array, w: Float64Array | null, padlen: number): [Float64Array, Float64Array | null] {
  const n = v.length;
  if (w && w.length !== n) throw new RangeError(`a pair of vectors must have one length (got ${n} and ${w.length})`);
  if (n < 2) return [Float64Array.from(v), w && Float64Array.from(w)];
  const p = Math.min(padlen, n - 1);
  const N = n + 2 * p;
  const g = zeroInputResponse(q, N);
  const us = (w ? [v, w] : [v]).map((x) => {
    const u = new Float64Array(N);
    u.set(x, p);
    return u;
  });
  // (F + e_last·(Rg)ᵀ) u
  const s1 = us.map((u) => {
    let s = 0;
    for (let i = 0; i < N; i++) s += g[N - 1 - i] * u[i];
    return s;
  });
  passBoth(q, us, false);
  us.forEach((u, k) => (u[N - 1] += s1[k]));
  // (RFR + e_0·gᵀ) u
  const s2 = us.map((u) => {
    let s = 0;
    for (let i = 0; i < N; i++) s += g[i] * u[i];
    return s;
  });
  passBoth(q, us, true);
  us.forEach((u, k) => (u[0] += s2[k]));
  // Eᵀ u
  const out = us.map((u) => {
    const x = u.slice(p, p + n);
    for (let i = 0; i < p; i++) {
      x[0] += 2 * u[i];
      x[p - i] -= u[i];
      x[n - 1] += 2 * u[p + n + i];
      x[n - 2 - i] -= u[p + n + i];
    }
    return x;
  });
  return [out[0], out[1] ?? null];
}

/** A pass from rest over one buffer, or two side by side. */
function passBoth(q: Biquad, us: Float64Array[], backward: boolean): void {
  if (us.length === 2) passPairFromRest(q, us[0], us[1], backward);
  else passFromRest(q, us[0], backward);
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
  const e = new Float64Array(n);
  e[i] = 1;
  const row = n >= 2 ? gradientRow(seg.tS, i) : null;
  const [pe, pv] = q ? filtfiltAdjointPair(q, e, row, endPadLength(q)) : [e, row];
  return { pos: gridToMarkWeights(seg, pe), vel: pv && gridToMarkWeights(seg, pv) };
}

export interface State {
  x: number;
  y: number;
  vx: number;
  vy: number;
}

/** Weights below this fraction of the largest are dropped: the filter's memory has died out. */
const WEIGHT_FLOOR = 1e-12;

/** Lower-triangular L with L·Lᵀ = C for a symmetric positive semi-definite 4×4 (row-major). */
export function cholesky4(C: Float64Array): Float64Array {
  const L = new Float64Array(16);
  const scale = Math.max(C[0], C[5], C[10], C[15]);
  for (let j = 0; j < 4; j++) {
    let d = C[j * 5];
    for (let k = 0; k < j; k++) d -= L[j * 4 + k] ** 2;
    if (!(d > 1e-14 * scale)) continue;
    const ljj = Math.sqrt(d);
    L[j * 5] = ljj;
    for (let i = j + 1; i < 4; i++) {
      let v = C[i * 4 + j];
      for (let k = 0; k < j; k++) v -= L[i * 4 + k] * L[j * 4 + k];
      L[i * 4 + j] = v / ljj;
    }
  }
  return L;
}

/** A grid index on a smoothed piece of the source. */
export interface StateAt {
  seg: SmoothSegment;
  i: number;
}

export interface LinearStates {
  nominal: State[];
  /**
   * State s under a trial calibration plus one draw of digitising noise. A trial uses one state (one
   * cut, one cutoff), so each is drawn from its own distribution; how the states' noise correlates
   * does not enter.
   */
  sample(cal: CalibrationMap, normal: () => number, s?: number): State;
}

/** Margin around a grid index beyond which the filter's weights have died out (its end padding: decay to 1e-6). */
function weightWindow(seg: SmoothSegment): number {
  return seg.cutoffHz === null || seg.x.length < 3 ? 2 : endPadLength(zeroLagDesignCached(seg.cutoffHz, seg.fsHz)) + 2;
}

/**
 * Weights on the marks of `seg` for the state at grid index i, computed on the marks within the
 * filter's reach of it only (the rest weigh less than 1e-6 of the largest): the cost stays flat on
 * long tracks. Returned with the index of the first mark they apply to.
 */
function localWeights(seg: SmoothSegment, i: number): { pos: Float64Array; vel: Float64Array | null; firstMark: number } {
  const reach = weightWindow(seg);
  if (seg.frames.length <= 2 * reach + 1) return { ...stateWeights(seg, i), firstMark: seg.i0 };
  const { sub, offset } = subSegment(seg, i - reach, i + reach);
  return { ...stateWeights(sub, i - offset), firstMark: sub.i0 };
}

/**
 * Smoothed states of `src` at grid indices of smoothed pieces (e.g. one track cut at different
 * frames, or smoothed at different cutoffs), as linear functions of the marks. Digitising noise
 * enters as a Gaussian: its exact covariance through the linear smoothing, with the calibration's
 * Jacobian at each mark; the calibration's own error by re-mapping the marks.
 */
export function linearStates(src: Source, at: StateAt[], nominalCal: CalibrationMap, sigmaPx: number): LinearStates {
  const nomAff = nominalCal.affine;
  const share = 1 / src.parts.length;
  const samplers = at.map(({ seg, i }) => {
    const { pos, vel, firstMark } = localWeights(seg, i);
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
    // Covariance of [x, y, vx, vy] from digitising noise (row-major 4×4).
    const C = new Float64Array(16);
    for (let k = 0; k < pos.length; k++) {
      const vk = vel ? vel[k] : 0;
      if (Math.abs(pos[k]) <= WEIGHT_FLOOR * maxP && Math.abs(vk) <= WEIGHT_FLOOR * maxV) continue;
      for (const part of src.parts) {
        const m = firstMark + k;
        const p: [number, number] = [part.x[m], part.y[m]];
        const a = [pos[k] * share, vk * share];
        const [X, Y] = nominalCal.toWorld(p);
        px.push(p[0]);
        py.push(p[1]);
        wp.push(a[0]);
        wv.push(a[1]);
        nx.push(X);
        ny.push(Y);
        const [j00, j01, j10, j11] = nominalCal.jacobian(p);
        const jj = [j00 * j00 + j01 * j01, j00 * j10 + j01 * j11, j00 * j10 + j01 * j11, j10 * j10 + j11 * j11];
        const s2 = sigmaPx * sigmaPx;
        for (let al = 0; al < 2; al++)
          for (let be = 0; be < 2; be++) {
            const f = s2 * a[al] * a[be];
            for (let c = 0; c < 2; c++) for (let d = 0; d < 2; d++) C[(al * 2 + c) * 4 + be * 2 + d] += f * jj[c * 2 + d];
          }
      }
    }
    // Noise = L·z with z ~ N(0, I₄), L the Cholesky factor (a zero pivot — a state with no
    // velocity, say — leaves its column zero).
    const L = cholesky4(C);
    const [vx, vy] = velocityAt(seg, i);
    const nominal: State = { x: seg.sx[i], y: seg.sy[i], vx, vy };
    const sums = { pxp: 0, pyp: 0, wp: 0, pxv: 0, pyv: 0, wv: 0 };
    for (let t = 0; t < px.length; t++) {
      sums.pxp += wp[t] * px[t];
      sums.pyp += wp[t] * py[t];
      sums.wp += wp[t];
      sums.pxv += wv[t] * px[t];
      sums.pyv += wv[t] * py[t];
      sums.wv += wv[t];
    }
    return {
      nominal,
      sample(cal: CalibrationMap, normal: () => number): State {
        let dx = 0;
        let dy = 0;
        let dvx = 0;
        let dvy = 0;
        if (cal.affine && nomAff) {
          const M = cal.affine.M;
          const N = nomAff.M;
          const dM0 = M[0] - N[0];
          const dM1 = M[1] - N[1];
          const dM2 = M[2] - N[2];
          const dM3 = M[3] - N[3];
          const dt0 = cal.affine.t[0] - nomAff.t[0];
          const dt1 = cal.affine.t[1] - nomAff.t[1];
          dx = dM0 * sums.pxp + dM1 * sums.pyp + dt0 * sums.wp;
          dy = dM2 * sums.pxp + dM3 * sums.pyp + dt1 * sums.wp;
          dvx = dM0 * sums.pxv + dM1 * sums.pyv + dt0 * sums.wv;
          dvy = dM2 * sums.pxv + dM3 * sums.pyv + dt1 * sums.wv;
        } else {
          const H = cal.H;
          for (let t = 0; t < px.length; t++) {
            let X: number;
            let Y: number;
            if (H) {
              const w = H[6] * px[t] + H[7] * py[t] + H[8];
              X = (H[0] * px[t] + H[1] * py[t] + H[2]) / w;
              Y = (H[3] * px[t] + H[4] * py[t] + H[5]) / w;
            } else [X, Y] = cal.toWorld([px[t], py[t]]);
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
        return {
          x: nominal.x + dx + L[0] * z0 + L[1] * z1 + L[2] * z2 + L[3] * z3,
          y: nominal.y + dy + L[4] * z0 + L[5] * z1 + L[6] * z2 + L[7] * z3,
          vx: nominal.vx + dvx + L[8] * z0 + L[9] * z1 + L[10] * z2 + L[11] * z3,
          vy: nominal.vy + dvy + L[12] * z0 + L[13] * z1 + L[14] * z2 + L[15] * z3,
        };
      },
    };
  });
  return { nominal: samplers.map((s) => s.nominal), sample: (cal, normal, s = 0) => samplers[s].sample(cal, normal) };
}

export interface LinearState {
  nominal: State;
  /** The state under a trial calibration plus digitising noise of every contributing mark. */
  sample(cal: CalibrationMap, normal: () => number): State;
}

/** One smoothed state of `src` at grid index i of `seg` (see linearStates). */
export function linearState(src: Source, seg: SmoothSegment, i: number, nominalCal: CalibrationMap, sigmaPx: number): LinearState {
  const one = linearStates(src, [{ seg, i }], nominalCal, sigmaPx);
  return { nominal: one.nominal[0], sample: (cal, normal) => one.sample(cal, normal, 0) };
}
