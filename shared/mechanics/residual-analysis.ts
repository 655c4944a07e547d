import { endPadLength, filtfiltResidualSS, zeroLagDesignCached } from "./butterworth";

// Cutoff choice by residual analysis (Winter, Biomechanics and Motor Control of Human Movement,
// 4th ed., Wiley 2009): the RMS difference R(fc) between raw and filtered data falls along a straight
// line where only noise is being removed; that line's value at fc = 0 estimates the noise RMS, and
// the chosen cutoff is where R(fc) comes down to that level.

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
/** The straight-line (noise-only) region, as fractions of the sampling rate. */
const TAIL_LO = 0.25;
const TAIL_POINTS = 6;
/** 10 halvings of the log range (a factor of 200) give the cutoff to ~0.5 %. */
const BISECTIONS = 10;

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
  const lo = F_LO * fs;
  const hi = F_HI * fs;

  // Least-squares line through the tail of R(fc); its intercept is the noise estimate.
  let sx = 0;
  let sy = 0;
  let sxx = 0;
  let sxy = 0;
  for (let k = 0; k < TAIL_POINTS; k++) {
    const f = (TAIL_LO + ((F_HI - TAIL_LO) * k) / (TAIL_POINTS - 1)) * fs;
    const r = residualRms(series, f);
    sx += f;
    sy += r;
    sxx += f * f;
    sxy += f * r;
  }
  const slope = (TAIL_POINTS * sxy - sx * sy) / (TAIL_POINTS * sxx - sx * sx);
  const noise = Math.max(0, (sy - slope * sx) / TAIL_POINTS);

  // R falls as fc rises: bisect (on a log scale) for R(fc) = noise.
  if (residualRms(series, lo) <= noise) return { cutoffHz: lo, noiseRms: noise };
  if (residualRms(series, hi) >= noise) return { cutoffHz: hi, noiseRms: noise };
  let a = Math.log(lo);
  let b = Math.log(hi);
  for (let k = 0; k < BISECTIONS; k++) {
    const m = (a + b) / 2;
    if (residualRms(series, Math.exp(m)) > noise) a = m;
    else b = m;
  }
  return { cutoffHz: Math.exp((a + b) / 2), noiseRms: noise };
}
