// Where a motion changes character: the frame at which one smooth piece (a polynomial in time)
// hands over to another, found by least squares over candidate frames. Both pieces meet at the
// change (the position is continuous); their slopes and curvatures are free, so a kink (the puck
// struck from rest, the blade meeting the ice) and a bend in the path both show. This is the
// classic two-phase regression (Hinkley 1969, "Inference about the intersection in two-phase
// regression"); a handful of parameters per candidate, solved directly.
import { Matrix, solve as solveLinear } from "ml-matrix";

export interface Series {
  frames: number[];
  /** One or more coordinates per frame (x and y, or a single value); all fitted with the same change frame. */
  values: number[][];
}

export interface ChangeFit {
  /** The change, in (fractional) frames. */
  at: number;
  /** Residual sum of squares (over the window) at the best change and at one frame either side. */
  sse: number;
  sseBefore: number;
  sseAfter: number;
  /** Residual variance per value at the best change. */
  variance: number;
  /** Slope of each coordinate just after the change, per frame (first-order term of the after piece). */
  slopeAfter: number[];
  slopeBefore: number[];
  /** Points used. */
  n: number;
}

export interface ChangeOptions {
  /** Polynomial degree before and after the change (0 = constant). */
  before: number;
  after: number;
  /** Candidate changes from … to (frames), tried every `step` frames. */
  from: number;
  to: number;
  step?: number;
  /** The frames fitted, the same for every candidate so their residuals compare (inclusive). */
  window: [number, number];
}

/** Least squares of the two-piece model at change c, each coordinate separately; null if too few points. */
function fitAt(s: Series, c: number, o: ChangeOptions): { sse: number; n: number; slopeAfter: number[]; slopeBefore: number[] } | null {
  const rows: { u: number; k: number }[] = [];
  for (let k = 0; k < s.frames.length; k++) if (s.frames[k] >= o.window[0] && s.frames[k] <= o.window[1]) rows.push({ u: s.frames[k] - c, k });
  const p = 1 + o.before + o.after;
  const before = rows.filter((r) => r.u <= 0).length;
  const after = rows.length - before;
  if (before < o.before + 1 || after < o.after + 1 || rows.length < p + 2) return null;
  // Design row: [1, u, u², … (before only), u, u², … (after only)].
  const design = (u: number) => {
    const row = new Array(p).fill(0);
    row[0] = 1;
    if (u <= 0) for (let d = 1; d <= o.before; d++) row[d] = u ** d;
    else for (let d = 1; d <= o.after; d++) row[o.before + d] = u ** d;
    return row;
  };
  const ata = Array.from({ length: p }, () => new Array(p).fill(0));
  const dims = s.values[0].length;
  const atb = Array.from({ length: dims }, () => new Array(p).fill(0));
  for (const { u, k } of rows) {
    const a = design(u);
    for (let i = 0; i < p; i++) {
      for (let j = 0; j < p; j++) ata[i][j] += a[i] * a[j];
      for (let d = 0; d < dims; d++) atb[d][i] += a[i] * s.values[k][d];
    }
  }
  let sse = 0;
  const slopeAfter: number[] = [];
  const slopeBefore: number[] = [];
  for (let d = 0; d < dims; d++) {
    const beta = solve(ata, atb[d]);
    if (!beta || !beta.every(Number.isFinite)) return null;
    for (const { u, k } of rows) {
      const a = design(u);
      let y = 0;
      for (let i = 0; i < p; i++) y += a[i] * beta[i];
      sse += (s.values[k][d] - y) ** 2;
    }
    slopeBefore.push(o.before >= 1 ? beta[1] : 0);
    slopeAfter.push(o.after >= 1 ? beta[o.before + 1] : 0);
  }
  return { sse, n: rows.length * dims, slopeAfter, slopeBefore };
}

/** The best change frame between o.from and o.to, or null when the series is too short there. */
export function findChange(s: Series, o: ChangeOptions): ChangeFit | null {
  const step = o.step ?? 0.25;
  let best: { c: number; sse: number; n: number; slopeAfter: number[]; slopeBefore: number[] } | null = null;
  for (let c = o.from; c <= o.to + 1e-9; c += step) {
    const f = fitAt(s, c, o);
    if (f && (!best || f.sse < best.sse)) best = { c, ...f };
  }
  if (!best) return null;
  const p = 1 + o.before + o.after;
  const near = (dc: number) => fitAt(s, best!.c + dc, o)?.sse ?? Infinity;
  const dims = s.values[0].length;
  return {
    at: best.c,
    sse: best.sse,
    sseBefore: near(-1),
    sseAfter: near(1),
    variance: best.sse / Math.max(1, best.n - p * dims),
    slopeAfter: best.slopeAfter,
    slopeBefore: best.slopeBefore,
    n: best.n,
  };
}

/**
 * How sure the change sits at its frame rather than one either side: 1 − e^(−Δ/2), Δ the smaller
 * rise of the residual sum of squares at ±1 frame over the residual variance (a likelihood ratio).
 */
export function changeConfidence(f: ChangeFit): number {
  const rise = Math.min(f.sseBefore, f.sseAfter) - f.sse;
  const delta = rise / Math.max(f.variance, 1e-6);
  return Math.max(0, Math.min(1, 1 - Math.exp(-delta / 2)));
}

function solve(a: number[][], b: number[]): number[] | null {
  try {
    return solveLinear(new Matrix(a), Matrix.columnVector(b)).to1DArray();
  } catch {
    return null;
  }
}
