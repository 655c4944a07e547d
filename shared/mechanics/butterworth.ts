import Fili from "fili";
import { hypot } from "./hypot";

// Zero-lag Butterworth low-pass: a 2nd-order section run forward and backward (Winter,
// Biomechanics and Motor Control of Human Movement, 4th ed.). Coefficients come from fili;
// the two passes and their end treatment follow scipy.signal.filtfilt (method "pad", odd
// extension, lfilter_zi start) because fili's own filtfilt has neither. The engine pads longer
// than scipy's default (see `endPadLength`) — docs/decisions/010-zero-lag-filter.md.

export interface Biquad {
  b0: number;
  b1: number;
  b2: number;
  a1: number;
  a2: number;
}

/** Cutoff correction for a 2nd-order filter run twice: C = (2^(1/2) − 1)^(1/4) ≈ 0.802 (Winter). */
export const TWO_PASS_CORRECTION = Math.pow(Math.SQRT2 - 1, 1 / 4);

/** scipy.signal.filtfilt's default pad length: 3 · max(len(a), len(b)) = 9 for a biquad. */
export const FILTFILT_PADLEN = 9;

const cascades = new Fili.CalcCascades();

/** Single-pass 2nd-order Butterworth low-pass at fcHz (−3 dB), sampling fsHz. */
export function butterLowPass(fcHz: number, fsHz: number): Biquad {
  if (!(fcHz > 0 && fcHz < fsHz / 2)) throw new RangeError(`cutoff ${fcHz} Hz must lie between 0 and half the sampling rate (${fsHz / 2} Hz)`);
  const [c] = cascades.lowpass({ order: 1, characteristic: "butterworth", Fs: fsHz, Fc: fcHz, preGain: false });
  return { b0: c.b[0], b1: c.b[1], b2: c.b[2], a1: c.a[0], a2: c.a[1] };
}

/**
 * The single-pass design cutoff that makes the two-pass filter −3 dB at `wantedHz`:
 * the correction is applied to the pre-warped frequency, ω_d = tan(π f / fs) / C.
 */
export function twoPassDesignCutoff(wantedHz: number, fsHz: number): number {
  const wd = Math.tan((Math.PI * wantedHz) / fsHz) / TWO_PASS_CORRECTION;
  return (fsHz / Math.PI) * Math.atan(wd);
}

/** Highest wanted cutoff whose two-pass design still lies below `fraction` of the Nyquist rate. */
export function maxWantedCutoff(fsHz: number, fraction = 0.98): number {
  const designLimit = (fraction * fsHz) / 2;
  return (fsHz / Math.PI) * Math.atan(TWO_PASS_CORRECTION * Math.tan((Math.PI * designLimit) / fsHz));
}

/** Biquad whose forward–backward run is −3 dB at wantedHz. */
export function zeroLagDesign(wantedHz: number, fsHz: number): Biquad {
  return butterLowPass(twoPassDesignCutoff(wantedHz, fsHz), fsHz);
}

/** Steady-state initial conditions for a unit step, as scipy.signal.lfilter_zi. */
export function lfilterZi(q: Biquad): [number, number] {
  const B0 = q.b1 - q.a1 * q.b0;
  const B1 = q.b2 - q.a2 * q.b0;
  const z0 = (B0 + B1) / (1 + q.a1 + q.a2);
  return [z0, B1 - q.a2 * z0];
}

/** In-place direct-form-II-transposed pass over buf, forward or backward, from state zi·buf[start]. */
function pass(q: Biquad, buf: Float64Array, zi: [number, number], backward: boolean): void {
  const n = buf.length;
  const { b0, b1, b2, a1, a2 } = q;
  const first = backward ? buf[n - 1] : buf[0];
  let z0 = zi[0] * first;
  let z1 = zi[1] * first;
  const step = backward ? -1 : 1;
  for (let k = 0, i = backward ? n - 1 : 0; k < n; k++, i += step) {
    const x = buf[i];
    const y = b0 * x + z0;
    z0 = b1 * x - a1 * y + z1;
    z1 = b2 * x - a2 * y;
    buf[i] = y;
  }
}

/** One pass over buf from rest (zero state): the building block of impulse responses and adjoints. */
export function passFromRest(q: Biquad, buf: Float64Array, backward: boolean): void {
  pass(q, buf, [0, 0], backward);
}

