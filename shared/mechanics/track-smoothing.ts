import type { SegmentLabel } from "../schemas/shot-results";
import { zeroLagLowPassPair } from "./butterworth";
import { hypot } from "./hypot";
import { rateTimeBase, type TimeBase } from "./time-base";

// Tracks are cut at the impact frames (never filtered across puck strike), put on a uniform frame
// grid (gaps bridged by straight lines in time), smoothed, and differentiated against each
// sample's own capture time (the frame clock, which is uniform unless the clip's timing is not).

/** One landmark's marks in world mm, sorted by frame, no repeats. */
export interface WorldTrack {
  frames: Int32Array;
  x: Float64Array;
  y: Float64Array;
}

/** A piece of a track between cuts; "whole" for a track smoothed through the impacts (the stick's landmarks). */
export type PieceLabel = SegmentLabel | "whole";

export interface GridSegment {
  label: PieceLabel;
  /** Frames between grid samples: the greatest common divisor of the marked frame gaps. */
  step: number;
  fsHz: number;
  frames: Int32Array;
  /** Capture time of each grid sample, seconds. */
  tS: Float64Array;
  x: Float64Array;
  y: Float64Array;
  marked: Uint8Array;
  /** Grid samples filled by straight lines, and the longest unmarked run in frames. */
  filled: number;
  longestGapFrames: number;
  /** The marks it holds: indices i0 … i1 − 1 of the track it was cut from. */
  i0: number;
  i1: number;
}

export interface SmoothSegment extends GridSegment {
  /** Smoothed position, mm. */
  sx: Float64Array;
  sy: Float64Array;
  // Velocities are read where needed (velocityAt): most samples' never are.
  cutoffHz: number | null;
}

function gcd(a: number, b: number): number {
  while (b) {
    const r = a % b;
    a = b;
    b = r;
  }
  return a;
}

/**
 * Cut at `splits` (ascending frames; a split frame belongs to both sides, the position being
 * continuous there) and grid each piece. labels.length === splits.length + 1; empty pieces are dropped.
 */
export function gridSegments(
  track: WorldTrack,
  splits: number[],
  labels: PieceLabel[],
  captureFps: number,
  step?: number,
  time: TimeBase = rateTimeBase(captureFps),
): GridSegment[] {
  // The same track is gridded alike by the cutoff search, the bias judges and the smoothing: once.
  const key = `${splits.join(",")}|${labels.join(",")}|${captureFps}|${step}`;
  let memo = gridMemo.get(track);
  const hit = memo?.find((m) => m.key === key && m.time === time);
  if (hit) return hit.grids;
  const out: GridSegment[] = [];
  const n = track.frames.length;
  for (let s = 0; s <= splits.length; s++) {
    const from = s === 0 ? -Infinity : splits[s - 1];
    const to = s === splits.length ? Infinity : splits[s];
    let i0 = 0;
    while (i0 < n && track.frames[i0] < from) i0++;
    let i1 = i0;
    while (i1 < n && track.frames[i1] <= to) i1++;
    if (i1 === i0) continue;
    out.push(gridPiece(track, i0, i1, labels[s], captureFps, time, step));
  }
  if (!memo) gridMemo.set(track, (memo = []));
  if (memo.length >= 8) memo.shift();
  memo.push({ key, time, grids: out });
  return out;
}

/** Grids already made of a track (they are never written to: smoothing makes new arrays). */
const gridMemo = new WeakMap<WorldTrack, { key: string; time: TimeBase; grids: GridSegment[] }[]>();

