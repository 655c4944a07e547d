import { linearRegression } from "simple-statistics";

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
  const px: number[][] = new Array(n);
  const py: number[][] = new Array(n);
  for (let i = 0; i < n; i++) {
    const t = tS[i] - t0;
    px[i] = [t, xMm[i]];
    py[i] = [t, yMm[i]];
  }
  const fx = linearRegression(px);
  const fy = linearRegression(py);
  let ss = 0;
  let worst = 0;
  for (let i = 0; i < n; i++) {
    const t = px[i][0];
    const r2 = (xMm[i] - (fx.m * t + fx.b)) ** 2 + (yMm[i] - (fy.m * t + fy.b)) ** 2;
    ss += r2;
    worst = Math.max(worst, r2);
  }
  const vxMps = fx.m / 1000;
  const vyMps = fy.m / 1000;
  return { vxMps, vyMps, speedMps: Math.hypot(vxMps, vyMps), rmsResidualMm: Math.sqrt(ss / n), maxResidualMm: Math.sqrt(worst) };
}
