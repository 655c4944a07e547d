import { Matrix, solve } from "ml-matrix";
import { bendAngleDeg } from "./bend";
import { endPadLength, maxWantedCutoff, zeroLagDesignCached, zeroLagLowPassPair } from "./butterworth";
import type { CalibrationMap } from "./calibration";
import { stateWeights } from "./linear-response";
import type { Source } from "./sources";
import type { TimeBase } from "./time-base";
import { gridIndex, gridSegments, marksBetween, smoothSegment, velocityAt, type GridSegment, type SmoothSegment, type WorldTrack } from "./track-smoothing";
import { hypot } from "./hypot";

// Smoothing bias at the two results read from smoothed tracks, and the cutoff each is read at
// (docs/decisions/140-cutoff-and-smoothing-bias.md).
//
// Residual analysis picks the cutoff that suits a whole track; a value read at one instant — the
// top of the bend, the end of the blade's approach — is flattened more than the track on average.
// Each result therefore starts at the residual-analysis cutoff and moves up to where its own
// estimated bias is BIAS_TO_NOISE (0.15) of its standard uncertainty from digitising: the usual
// way to make an interval from a smoother cover the truth is to smooth less than is best for the
// curve as a whole (undersmoothing; Hall, Ann Stat 20:675–694, 1992). What bias remains is not
// corrected but added to the uncertainty on the side it acts (Phillips, Eberhardt & Parry, J Res
// Natl Inst Stand Technol 102:577–585, 1997, uncorrected bias in an uncertainty statement).
//
// - Peak bend: smoothing the smoothed marks once more flattens the peak by about as much again, so
//   bend(S²x) − bend(Sx) estimates the bias of bend(Sx) (the bias estimate of "twicing", Tukey,
//   Exploratory Data Analysis, 1977). Measured on the synthetic shot it recovers 85–100 % of the
//   true flattening, with a scatter a quarter of the bend's own.
// - Blade speed at the end of its approach: the odd extension that pads the piece continues its
//   slope but reverses its curvature, so a blade still accelerating at puck strike reads low by
//   β₂·a, β₂ = Σ wₖ(tₖ − t_end)²/2 over the velocity weights (exactly 0 for the pure slope) and a the
//   acceleration at the end, from a cubic fitted to the last half cutoff-period of marks.

/** Estimated bias at most this share of the digitising uncertainty. */
export const BIAS_TO_NOISE = 0.15;

export interface ResultCutoff {
  cutoffHz: number;
  /** Estimated bias of the result at that cutoff (result − truth), in the result's unit. */
  bias: number;
  /** Standard uncertainty of the result from digitising alone at that cutoff. */
  noiseU: number;
}

/** Highest cutoff the search may reach for a track sampled at fsHz. */
const topCutoff = (fsHz: number) => 0.9 * maxWantedCutoff(fsHz);

/**
 * A result's estimated smoothing bias and digitising uncertainty when read at cutoff fc (null:
 * cannot be read); `topHz` the highest cutoff to try; how bias and uncertainty change as the
 * cutoff rises: bias ∝ fc^−biasExponent, u ∝ fc^noiseExponent.
 */
export type BiasJudge = ((fcHz: number) => { bias: number; noiseU: number } | null) & { topHz: number; biasExponent: number; noiseExponent: number };

/**
 * The cutoff at which the result's bias is BIAS_TO_NOISE of its uncertainty, from `from` upwards.
 * The bias is measured at `from`, where it is largest and its estimate is mostly signal, and carried
 * up along its power law, both to choose the cutoff and as the bias left there. (Measured again at
 * the higher cutoff, the estimate is mostly the digitising noise itself — a noise spike at the
 * peak is what a second smoothing flattens — and would widen the interval on the wrong side.)
 */
export function undersmooth(from: number, judge: BiasJudge): ResultCutoff | null {
  const top = judge.topHz;
  const fc = Math.min(from, top);
  const first = judge(fc);
  if (!first) return null;
  const ratio = Math.abs(first.bias) / (BIAS_TO_NOISE * first.noiseU);
  if (!(ratio > 1) || fc >= top) return { cutoffHz: fc, ...first };
  const next = Math.min(top, fc * ratio ** (1 / (judge.biasExponent + judge.noiseExponent)));
  const j = judge(next);
  return j ? { cutoffHz: next, noiseU: j.noiseU, bias: first.bias * (fc / next) ** judge.biasExponent } : { cutoffHz: fc, ...first };
}

/** Margin, in frames, beyond which smoothing twice at fc no longer reaches (twice its padding). */
function margin(fcHz: number, seg: { fsHz: number; step: number }): number {
  return 2 * endPadLength(zeroLagDesignCached(fcHz, seg.fsHz)) * seg.step;
}

