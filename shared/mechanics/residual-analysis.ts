import { endPadLength, filtfiltResidualSS, filtfiltResidualSSPair, passFromRest, zeroLagDesignCached, type Biquad } from "./butterworth";

// Cutoff choice by residual analysis (Winter, Biomechanics and Motor Control of Human Movement,
// 4th ed., Wiley 2009): R(fc), the RMS difference between raw and filtered data, is pure noise at
// high cutoffs; the noise level read there tells where the signal ends and the noise begins.
//
// Two changes make it hold at high capture rates (docs/decisions/140-cutoff-and-smoothing-bias.md):
// - Noise level. White noise of variance σ² leaves R²(fc) = σ²·ρ(fc), ρ the residual share of a
//   linear smoother (E‖(I − S)e‖² = σ²·tr((I − S)ᵀ(I − S)); Buja, Hastie & Tibshirani, Ann Stat
//   17:453–555, 1989). Winter reads σ off a straight line through the high-cutoff part of R at
//   fc = 0: a secant of a concave curve, 10–25 % high. Here σ² is the least-squares fit of
//   R² = σ²·ρ over that region, with ρ exact for the filter.
// - Crossing. Winter's cutoff, R(fc) = σ, lets through as much noise as it removes signal: at
//   3,200 fps the filter passes only a few per cent of the noise, and a 5 % error in σ (one noise
//   draw's own scatter) moved the cutoff 2–4×. Instead the cutoff is where the residual removed
//   between fc and 2·fc is at most twice what noise alone removes there: where the signal's
//   spectrum meets the noise floor, judged on one octave, which stays put between draws.
// Residuals are summed away from the ends of each piece, where the end padding (not the noise)
// shapes them; ρ is then the interior share, in closed form from the filter's response.

/** Uniformly sampled coordinate series of one landmark (one array per coordinate and segment). */
export interface ResidualSeries {
  fsHz: number;
  values: Float64Array;
}

export interface CutoffChoice {
  cutoffHz: number;
  /** Estimated noise RMS in the units of the data. */
  noiseRms: number;
}

/** Segments shorter than this take no part: the end padding would dominate them. */
export const MIN_RESIDUAL_SAMPLES = 12;
/** Lowest and highest candidate cutoffs, as fractions of the (lowest) sampling rate. */
const F_LO = 0.002;
const F_HI = 0.4;
/** The noise-only region: 0.25–0.40 of the sampling rate, as grid steps below F_HI. */
const TAIL_POINTS = 6;
const TAIL_STEPS = 10;
/** Residual removed over the octave above the cutoff, at most this many times the noise's share. */
export const OCTAVE_RATIO = 2;
/**
 * The filter's zero-phase impulse response h₀ … h_M (M where it has decayed to 1e-7): a forward and a
 * backward pass over a centred impulse.
 */
function zeroPhaseResponse(q: Biquad): Float64Array {
  const r = Math.sqrt(Math.abs(q.a2));
  const M = r > 0 && r < 1 ? Math.ceil(Math.log(1e-7) / Math.log(r)) : 4;
  const N = 4 * M + 1;
  const b = new Float64Array(N);
  b[2 * M] = 1;
  passFromRest(q, b, false);
  passFromRest(q, b, true);
  return b.slice(2 * M, 3 * M + 1);
}

export interface NoiseResidual {
  /** Residual variance per unit noise variance far from the ends. */
  interior: number;
  /** What one end adds to the sum over a piece (odd extension there). */
  endCorrection: number;
  /** Pieces at least this long have ends that do not interact. */
  minLength: number;
}

/**
 * ρ for the engine's filtfilt: tr((I − S)ᵀ(I − S)) = n·interior + 2·endCorrection. Near an end the
 * odd extension x(end + m) = 2·x(end) − x(end − m) makes each output a known combination of the
 * samples, so the residual variance at distance j from the end is a sum over h; beyond M it is the
 * interior one, 1 − 2h₀ + Σh². Matches the trace from the filter's own columns to 1e-9 (tested).
 */
export function noiseResidual(q: Biquad): NoiseResidual {
  const h = zeroPhaseResponse(q);
  const M = h.length - 1;
  // P[k] = Σ_{m≤k} h_m²; T[j] = Σ_{m>j} h_m.
  const P = new Float64Array(M + 1);
  const T = new Float64Array(M + 1);
  for (let m = 0; m <= M; m++) P[m] = (m ? P[m - 1] : 0) + h[m] * h[m];
  for (let m = M - 1; m >= 0; m--) T[m] = T[m + 1] + h[m + 1];
  const interior = 1 - 2 * h[0] + 2 * P[M] - h[0] * h[0];
  let endCorrection = 0;
  for (let j = 0; j <= M; j++) {
    // Output j samples from the end: weight h_j + 2·T_j on the end sample, h_|j−p| − h_(j+p) on
    // the sample p back from it; v = Σ (δ − weight)².
    let v = ((j === 0 ? 1 : 0) - h[j] - 2 * T[j]) ** 2;
    let cross = 0;
    for (let p = 1; p < j; p++) cross += h[j - p] * (j + p <= M ? h[j + p] : 0);
    for (let p = Math.max(1, j); p + j <= M; p++) cross += h[p - j] * h[p + j];
    v += (j ? P[j - 1] : 0) - h[0] * h[0] + P[M] + (P[M] - P[j]) - 2 * cross;
    if (j > 0) v += 1 - 2 * (h[0] - (2 * j <= M ? h[2 * j] : 0));
    endCorrection += v - interior;
  }
  const r = Math.sqrt(Math.abs(q.a2));
  const minLength = 2 * (r > 0 && r < 1 ? Math.ceil(Math.log(1e-3) / Math.log(r)) : 2) + 2;
  return { interior, endCorrection, minLength };
}