/** `wanted` (a part of a longer track keeps that track's grid) is used when it divides every gap. */
function gridPiece(t: WorldTrack, i0: number, i1: number, label: PieceLabel, captureFps: number, time: TimeBase, wanted?: number): GridSegment {
  let step = 0;
  for (let i = i0 + 1; i < i1 && step !== 1; i++) step = gcd(step, t.frames[i] - t.frames[i - 1]);
  if (step === 0) step = wanted ?? 1;
  else if (wanted && step % wanted === 0) step = wanted;
  const f0 = t.frames[i0];
  const len = (t.frames[i1 - 1] - f0) / step + 1;
  const fsHz = captureFps / step;
  if (len === i1 - i0) {
    // No gap: the grid is the marks themselves (views; grids are never written to).
    const frames = t.frames.subarray(i0, i1);
    const tS = new Float64Array(len);
    for (let k = 0; k < len; k++) tS[k] = time.t(frames[k]);
    const marked = new Uint8Array(len).fill(1);
    return { label, step, fsHz, frames, tS, x: t.x.subarray(i0, i1), y: t.y.subarray(i0, i1), marked, filled: 0, longestGapFrames: 0, i0, i1 };
  }
  const frames = new Int32Array(len);
  const tS = new Float64Array(len);
  const x = new Float64Array(len);
  const y = new Float64Array(len);
  const marked = new Uint8Array(len);
  let longestGap = 0;
  for (let i = i0; i < i1; i++) {
    const g = (t.frames[i] - f0) / step;
    frames[g] = t.frames[i];
    x[g] = t.x[i];
    y[g] = t.y[i];
    marked[g] = 1;
    if (i + 1 < i1) {
      const gn = (t.frames[i + 1] - f0) / step;
      if (gn - g === 1) continue;
      longestGap = Math.max(longestGap, (gn - g - 1) * step);
      const ta = time.t(t.frames[i]);
      const tb = time.t(t.frames[i + 1]);
      for (let k = g + 1; k < gn; k++) {
        frames[k] = f0 + k * step;
        const u = (time.t(frames[k]) - ta) / (tb - ta);
        x[k] = t.x[i] + u * (t.x[i + 1] - t.x[i]);
        y[k] = t.y[i] + u * (t.y[i + 1] - t.y[i]);
      }
    }
  }
  for (let k = 0; k < len; k++) tS[k] = time.t(frames[k]);
  return { label, step, fsHz, frames, tS, x, y, marked, filled: len - (i1 - i0), longestGapFrames: longestGap, i0, i1 };
}

/**
 * Weights of d/dt at sample i over samples `from`, `from + 1`, … (two or three of them), for
 * samples at times t: numpy.gradient's second-order formulas on a coordinate array (central
 * differences inside, one-sided at the ends), which on a uniform grid are (−½, 0, ½)/h etc.
 */
export function gradientWeights(t: ArrayLike<number>, i: number): { from: number; w: number[] } {
  const n = t.length;
  if (n === 2) {
    const h = t[1] - t[0];
    return { from: 0, w: [-1 / h, 1 / h] };
  }
  if (i === 0) {
    const d1 = t[1] - t[0];
    const d2 = t[2] - t[1];
    return { from: 0, w: [-(2 * d1 + d2) / (d1 * (d1 + d2)), (d1 + d2) / (d1 * d2), -d1 / (d2 * (d1 + d2))] };
  }
  if (i === n - 1) {
    const d1 = t[n - 2] - t[n - 3];
    const d2 = t[n - 1] - t[n - 2];
    return { from: n - 3, w: [d2 / (d1 * (d1 + d2)), -(d1 + d2) / (d1 * d2), (2 * d2 + d1) / (d2 * (d1 + d2))] };
  }
  const hs = t[i] - t[i - 1];
  const hd = t[i + 1] - t[i];
  return { from: i - 1, w: [-hd / (hs * (hs + hd)), (hd - hs) / (hs * hd), hs / (hd * (hs + hd))] };
}

/** w0·v[a] + w1·v[a+1] + w2·v[a+2] in that order, mm/s → m/s. */
function weighted3(v: ArrayLike<number>, a: number, w0: number, w1: number, w2: number): number {
  let d = w0 * v[a];
  d += w1 * v[a + 1];
  d += w2 * v[a + 2];
  return d / 1000;
}

/** d/dt at sample i of x (and of y, when given) into `out`: numpy.gradient's weights, computed once for both. */
function derivativesAt(x: ArrayLike<number>, y: ArrayLike<number> | null, tS: ArrayLike<number>, i: number, out: Float64Array): void {
  const n = x.length;
  if (n === 1) {
    out[0] = out[1] = NaN;
    return;
  }
  if (n === 2) {
    const h = tS[1] - tS[0];
    let d = (-1 / h) * x[0];
    d += (1 / h) * x[1];
    out[0] = d / 1000;
    if (y) {
      let e = (-1 / h) * y[0];
      e += (1 / h) * y[1];
      out[1] = e / 1000;
    }
    return;
  }
  let a: number;
  let w0: number;
  let w1: number;
  let w2: number;
  if (i === 0) {
    const d1 = tS[1] - tS[0];
    const d2 = tS[2] - tS[1];
    a = 0;
    w0 = -(2 * d1 + d2) / (d1 * (d1 + d2));
    w1 = (d1 + d2) / (d1 * d2);
    w2 = -d1 / (d2 * (d1 + d2));
  } else if (i === n - 1) {
    const d1 = tS[n - 2] - tS[n - 3];
    const d2 = tS[n - 1] - tS[n - 2];
    a = n - 3;
    w0 = d2 / (d1 * (d1 + d2));
    w1 = -(d1 + d2) / (d1 * d2);
    w2 = (2 * d2 + d1) / (d2 * (d1 + d2));
  } else {
    const hs = tS[i] - tS[i - 1];
    const hd = tS[i + 1] - tS[i];
    a = i - 1;
    w0 = -hd / (hs * (hs + hd));
    w1 = (hd - hs) / (hs * hd);
    w2 = hs / (hd * (hs + hd));
  }
  out[0] = weighted3(x, a, w0, w1, w2);
  if (y) out[1] = weighted3(y, a, w0, w1, w2);
}

