import { hypot } from "./hypot";

// Puck exit speed: a straight-line least-squares fit of world position against time over the
// first flight frames (Gonzalez & Knudson, ISBS 2019: fit the flight instead of filtering through
// the impact).

export interface VelocityFit {
  vxMps: number;
  vyMps: number;
  speedMps: number;
  /** RMS distance of the marks from the fitted line, mm. */
  rmsResidualMm: number;
  /** Largest distance of one mark from the fitted line, mm: a single mis-mark shows here, not in the RMS of a long window. */
  maxResidualMm: number;
}

/** Fit against each mark's capture time in seconds (any origin). */
export function fitConstantVelocity(tS: ArrayLike<number>, xMm: ArrayLike<number>, yMm: ArrayLike<number>): VelocityFit {
  const n = tS.length;
  const t0 = tS[0];
  const fx = lineFit(tS, t0, xMm);
  const fy = lineFit(tS, t0, yMm);
  let ss = 0;
  let worst = 0;
  for (let i = 0; i < n; i++) {
    const t = tS[i] - t0;
    const r2 = (xMm[i] - (fx.m * t + fx.b)) ** 2 + (yMm[i] - (fy.m * t + fy.b)) ** 2;
    ss += r2;
    worst = Math.max(worst, r2);
  }
  const vxMps = fx.m / 1000;
  const vyMps = fy.m / 1000;
  return { vxMps, vyMps, speedMps: hypot(vxMps, vyMps), rmsResidualMm: Math.sqrt(ss / n), maxResidualMm: Math.sqrt(worst) };
}

/**
 * Least-squares line of v against t − t0: simple-statistics' linearRegression (centred sums, the
 * same arithmetic in the same order) on the arrays themselves. The Monte Carlo fits the flight
 * once per trial, and building its [t, v] pairs cost more than the fit.
 */
function lineFit(tS: ArrayLike<number>, t0: number, v: ArrayLike<number>): { m: number; b: number } {
  const n = tS.length;
  if (n === 1) return { m: 0, b: v[0] };
  let sumX = 0;
  let sumY = 0;
  for (let i = 0; i < n; i++) {
    sumX += tS[i] - t0;
    sumY += v[i];
  }
  const meanX = sumX / n;
  const meanY = sumY / n;
  let sumXY = 0;
  let sumXX = 0;
  for (let i = 0; i < n; i++) {
    const dx = tS[i] - t0 - meanX;
    sumXY += dx * (v[i] - meanY);
    sumXX += dx * dx;
  }
  const m = sumXY / sumXX;
  return { m, b: meanY - m * meanX };
}