/** passFromRest over two buffers of one length, side by side. */
export function passPairFromRest(q: Biquad, a: Float64Array, b: Float64Array, backward: boolean): void {
  passPair(q, a, b, [0, 0], backward);
}

/**
 * `pass` over two buffers of one length at once. Each recurrence waits on its own previous output,
 * so two run side by side take little longer than one; the arithmetic of each is `pass`'s exactly.
 */
function passPair(q: Biquad, bx: Float64Array, by: Float64Array, zi: [number, number], backward: boolean): void {
  const n = bx.length;
  const { b0, b1, b2, a1, a2 } = q;
  const fx = backward ? bx[n - 1] : bx[0];
  const fy = backward ? by[n - 1] : by[0];
  let z0 = zi[0] * fx;
  let z1 = zi[1] * fx;
  let w0 = zi[0] * fy;
  let w1 = zi[1] * fy;
  const step = backward ? -1 : 1;
  for (let k = 0, i = backward ? n - 1 : 0; k < n; k++, i += step) {
    const x = bx[i];
    const y = b0 * x + z0;
    z0 = b1 * x - a1 * y + z1;
    z1 = b2 * x - a2 * y;
    bx[i] = y;
    const u = by[i];
    const v = b0 * u + w0;
    w0 = b1 * u - a1 * v + w1;
    w1 = b2 * u - a2 * v;
    by[i] = v;
  }
}

/** Shared scratch buffers for the padded signals (two, for a pair of coordinates). */
const scratch = [new Float64Array(1024), new Float64Array(1024)];

/** x with an odd extension of p samples each side, in scratch buffer `which`. */
function oddExtension(x: ArrayLike<number>, p: number, which: 0 | 1): Float64Array {
  const n = x.length;
  const len = n + 2 * p;
  if (scratch[which].length < len) scratch[which] = new Float64Array(Math.max(len, 2 * scratch[which].length));
  const ext = scratch[which].subarray(0, len);
  const x0 = x[0];
  const xn = x[n - 1];
  for (let i = 0; i < p; i++) ext[i] = 2 * x0 - x[p - i];
  for (let i = 0; i < n; i++) ext[p + i] = x[i];
  for (let i = 0; i < p; i++) ext[p + n + i] = 2 * xn - x[n - 2 - i];
  return ext;
}

/** Odd extension by p samples each side followed by both passes, in a shared scratch buffer. */
function runFiltfilt(q: Biquad, x: ArrayLike<number>, p: number): Float64Array {
  const ext = oddExtension(x, p, 0);
  const zi = lfilterZi(q);
  pass(q, ext, zi, false);
  pass(q, ext, zi, true);
  return ext.subarray(p, p + x.length);
}

/** runFiltfilt of two signals of one length (a track's x and y), side by side. */
function runFiltfiltPair(q: Biquad, x: ArrayLike<number>, y: ArrayLike<number>, p: number): [Float64Array, Float64Array] {
  const ex = oddExtension(x, p, 0);
  const ey = oddExtension(y, p, 1);
  const zi = lfilterZi(q);
  passPair(q, ex, ey, zi, false);
  passPair(q, ex, ey, zi, true);
  return [ex.subarray(p, p + x.length), ey.subarray(p, p + y.length)];
}

/**
 * Forward–backward filtering as scipy.signal.filtfilt(b, a, x, padlen=padlen) with padtype "odd"
 * (default padlen 9, scipy's). Shorter signals (scipy refuses them) use padlen = n − 1; n < 2 is
 * returned as is.
 */
export function filtfilt(q: Biquad, x: ArrayLike<number>, padlen = FILTFILT_PADLEN): Float64Array {
  const n = x.length;
  if (n < 2) return Float64Array.from(x);
  return runFiltfilt(q, x, Math.min(padlen, n - 1)).slice();
}

/** filtfilt of two signals of one length, side by side (the same results as one after the other). */
export function filtfiltPair(q: Biquad, x: ArrayLike<number>, y: ArrayLike<number>, padlen = FILTFILT_PADLEN): [Float64Array, Float64Array] {
  const n = x.length;
  if (y.length !== n) throw new RangeError(`a pair of signals must have one length (got ${n} and ${y.length})`);
  if (n < 2) return [Float64Array.from(x), Float64Array.from(y)];
  const [fx, fy] = runFiltfiltPair(q, x, y, Math.min(padlen, n - 1));
  return [fx.slice(), fy.slice()];
}

