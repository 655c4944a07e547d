import { Matrix, SVD } from "ml-matrix";

// Planar homography by the normalised direct linear transform (Hartley & Zisserman, Multiple View
// Geometry, 2nd ed., algorithm 4.2): normalise each point set, solve A h = 0 by SVD, denormalise.

export type Vec2 = [number, number];
/** Row-major 3×3. */
export type Mat3 = [number, number, number, number, number, number, number, number, number];

export interface HomographyFit {
  H: Mat3;
  /** Smallest-but-one over largest singular value of the normalised system: ~0 when degenerate. */
  conditioning: number;
}

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
  for (const [x, y] of pts) d += Math.hypot(x - cx, y - cy);
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

/** Homography mapping src[i] → dst[i] (≥ 4 pairs). Degeneracy is left to the caller via `conditioning`. */
export function fitHomography(src: Vec2[], dst: Vec2[]): HomographyFit {
  const n = src.length;
  const Ts = normaliser(src);
  const Td = normaliser(dst);
  // 4 points give 8 rows: pad to 9 so the SVD returns the full right null space.
  const rows = Math.max(2 * n, 9);
  const A = new Matrix(rows, 9);
  for (let i = 0; i < n; i++) {
    const x = Ts[0] * src[i][0] + Ts[2];
    const y = Ts[4] * src[i][1] + Ts[5];
    const X = Td[0] * dst[i][0] + Td[2];
    const Y = Td[4] * dst[i][1] + Td[5];
    A.setRow(2 * i, [0, 0, 0, -x, -y, -1, Y * x, Y * y, Y]);
    A.setRow(2 * i + 1, [x, y, 1, 0, 0, 0, -X * x, -X * y, -X]);
  }
  const svd = new SVD(A, { computeLeftSingularVectors: false, computeRightSingularVectors: true, autoTranspose: false });
  const sv = svd.diagonal;
  const order = sv.map((v, i) => [v, i] as const).sort((p, q) => q[0] - p[0]);
  const smallest = order[8][1];
  const V = svd.rightSingularVectors;
  const h = V.getColumn(smallest) as Mat3;
  const conditioning = order[0][0] > 0 ? order[7][0] / order[0][0] : 0;
  let H = mul(mul(invertSimilarity(Td), h), Ts);
  const norm = Math.hypot(...H);
  const scale = Math.abs(H[8]) > 1e-12 * norm ? H[8] : norm;
  H = H.map((v) => v / scale) as Mat3;
  return { H, conditioning };
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
