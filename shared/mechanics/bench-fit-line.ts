// Least-squares line y = slope·x + intercept, by simple-statistics, plus the residual diagnostics
// the bench fit's flags need (leverage, standardized and deleted-studentized residuals).
import { linearRegression, rSquared } from "simple-statistics";

export interface LineFit {
  n: number;
  slope: number;
  intercept: number;
  r2: number;
  /** y − fitted y, in y's units. */
  residuals: number[];
  /** Internally standardized residuals e / (s √(1 − h)); 0 where they are undefined. */
  standardizedResiduals: number[];
  /**
   * Externally (deleted) studentized residuals: each reading judged against the line and scatter
   * of the others. null with fewer than 4 points or where one point alone fixes the line.
   */
  studentizedResiduals: (number | null)[];
}

export function fitLine(x: readonly number[], y: readonly number[]): LineFit {
  const n = x.length;
  if (n !== y.length || n < 3) throw new RangeError(`fitLine needs two arrays of the same length >= 3 (got ${x.length} and ${y.length})`);
  const pairs = x.map((xi, i) => [xi, y[i]]);
  const { m: slope, b: intercept } = linearRegression(pairs);
  const r2 = rSquared(pairs, (xi: number) => slope * xi + intercept);
  const residuals = pairs.map(([xi, yi]) => yi - (slope * xi + intercept));

  const meanX = x.reduce((s, v) => s + v, 0) / n;
  const sxx = x.reduce((s, v) => s + (v - meanX) ** 2, 0);
  const sse = residuals.reduce((s, e) => s + e * e, 0);
  // Readings exactly on a line leave only rounding in the residuals: no scatter to judge by.
  const meanY = y.reduce((s, v) => s + v, 0) / n;
  const syy = y.reduce((s, v) => s + (v - meanY) ** 2, 0);
  const exact = sse <= 1e-24 * syy;
  const s2 = exact ? 0 : sse / (n - 2);
  const standardizedResiduals: number[] = [];
  const studentizedResiduals: (number | null)[] = [];
  residuals.forEach((e, i) => {
    const oneMinusH = 1 - (1 / n + (x[i] - meanX) ** 2 / sxx);
    if (oneMinusH < 1e-12) {
      standardizedResiduals.push(0);
      studentizedResiduals.push(null);
      return;
    }
    standardizedResiduals.push(s2 > 0 ? e / Math.sqrt(s2 * oneMinusH) : 0);
    if (n < 4) {
      studentizedResiduals.push(null);
      return;
    }
    if (exact) {
      studentizedResiduals.push(0);
      return;
    }
    const s2Deleted = (sse - (e * e) / oneMinusH) / (n - 3);
    if (s2Deleted > 0) studentizedResiduals.push(e / Math.sqrt(s2Deleted * oneMinusH));
    else studentizedResiduals.push(e === 0 ? 0 : Math.sign(e) * Infinity);
  });
  return { n, slope, intercept, r2, residuals, standardizedResiduals, studentizedResiduals };
}