const scratch2 = new Float64Array(2);

/**
 * d/dt at sample i like numpy.gradient(v, t, edge_order=2)[i]; values in mm, times in s, result
 * in m/s. The weights of gradientWeights written out in place (the same arithmetic, no object per
 * sample). NaN for one sample.
 */
export function derivativeAt(v: ArrayLike<number>, tS: ArrayLike<number>, i: number): number {
  derivativesAt(v, null, tS, i, scratch2);
  return scratch2[0];
}

/** Speed (m/s) of a smoothed piece at grid index i, √(vx² + vy²) with the weights computed once: the series run this on every sample. */
export function speedAt(s: SmoothSegment, i: number): number {
  derivativesAt(s.sx, s.sy, s.tS, i, scratch2);
  return hypot(scratch2[0], scratch2[1]);
}

/** d/dt of every sample, like numpy.gradient(v, t, edge_order=2) (derivativeAt at each). */
export function gradientMps(v: Float64Array, tS: ArrayLike<number>): Float64Array {
  const out = new Float64Array(v.length);
  for (let i = 0; i < v.length; i++) out[i] = derivativeAt(v, tS, i);
  return out;
}

/** Velocity (m/s) of a smoothed piece at grid index i: NaN for a one-sample piece. */
export function velocityAt(s: SmoothSegment, i: number): [vx: number, vy: number] {
  derivativesAt(s.sx, s.sy, s.tS, i, scratch2);
  return [scratch2[0], scratch2[1]];
}

/** Smooth a grid segment at cutoffHz (null = raw); velocityAt differentiates it against the samples' times. */
export function smoothSegment(seg: GridSegment, cutoffHz: number | null): SmoothSegment {
  let sx = seg.x;
  let sy = seg.y;
  if (cutoffHz !== null && seg.x.length >= 3) {
    [sx, sy] = zeroLagLowPassPair(seg.x, seg.y, cutoffHz, seg.fsHz);
  }
  return { ...seg, sx, sy, cutoffHz };
}

/** Index of `frame` on the segment's grid, or −1. */
export function gridIndex(seg: GridSegment, frame: number): number {
  const g = (frame - seg.frames[0]) / seg.step;
  return Number.isInteger(g) && g >= 0 && g < seg.frames.length ? g : -1;
}

/**
 * The part of a piece between grid samples near a and b, widened to the nearest marked samples so
 * it is a piece of its own (its i0/i1 name the marks it holds); `offset` is its first sample's
 * index in `seg`. Smoothed fields, when present, are cut alike.
 */
export function subSegment<T extends GridSegment>(seg: T, a: number, b: number): { sub: T; offset: number } {
  a = Math.max(0, a);
  b = Math.min(seg.frames.length - 1, b);
  while (a > 0 && !seg.marked[a]) a--;
  while (b < seg.frames.length - 1 && !seg.marked[b]) b++;
  let i0 = seg.i0;
  for (let k = 0; k < a; k++) if (seg.marked[k]) i0++;
  let marks = 0;
  for (let k = a; k <= b; k++) if (seg.marked[k]) marks++;
  const cut = <A extends Float64Array | Int32Array | Uint8Array>(v: A) => v.subarray(a, b + 1) as A;
  const sub = { ...seg, frames: cut(seg.frames), tS: cut(seg.tS), x: cut(seg.x), y: cut(seg.y), marked: cut(seg.marked), i0, i1: i0 + marks } as T;
  const sm = seg as unknown as Partial<SmoothSegment>;
  if (sm.sx && sm.sy) Object.assign(sub, { sx: cut(sm.sx), sy: cut(sm.sy) });
  return { sub, offset: a };
}

/** First index with frame ≥ f. */
export function lowerBound(frames: Int32Array, f: number): number {
  let lo = 0;
  let hi = frames.length;
  while (lo < hi) {
    const m = (lo + hi) >> 1;
    if (frames[m] < f) lo = m + 1;
    else hi = m;
  }
  return lo;
}

/** The track's marks with frames in [from, to] (views, no copy) and the index of the first. */
export function marksBetween(world: WorldTrack, from: number, to: number): { track: WorldTrack; offset: number } {
  const a = lowerBound(world.frames, from);
  const b = lowerBound(world.frames, to + 1);
  return { track: { frames: world.frames.subarray(a, b), x: world.x.subarray(a, b), y: world.y.subarray(a, b) }, offset: a };
}