function residualSS(x: ArrayLike<number>, y: Float64Array, skip: number): number {
  let ss = 0;
  for (let i = skip; i < x.length - skip; i++) ss += (x[i] - y[i]) ** 2;
  return ss;
}

/**
 * Σ (x − filtfilt(x))² over samples skip … n − 1 − skip, without keeping the filtered copy
 * (residual analysis runs this often).
 */
export function filtfiltResidualSS(q: Biquad, x: ArrayLike<number>, padlen = FILTFILT_PADLEN, skip = 0): number {
  const n = x.length;
  if (n < 2) return 0;
  return residualSS(x, runFiltfilt(q, x, Math.min(padlen, n - 1)), skip);
}

/** filtfiltResidualSS of two signals of one length, side by side. */
export function filtfiltResidualSSPair(q: Biquad, x: ArrayLike<number>, y: ArrayLike<number>, padlen = FILTFILT_PADLEN, skip = 0): [number, number] {
  const n = x.length;
  if (y.length !== n) throw new RangeError(`a pair of signals must have one length (got ${n} and ${y.length})`);
  if (n < 2) return [0, 0];
  const [fx, fy] = runFiltfiltPair(q, x, y, Math.min(padlen, n - 1));
  return [residualSS(x, fx, skip), residualSS(y, fy, skip)];
}

/** Magnitude of the single-pass response at fHz (for checking the −3 dB point). */
export function biquadGain(q: Biquad, fHz: number, fsHz: number): number {
  const w = (2 * Math.PI * fHz) / fsHz;
  const re = (c0: number, c1: number, c2: number) => c0 + c1 * Math.cos(w) + c2 * Math.cos(2 * w);
  const im = (c1: number, c2: number) => -(c1 * Math.sin(w) + c2 * Math.sin(2 * w));
  const num = hypot(re(q.b0, q.b1, q.b2), im(q.b1, q.b2));
  const den = hypot(re(1, q.a1, q.a2), im(q.a1, q.a2));
  return num / den;
}

/** How far the filter's memory must decay before the data's end no longer feels the pad's start. */
export const END_PAD_DECAY = 1e-6;

/**
 * Odd-extension length the engine uses: scipy's default 9 is far shorter than the filter's memory
 * at low cutoffs (and near Nyquist), and the start-up transient then bends the ends of a moving
 * track — a blade at 22 m/s read 7.7 m/s at the end of its piece with a 50 Hz cutoff at 3,200 fps.
 * Padding until the poles' decay (radius √a2 per sample) reaches END_PAD_DECAY removes that.
 */
export function endPadLength(q: Biquad): number {
  const r = Math.sqrt(Math.abs(q.a2));
  return r > 0 && r < 1 ? Math.max(FILTFILT_PADLEN, Math.ceil(Math.log(END_PAD_DECAY) / Math.log(r))) : FILTFILT_PADLEN;
}

const designs = new Map<string, Biquad>();

/** zeroLagDesign, memoised: the Monte Carlo trials ask for the same few designs many times. */
export function zeroLagDesignCached(wantedHz: number, fsHz: number): Biquad {
  const key = `${wantedHz}/${fsHz}`;
  let q = designs.get(key);
  if (!q) {
    if (designs.size > 256) designs.clear();
    q = zeroLagDesign(wantedHz, fsHz);
    designs.set(key, q);
  }
  return q;
}

/** The engine's zero-lag low-pass: −3 dB at wantedHz after both passes, padded by endPadLength. */
export function zeroLagLowPass(x: ArrayLike<number>, wantedHz: number, fsHz: number): Float64Array {
  const q = zeroLagDesignCached(wantedHz, fsHz);
  return filtfilt(q, x, endPadLength(q));
}

/** zeroLagLowPass of a track's two coordinates, side by side (the same results, in about half the time). */
export function zeroLagLowPassPair(x: ArrayLike<number>, y: ArrayLike<number>, wantedHz: number, fsHz: number): [Float64Array, Float64Array] {
  const q = zeroLagDesignCached(wantedHz, fsHz);
  return filtfiltPair(q, x, y, endPadLength(q));
}
