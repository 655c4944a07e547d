import { Matrix, SVD, solve } from "ml-matrix";
import { hypot } from "./hypot";

// Planar homography by the normalised direct linear transform (Hartley & Zisserman, Multiple View
// Geometry, 2nd ed., algorithm 4.2): normalise each point set, solve A h = 0 by SVD, denormalise.

export type Vec2 = [number, number];
/** Row-major 3×3. */
export type Mat3 = [number, number, number, number, number, number, number, number, number];

/** Similarity that moves the centroid to 0 and the mean distance to √2. */
function normaliser(pts: Vec2[]): Mat3 {
  let cx = 0;
  let cy = 0;
  for (const [x, y] of pts) {
    cx += x;
    cy += y;
  }
  cx /= pts.length;
  cy /= pts.length;
  let d = 0;
  for (const [x, y] of pts) d += hypot(x - cx, y - cy);
  d /= pts.length;
  const s = d > 0 ? Math.SQRT2 / d : 1;
  return [s, 0, -s * cx, 0, s, -s * cy, 0, 0, 1];
}

export function applyHomography(H: Mat3, x: number, y: number): Vec2 {
  const w = H[6] * x + H[7] * y + H[8];
  return [(H[0] * x + H[1] * y + H[2]) / w, (H[3] * x + H[4] * y + H[5]) / w];
}

/** Denominator of the map at (x, y); its sign tells which side of the horizon a point is on. */
export function homographyW(H: Mat3, x: number, y: number): number {
  return H[6] * x + H[7] * y + H[8];
}

function mul(A: Mat3, B: Mat3): Mat3 {
  const out = new Array(9).fill(0) as Mat3;
  for (let r = 0; r < 3; r++)
    for (let c = 0; c < 3; c++) out[r * 3 + c] = A[r * 3] * B[c] + A[r * 3 + 1] * B[3 + c] + A[r * 3 + 2] * B[6 + c];
  return out;
}

function invertSimilarity(T: Mat3): Mat3 {
  const s = T[0];
  return [1 / s, 0, -T[2] / s, 0, 1 / s, -T[5] / s, 0, 0, 1];
}

/** The DLT rows for normalised points: A h̃ = 0, with the two normalisers. */
function normalisedSystem(src: Vec2[], dst: Vec2[], rows: number): { A: Matrix; Ts: Mat3; Td: Mat3 } {
  const Ts = normaliser(src);
  const Td = normaliser(dst);
  const A = new Matrix(rows, 9);
  for (let i = 0; i < src.length; i++) {
    const x = Ts[0] * src[i][0] + Ts[2];
    const y = Ts[4] * src[i][1] + Ts[5];
    const X = Td[0] * dst[i][0] + Td[2];
    const Y = Td[4] * dst[i][1] + Td[5];
    A.setRow(2 * i, [0, 0, 0, -x, -y, -1, Y * x, Y * y, Y]);
    A.setRow(2 * i + 1, [x, y, 1, 0, 0, 0, -X * x, -X * y, -X]);
  }
  return { A, Ts, Td };
}

/** Right singular vectors of A ordered by singular value, largest first. */
function svdOrdered(A: Matrix): { sv: number[]; V: Matrix; order: number[] } {
  const svd = new SVD(A, { computeLeftSingularVectors: false, computeRightSingularVectors: true, autoTranspose: false });
  const sv = svd.diagonal;
  const order = sv.map((_, i) => i).sort((p, q) => sv[q] - sv[p]);
  return { sv, V: svd.rightSingularVectors, order };
}

function denormalise(h: Mat3, Ts: Mat3, Td: Mat3): Mat3 {
  const H = mul(mul(invertSimilarity(Td), h), Ts);
  const norm = Math.hypot(...H);
  const scale = Math.abs(H[8]) > 1e-12 * norm ? H[8] : norm;
  return H.map((v) => v / scale) as Mat3;
}

/**
 * Homography mapping src[i] → dst[i] (≥ 4 pairs; degeneracy is checked by the caller). Exactly 4
 * pairs determine it: the 8×8 system with h̃₃₃ = 1 (the normalised centroid maps to a finite
 * point) is solved directly — the Monte Carlo trials refit it hundreds of times. More pairs: the
 * least-squares null vector by SVD (4 pairs would give 8 rows: padded to 9 for the full basis).
 */
export function fitHomography(src: Vec2[], dst: Vec2[]): Mat3 {
  const n = src.length;
  const { A, Ts, Td } = normalisedSystem(src, dst, Math.max(2 * n, 9));
  if (n === 4) {
    const h = solve(A.subMatrix(0, 7, 0, 7), A.subMatrix(0, 7, 8, 8).mul(-1)).getColumn(0);
    if (h.every(Number.isFinite)) return denormalise([...h, 1] as Mat3, Ts, Td);
  }
  const { V, order } = svdOrdered(A);
  return denormalise(V.getColumn(order[8]) as Mat3, Ts, Td);
}

/** Smallest-but-one over largest singular value of the normalised system: ~0 when the points do not determine a map. */
export function homographyConditioning(src: Vec2[], dst: Vec2[]): number {
  const { A } = normalisedSystem(src, dst, Math.max(2 * src.length, 9));
  const { sv, order } = svdOrdered(A);
  return sv[order[0]] > 0 ? sv[order[7]] / sv[order[0]] : 0;
}

/** Jacobian of the map at (x, y), row-major [∂X/∂x, ∂X/∂y, ∂Y/∂x, ∂Y/∂y]. */
export function homographyJacobian(H: Mat3, x: number, y: number): [number, number, number, number] {
  const w = homographyW(H, x, y);
  const [X, Y] = applyHomography(H, x, y);
  return [(H[0] - X * H[6]) / w, (H[1] - X * H[7]) / w, (H[3] - Y * H[6]) / w, (H[4] - Y * H[7]) / w];
}

/** Local millimetres per pixel at (x, y): √|det J| of the map. */
export function homographyLocalScale(H: Mat3, x: number, y: number): number {
  const [j00, j01, j10, j11] = homographyJacobian(H, x, y);
  return Math.sqrt(Math.abs(j00 * j11 - j01 * j10));
}
