import type { CalibrationMap } from "./calibration";
import type { Source } from "./sources";

// The puck's exit velocity is the slope of a least-squares line through its flight marks: a fixed
// weighted sum of the world marks, v = Σ wᵢ·Xᵢ with wᵢ = (tᵢ − t̄)/Σ(t − t̄)². So, as for the
// smoothed states (linear-response.ts, decision 011), a Monte Carlo trial needs no fresh noise on
// every mark: digitising noise enters as one Gaussian draw with the slope's exact covariance
// (σ²·Σ wᵢ²·JᵢJᵢᵀ, Jᵢ the calibration's Jacobian at the mark) — two normal deviates a trial in place
// of two per mark (258 at 3,200 fps) — and the trial's calibration by re-mapping the marks.

export interface FlightTrials {
  /** The fitted velocity (m/s) under a trial calibration plus one draw of digitising noise, as a change from the nominal. */
  sample(cal: CalibrationMap, normal: () => number): [number, number];
}

/** `tS` the marks' capture times, `i0` the index of the first of them in the source's tracks. */
export function flightTrials(src: Source, i0: number, tS: ArrayLike<number>, nominalCal: CalibrationMap, sigmaPx: number): FlightTrials {
  const n = tS.length;
  let mean = 0;
  for (let i = 0; i < n; i++) mean += tS[i] / n;
  let sxx = 0;
  for (let i = 0; i < n; i++) sxx += (tS[i] - mean) ** 2;
  // Per mark and part: image point, weight (m/s per mm of world position), nominal world point.
  const parts = src.parts.length;
  const m = n * parts;
  const px = new Float64Array(m);
  const py = new Float64Array(m);
  const w = new Float64Array(m);
  const nx = new Float64Array(m);
  const ny = new Float64Array(m);
  let cxx = 0;
  let cxy = 0;
  let cyy = 0;
  for (let i = 0, k = 0; i < n; i++)
    for (const part of src.parts) {
      const p: [number, number] = [part.x[i0 + i], part.y[i0 + i]];
      px[k] = p[0];
      py[k] = p[1];
      w[k] = sxx > 0 ? (tS[i] - mean) / sxx / 1000 / parts : 0;
      [nx[k], ny[k]] = nominalCal.toWorld(p);
      const [j00, j01, j10, j11] = nominalCal.jacobian(p);
      const f = (sigmaPx * w[k]) ** 2;
      cxx += f * (j00 * j00 + j01 * j01);
      cxy += f * (j00 * j10 + j01 * j11);
      cyy += f * (j10 * j10 + j11 * j11);
      k++;
    }
  // Cholesky factor of [[cxx, cxy], [cxy, cyy]] (zero where a pivot vanishes).
  const l00 = cxx > 0 ? Math.sqrt(cxx) : 0;
  const l10 = l00 > 0 ? cxy / l00 : 0;
  const l11 = Math.sqrt(Math.max(0, cyy - l10 * l10));
  return {
    sample(cal, normal) {
      let dvx = 0;
      let dvy = 0;
      const aff = cal.affine;
      const H = cal.H;
      for (let k = 0; k < m; k++) {
        let X: number;
        let Y: number;
        if (aff) {
          X = aff.M[0] * px[k] + aff.M[1] * py[k] + aff.t[0];
          Y = aff.M[2] * px[k] + aff.M[3] * py[k] + aff.t[1];
        } else if (H) {
          const h = H[6] * px[k] + H[7] * py[k] + H[8];
          X = (H[0] * px[k] + H[1] * py[k] + H[2]) / h;
          Y = (H[3] * px[k] + H[4] * py[k] + H[5]) / h;
        } else [X, Y] = cal.toWorld([px[k], py[k]]);
        dvx += w[k] * (X - nx[k]);
        dvy += w[k] * (Y - ny[k]);
      }
      const z0 = normal();
      const z1 = normal();
      return [dvx + l00 * z0, dvy + l10 * z0 + l11 * z1];
    },
  };
}