/** 2×2 covariance (xx, xy, yy) of a weighted sum of marks, from digitising noise σ px per coordinate. */
function covarianceOf(src: Source, offset: number, seg: GridSegment, w: Float64Array, cal: CalibrationMap, sigmaPx: number): [number, number, number] {
  const c: [number, number, number] = [0, 0, 0];
  const share = 1 / src.parts.length;
  for (let k = 0; k < w.length; k++) {
    if (w[k] === 0) continue;
    for (const part of src.parts) {
      const m = offset + seg.i0 + k;
      const [j00, j01, j10, j11] = cal.jacobian([part.x[m], part.y[m]]);
      const f = (sigmaPx * w[k] * share) ** 2;
      c[0] += f * (j00 * j00 + j01 * j01);
      c[1] += f * (j00 * j10 + j01 * j11);
      c[2] += f * (j10 * j10 + j11 * j11);
    }
  }
  return c;
}

/** Variance of g·p for a 2-vector g and covariance c. */
const quad = (g: [number, number], c: [number, number, number]) => g[0] * g[0] * c[0] + 2 * g[0] * g[1] * c[1] + g[1] * g[1] * c[2];

export interface StickInput {
  src: Source;
  world: WorldTrack;
}

/** The smoothed piece of a windowed track, smoothed once more (positions only). */
function smoothAgain(s: SmoothSegment, fcHz: number): { sx: Float64Array; sy: Float64Array } {
  if (s.cutoffHz === null || s.x.length < 3) return { sx: s.sx, sy: s.sy };
  const [sx, sy] = zeroLagLowPassPair(s.sx, s.sy, fcHz, s.fsHz);
  return { sx, sy };
}

/**
 * The peak bend between `from` and `to` read from the stick (top hand, bottom hand, blade heel)
 * smoothed at fc: its twicing bias and digitising uncertainty. Only the marks around the window
 * are smoothed (the filter's memory is shorter than the margin).
 */
export function peakBendJudge(stick: [StickInput, StickInput, StickInput], from: number, to: number, cal: CalibrationMap, sigmaPx: number, fps: number, time: TimeBase): BiasJudge {
  // Each landmark's grid step, from its whole track (once: the judge is asked at two cutoffs).
  const firsts = stick.map(({ world }) => gridSegments(world, [], ["whole"], fps, undefined, time)[0]);
  const judge = (fc: number) => {
    const pieces = stick.map(({ src, world }, k) => {
      const first = firsts[k];
      if (!first) return null;
      const m = margin(fc, first);
      const { track, offset } = marksBetween(world, from - m, to + m);
      const seg = gridSegments(track, [], ["whole"], fps, first.step, time)[0];
      return seg ? { src, offset, s: smoothSegment(seg, fc) } : null;
    });
    if (pieces.some((p) => !p)) return null;
    const [T, B, H] = pieces as { src: Source; offset: number; s: SmoothSegment }[];
    // The peak frame from the twice-smoothed marks (chosen by the motion, not by a noise spike),
    // the bias there: bend(S²x) − bend(Sx).
    const again = [T, B, H].map((p) => smoothAgain(p.s, fc));
    let best: { f: number; twice: number; idx: [number, number, number] } | null = null;
    for (let i = 0; i < H.s.frames.length; i++) {
      const f = H.s.frames[i];
      if (f < from || f > to || !H.s.marked[i]) continue;
      const it = gridIndex(T.s, f);
      const ib = gridIndex(B.s, f);
      if (it < 0 || ib < 0 || !T.s.marked[it] || !B.s.marked[ib]) continue;
      const twice = bendAngleDeg([again[0].sx[it], again[0].sy[it]], [again[1].sx[ib], again[1].sy[ib]], [again[2].sx[i], again[2].sy[i]]);
      if (!best || twice > best.twice) best = { f, twice, idx: [it, ib, i] };
    }
    if (!best) return null;
    const peak = best;
    const pts = [T, B, H].map((p, k) => [p.s.sx[peak.idx[k]], p.s.sy[peak.idx[k]]] as [number, number]);
    const bias = peak.twice - bendAngleDeg(pts[0], pts[1], pts[2]);
    // Digitising uncertainty of the angle: its gradient in each landmark's position (central
    // differences, 1e-3 mm) against that position's covariance through the smoothing.
    let variance = 0;
    [T, B, H].forEach((p, k) => {
      const { pos } = stateWeights(p.s, peak.idx[k]);
      const c = covarianceOf(p.src, p.offset, p.s, pos, cal, sigmaPx);
      const g: [number, number] = [0, 0];
      for (const d of [0, 1] as const) {
        const plus = pts.map((q) => [...q] as [number, number]);
        const minus = pts.map((q) => [...q] as [number, number]);
        plus[k][d] += 1e-3;
        minus[k][d] -= 1e-3;
        g[d] = (bendAngleDeg(plus[0], plus[1], plus[2]) - bendAngleDeg(minus[0], minus[1], minus[2])) / 2e-3;
      }
      variance += quad(g, c);
    });
    return { bias, noiseU: Math.sqrt(variance) };
  };
  const fs = fps / (firsts[0]?.step ?? 1);
  // Interior bias of the 4th-order zero-lag filter ∝ fc^−4; a position's noise ∝ fc^½.
  return Object.assign(judge, { topHz: topCutoff(fs), biasExponent: 4, noiseExponent: 0.5 });
}