/** Candidate cutoffs lie on a grid of GRID_STEPS per octave of fc/fs, so 2·fc is on it too and ρ is cached. */
const GRID_STEPS = 16;
const residualCache = new Map<number, NoiseResidual>();

function gridCutoff(k: number, fsHz: number): number {
  return F_HI * fsHz * 2 ** (-k / GRID_STEPS);
}

function noiseResidualAt(k: number, fsHz: number): NoiseResidual {
  let r = residualCache.get(k);
  if (!r) {
    r = noiseResidual(zeroLagDesignCached(gridCutoff(k, fsHz), fsHz));
    residualCache.set(k, r);
  }
  return r;
}

/** Residual sum of squares at grid cutoff k and its expectation per unit noise variance, over the pieces long enough at `judgeK`. */
function residualAt(series: ResidualSeries[], k: number, judgeK = k): { ss: number; rho: number; n: number } {
  let ss = 0;
  let rho = 0;
  let n = 0;
  for (let i = 0; i < series.length; i++) {
    const s = series[i];
    const len = s.values.length;
    if (len < noiseResidualAt(judgeK, s.fsHz).minLength) continue;
    const q = zeroLagDesignCached(gridCutoff(k, s.fsHz), s.fsHz);
    const nr = noiseResidualAt(k, s.fsHz);
    // A piece's x and y (next to each other, one length and rate) are filtered side by side; the
    // sums are taken in the same order as one by one.
    const next = series[i + 1];
    const paired = next && next.fsHz === s.fsHz && next.values.length === len;
    const [a, b] = paired ? filtfiltResidualSSPair(q, s.values, next.values, endPadLength(q)) : [filtfiltResidualSS(q, s.values, endPadLength(q)), 0];
    for (const part of paired ? [a, b] : [a]) {
      ss += part;
      rho += len * nr.interior + 2 * nr.endCorrection;
      n += len;
    }
    if (paired) i++;
  }
  return { ss, rho, n };
}

/** RMS residual at fcHz (the quantity Winter plots). */
export function residualRms(series: ResidualSeries[], fcHz: number): number {
  let ss = 0;
  let n = 0;
  for (const s of series) {
    const q = zeroLagDesignCached(fcHz, s.fsHz);
    ss += filtfiltResidualSS(q, s.values, endPadLength(q));
    n += s.values.length;
  }
  return Math.sqrt(ss / n);
}

/** Residual-analysis cutoff, or null when there are too few samples to judge. */
export function residualAnalysisCutoff(all: ResidualSeries[]): CutoffChoice | null {
  const series = all.filter((s) => s.values.length >= MIN_RESIDUAL_SAMPLES);
  if (series.length === 0) return null;
  const fs = Math.min(...series.map((s) => s.fsHz));
  // Pieces marked every k-th frame have their own rate: the grid is per series, in fc/fs.
  if (series.some((s) => s.fsHz !== fs)) return residualAnalysisCutoff(series.filter((s) => s.fsHz === fs));

  // Noise variance: least squares of SS(fc) = σ²·ρ(fc) over the noise-only cutoffs.
  let srr = 0;
  let sr = 0;
  for (let k = 0; k <= TAIL_STEPS; k += TAIL_STEPS / (TAIL_POINTS - 1)) {
    const r = residualAt(series, Math.round(k));
    srr += r.rho * r.rho;
    sr += r.rho * r.ss;
  }
  if (srr === 0) return null;
  const variance = Math.max(0, sr / srr);
  const noiseRms = Math.sqrt(variance);

  // Residual removed between fc and 2·fc over what noise alone removes there, on the pieces long
  // enough to judge fc. Infinite when none is: the cutoff then moves up.
  const excess = (k: number) => {
    const a = residualAt(series, k);
    const b = residualAt(series, k - GRID_STEPS, k);
    const noise = variance * (a.rho - b.rho);
    return a.n > 0 && noise > 0 ? (a.ss - b.ss) / noise : Infinity;
  };
  // Largest k (lowest cutoff) with excess ≤ OCTAVE_RATIO, by bisection over the grid.
  let hiK = GRID_STEPS; // 0.2·fs: 2·fc stays at 0.4·fs
  let loK = Math.round(GRID_STEPS * Math.log2(F_HI / F_LO));
  if (excess(hiK) > OCTAVE_RATIO) return { cutoffHz: gridCutoff(hiK, fs), noiseRms };
  if (excess(loK) <= OCTAVE_RATIO) return { cutoffHz: gridCutoff(loK, fs), noiseRms };
  while (loK - hiK > 1) {
    const m = (loK + hiK) >> 1;
    if (excess(m) > OCTAVE_RATIO) loK = m;
    else hiK = m;
  }
  return { cutoffHz: gridCutoff(hiK, fs), noiseRms };
}
