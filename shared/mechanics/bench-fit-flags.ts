// Warnings on a bench fit: the line may be a poor summary (low R², a bow in the residuals), one
// reading may stand off the line, or the line may miss zero. Thresholds and their reasons are in
// docs/decisions/021-flex-normalisation.md. Flags warn; they never stop the fit.
import { nToLbf } from "../units";
import type { LineFit } from "./bench-fit-line";

export type BenchFitFlagCode = "non-linear" | "curvature" | "outlier" | "offset";

export interface BenchFitFlag {
  code: BenchFitFlagCode;
  message: string;
  /** Index into the readings, for "outlier". */
  readingIndex?: number;
  /** For "curvature": softening = load grows slower than the line at the ends of the range. */
  direction?: "softening" | "stiffening";
}

export const BENCH_FIT_LIMITS = {
  /** Below this R² the line is flagged as a poor summary [CP]. */
  minR2: 0.98,
  /** |deleted-studentized residual| above which a reading stands out from the others. */
  outlierStudentized: 3,
  /** ...and only when it is also off the line by this share of the largest load. */
  outlierShareOfMaxLoad: 0.02,
  /** A bow (quadratic term) is flagged when it moves the load by this share of the largest load... */
  curvatureShareOfMaxLoad: 0.01,
  /** ...and explains at least this share of what the line leaves over. */
  curvatureShareOfResidual: 0.5,
  /** |intercept| above this share of the largest load is flagged. */
  offsetShareOfMaxLoad: 0.05,
} as const;

const force = (n: number) => `${n.toFixed(1)} N (${nToLbf(n).toFixed(1)} lbf)`;

/**
 * The bow in the residuals: by Frisch–Waugh, regressing the line's residuals on x² made
 * orthogonal to [1, x] gives the quadratic coefficient of a full quadratic fit.
 */
function curvature(x: readonly number[], residuals: readonly number[]) {
  const n = x.length;
  const meanX = x.reduce((s, v) => s + v, 0) / n;
  const u = x.map((v) => v - meanX);
  const suu = u.reduce((s, v) => s + v * v, 0);
  const meanU2 = u.reduce((s, v) => s + v * v, 0) / n;
  const suu2 = u.reduce((s, v) => s + v * (v * v - meanU2), 0);
  const q = u.map((v) => v * v - meanU2 - (suu2 / suu) * v);
  const sqq = q.reduce((s, v) => s + v * v, 0);
  if (!(sqq > 0)) return { gamma: 0, bow: 0, share: 0 };
  const gamma = q.reduce((s, v, i) => s + v * residuals[i], 0) / sqq;
  const sse = residuals.reduce((s, e) => s + e * e, 0);
  const bow = Math.max(...q.map((v) => Math.abs(gamma * v)));
  return { gamma, bow, share: sse > 0 ? (gamma * gamma * sqq) / sse : 0 };
}

/** Flags for a fit of load (N) on deflection (mm). */
export function benchFitFlags(deflectionMm: readonly number[], loadN: readonly number[], fit: LineFit): BenchFitFlag[] {
  const L = BENCH_FIT_LIMITS;
  const maxLoad = Math.max(...loadN);
  const flags: BenchFitFlag[] = [];
  if (fit.r2 < L.minR2)
    flags.push({ code: "non-linear", message: `R² is ${fit.r2.toFixed(4)} (below ${L.minR2}): the readings do not lie on a straight line; re-check them before trusting the flex` });

  if (fit.n >= 4) {
    const c = curvature(deflectionMm, fit.residuals);
    if (c.bow > L.curvatureShareOfMaxLoad * maxLoad && c.share >= L.curvatureShareOfResidual) {
      const direction = c.gamma < 0 ? "softening" : "stiffening";
      const why =
        direction === "softening"
          ? "the shaft gives more per unit load at the top of the range (slipping on a support, or nearing its limit): stop loading and check the set-up"
          : "the shaft gives less per unit load at the top of the range (slack or a support settling at low loads)";
      flags.push({ code: "curvature", direction, message: `the readings bow away from the line by up to ${force(c.bow)}: ${why}` });
    }
  }

  fit.studentizedResiduals.forEach((t, i) => {
    const e = fit.residuals[i];
    if (t !== null && Math.abs(t) > L.outlierStudentized && Math.abs(e) > L.outlierShareOfMaxLoad * maxLoad)
      flags.push({
        code: "outlier",
        readingIndex: i,
        message: `reading ${i + 1} (${force(loadN[i])} at ${deflectionMm[i].toFixed(2)} mm) is ${force(Math.abs(e))} off the line the others follow: re-check it`,
      });
  });

  if (Math.abs(fit.intercept) > L.offsetShareOfMaxLoad * maxLoad)
    flags.push({ code: "offset", message: `the line misses zero by ${force(fit.intercept)}: was the gauge zeroed with the shaft unloaded, or is there a preload?` });
  return flags;
}