/** Motion at the end of a track from a cubic fitted to its last marks: acceleration (mm/s²) and jerk (mm/s³) per axis. */
export interface EndMotion {
  accel: [number, number];
  jerk: [number, number];
}

/** A cubic least-squares fit to the marks against their capture times, read at the last mark. */
function endCurvature(track: WorldTrack, time: TimeBase): EndMotion | null {
  const n = track.frames.length;
  if (n < 5) return null;
  const tEnd = time.t(track.frames[n - 1]);
  const span = tEnd - time.t(track.frames[0]) || 1;
  const A = new Matrix(n, 4);
  for (let i = 0; i < n; i++) {
    const t = (time.t(track.frames[i]) - tEnd) / span;
    for (let p = 0; p < 4; p++) A.set(i, p, t ** p);
  }
  const cx = solve(A, Matrix.columnVector(Array.from(track.x)));
  const cy = solve(A, Matrix.columnVector(Array.from(track.y)));
  return {
    accel: [(2 * cx.get(2, 0)) / span ** 2, (2 * cy.get(2, 0)) / span ** 2],
    jerk: [(6 * cx.get(3, 0)) / span ** 3, (6 * cy.get(3, 0)) / span ** 3],
  };
}

/**
 * Acceleration and jerk at frame `end` of a track: a cubic fitted over the marks of one period of
 * `f0` (the residual-analysis cutoff: the motion's own time scale) up to `end`, at least 8 marks.
 */
export function endMotion(world: WorldTrack, end: number, f0: number, fps: number, time: TimeBase): EndMotion | null {
  const upTo = marksBetween(world, -Infinity, end).track;
  const n = upTo.frames.length;
  if (n < 8) return null;
  const from = Math.min(upTo.frames[n - 8], end - Math.round(fps / f0));
  return endCurvature(marksBetween(upTo, from, end).track, time);
}

/**
 * The blade's speed at the end of its approach read at cutoff fc: its end-padding bias and
 * digitising uncertainty. `world` holds the blade's marks up to puck strike; the acceleration is
 * fitted over half a period of `f0`, the cutoff residual analysis gave.
 */
export function bladeEndJudge(src: Source, world: WorldTrack, f0: number, cal: CalibrationMap, sigmaPx: number, fps: number, time: TimeBase): BiasJudge | null {
  const whole = gridSegments(world, [], ["beforeStrike"], fps, undefined, time)[0];
  if (!whole || world.frames.length < 3) return null;
  const last = world.frames[world.frames.length - 1];
  const curv = endMotion(world, last, f0, fps, time)?.accel;
  const judge = (fc: number) => {
    const { track, offset } = marksBetween(world, last - margin(fc, whole), last);
    const seg = gridSegments(track, [], ["beforeStrike"], fps, whole.step, time)[0];
    if (!seg || seg.frames.length < 3) return null;
    const s = smoothSegment(seg, fc);
    const i = s.frames.length - 1;
    const [vx, vy] = velocityAt(s, i);
    const speed = hypot(vx, vy);
    const dir: [number, number] = speed > 0 ? [vx / speed, vy / speed] : [1, 0];
    const { vel } = stateWeights(s, i);
    if (!vel) return null;
    const noiseU = Math.sqrt(quad(dir, covarianceOf(src, offset, s, vel, cal, sigmaPx)));
    // β₂ over the marks: Σ w (t − t_end)²/2, t in s; with a in mm/s² the product is in m/s.
    let beta = 0;
    const tLast = time.t(last);
    for (let k = 0; k < vel.length; k++) beta += (vel[k] * (time.t(track.frames[seg.i0 + k]) - tLast) ** 2) / 2;
    const bias = curv ? beta * (curv[0] * dir[0] + curv[1] * dir[1]) : 0;
    return { bias, noiseU };
  };
  // β₂ ∝ 1/fc; an end velocity's noise ∝ fc^1.5.
  return Object.assign(judge, { topHz: topCutoff(whole.fsHz), biasExponent: 1, noiseExponent: 1.5 });
}
