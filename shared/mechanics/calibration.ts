import { Calibration as CalibrationSchema, type Calibration, type CalibrationInput } from "../schemas/shot-document";
import { MechanicsInputError, formatPath, type InputPath } from "./errors";
import { applyHomography, fitHomography, homographyConditioning, homographyJacobian, homographyLocalScale, homographyW, type Mat3, type Vec2 } from "./homography";
import { hypot } from "./hypot";

// Image pixels (x right, y down, displayed frame) → world millimetres on the plane of the shot.

export interface CalibrationMap {
  type: "scaleBar" | "plane";
  /** Image px → world mm. Scale bar: origin at end `a`, x right, y up. Plane: the given world frame. */
  toWorld(p: Vec2): Vec2;
  /** Scale bar only: one number for the whole frame. */
  mmPerPx?: number;
  /** Local scale at an image point (constant for a scale bar). */
  mmPerPxAt(p: Vec2): number;
  /** Plane only: false for image points beyond the plane's horizon, where the map is meaningless. */
  inFront(p: Vec2): boolean;
  /** Plane with more than 4 points: RMS distance between given and mapped world points. */
  rmsResidualMm: number | null;
  /** Jacobian of toWorld at an image point, row-major [∂X/∂x, ∂X/∂y, ∂Y/∂x, ∂Y/∂y] (mm/px). */
  jacobian(p: Vec2): [number, number, number, number];
  /** Scale bar only: toWorld(p) = M·p + t with M row-major. */
  affine?: { M: [number, number, number, number]; t: Vec2 };
  /** Plane only: the fitted homography, row-major. */
  H?: Mat3;
}

export interface CalibrationProblem {
  path: InputPath;
  message: string;
}

/** Smallest scale-bar length in pixels that is more than a slip of the mouse. */
const MIN_SCALE_BAR_PX = 1;
/** Triangle "flatness" (twice the area over the longest side squared) below which points count as on one line. */
const COLLINEAR_TOL = 1e-3;

function flatness(a: Vec2, b: Vec2, c: Vec2): number {
  const cross = Math.abs((b[0] - a[0]) * (c[1] - a[1]) - (b[1] - a[1]) * (c[0] - a[0]));
  const longest = Math.max(dist2(a, b), dist2(a, c), dist2(b, c));
  return longest > 0 ? cross / longest : 0;
}

function dist2(a: Vec2, b: Vec2): number {
  return (a[0] - b[0]) ** 2 + (a[1] - b[1]) ** 2;
}

/** Three of the points (indices) on one line, or null; for 4 points any such triple is fatal. */
function collinearTriple(pts: Vec2[]): [number, number, number] | null {
  for (let i = 0; i < pts.length; i++)
    for (let j = i + 1; j < pts.length; j++)
      for (let k = j + 1; k < pts.length; k++) if (flatness(pts[i], pts[j], pts[k]) < COLLINEAR_TOL) return [i, j, k];
  return null;
}

function allOnOneLine(pts: Vec2[]): boolean {
  // Ratio of the principal spreads of the point cloud.
  let cx = 0;
  let cy = 0;
  for (const p of pts) {
    cx += p[0];
    cy += p[1];
  }
  cx /= pts.length;
  cy /= pts.length;
  let sxx = 0;
  let syy = 0;
  let sxy = 0;
  for (const p of pts) {
    sxx += (p[0] - cx) ** 2;
    syy += (p[1] - cy) ** 2;
    sxy += (p[0] - cx) * (p[1] - cy);
  }
  const tr = sxx + syy;
  const det = sxx * syy - sxy * sxy;
  const disc = Math.sqrt(Math.max(0, (tr * tr) / 4 - det));
  const big = tr / 2 + disc;
  const small = tr / 2 - disc;
  return big <= 0 || small / big < COLLINEAR_TOL ** 2;
}

function planeProblem(points: { image: Vec2; world: Vec2 }[]): CalibrationProblem | null {
  for (const side of ["image", "world"] as const) {
    const pts = points.map((p) => p[side]);
    const unit = side === "image" ? "px" : "mm";
    for (let i = 0; i < pts.length; i++)
      for (let j = i + 1; j < pts.length; j++)
        if (Math.sqrt(dist2(pts[i], pts[j])) < (side === "image" ? MIN_SCALE_BAR_PX : 1e-6))
          return { path: ["points", j, side], message: `plane points ${i} and ${j} have the same ${side} position (less than 1 ${unit} apart)` };
    if (pts.length === 4) {
      const t = collinearTriple(pts);
      if (t) return { path: ["points"], message: `plane points ${t.join(", ")} lie on one line in the ${side}: use 4 corners of a rectangle or layout, no three in a row` };
    } else if (allOnOneLine(pts)) {
      return { path: ["points"], message: `all plane points lie on one line in the ${side}: they must span an area` };
    }
  }
  const image = points.map((p) => p.image);
  const world = points.map((p) => p.world);
  const H = fitHomography(image, world);
  if (!(homographyConditioning(image, world) > 1e-10) || H.some((v) => !Number.isFinite(v)))
    return { path: ["points"], message: "plane points do not determine the mapping: too many lie on one line" };
  const signs = points.map((p) => Math.sign(homographyW(H, p.image[0], p.image[1])));
  if (signs.some((s) => s !== signs[0]))
    return { path: ["points"], message: "plane points do not match up: the image and world orders differ (the mapping folds over)" };
  return null;
}

/** Why a parsed calibration cannot be used (path relative to the calibration object), or null. */
export function checkCalibration(cal: Calibration): CalibrationProblem | null {
  if (cal.type === "scaleBar") {
    if (!(cal.lengthMm > 0)) return { path: ["lengthMm"], message: "lengthMm must be above 0" };
    const px = Math.sqrt(dist2(cal.a, cal.b));
    if (px < MIN_SCALE_BAR_PX) return { path: ["b"], message: `scale bar ends a and b are identical (${px.toFixed(2)} px apart)` };
    return null;
  }
  if (cal.points.length < 4) return { path: ["points"], message: `a plane calibration needs at least 4 points (got ${cal.points.length})` };
  return planeProblem(cal.points);
}

/** For live preview: a one-line reason the calibration is unusable, or null when it is fine. */
export function validateCalibration(cal: unknown): string | null {
  const parsed = CalibrationSchema.safeParse(cal);
  if (!parsed.success) {
    const iss = parsed.error.issues[0];
    const path = formatPath(iss.path as InputPath);
    return path ? `${path}: ${iss.message}` : iss.message;
  }
  const p = checkCalibration(parsed.data);
  if (!p) return null;
  const path = formatPath(p.path);
  return path ? `${path}: ${p.message}` : p.message;
}

// Classes rather than object literals of closures: the Monte Carlo trials build hundreds of maps.

class ScaleBarMap implements CalibrationMap {
  readonly type = "scaleBar" as const;
  readonly mmPerPx: number;
  readonly rmsResidualMm = null;
  readonly affine: { M: [number, number, number, number]; t: Vec2 };
  constructor(
    private readonly a: Vec2,
    b: Vec2,
    lengthMm: number,
  ) {
    const s = lengthMm / hypot(b[0] - a[0], b[1] - a[1]);
    this.mmPerPx = s;
    this.affine = { M: [s, 0, 0, -s], t: [-a[0] * s, a[1] * s] };
  }
  toWorld(p: Vec2): Vec2 {
    return [(p[0] - this.a[0]) * this.mmPerPx, (this.a[1] - p[1]) * this.mmPerPx];
  }
  mmPerPxAt(): number {
    return this.mmPerPx;
  }
  inFront(): boolean {
    return true;
  }
  jacobian(): [number, number, number, number] {
    return [this.mmPerPx, 0, 0, -this.mmPerPx];
  }
}

class PlaneMap implements CalibrationMap {
  readonly type = "plane" as const;
  readonly rmsResidualMm: number | null = null;
  private readonly side: number;
  constructor(readonly H: Mat3, points: { image: Vec2; world: Vec2 }[]) {
    this.side = Math.sign(homographyW(H, points[0].image[0], points[0].image[1]));
    if (points.length > 4) {
      let ss = 0;
      for (const p of points) ss += dist2(applyHomography(H, p.image[0], p.image[1]), p.world);
      this.rmsResidualMm = Math.sqrt(ss / points.length);
    }
  }
  toWorld(p: Vec2): Vec2 {
    return applyHomography(this.H, p[0], p[1]);
  }
  mmPerPxAt(p: Vec2): number {
    return homographyLocalScale(this.H, p[0], p[1]);
  }
  inFront(p: Vec2): boolean {
    return Math.sign(homographyW(this.H, p[0], p[1])) === this.side;
  }
  jacobian(p: Vec2): [number, number, number, number] {
    return homographyJacobian(this.H, p[0], p[1]);
  }
}

/** Scale bar map without checks (its methods need their object: call them as map.toWorld(p)). */
export function scaleBarMap(a: Vec2, b: Vec2, lengthMm: number): CalibrationMap {
  return new ScaleBarMap(a, b, lengthMm);
}

/** Plane map without checks (its methods need their object). */
export function planeMap(points: { image: Vec2; world: Vec2 }[]): CalibrationMap {
  const H = fitHomography(
    points.map((p) => p.image),
    points.map((p) => p.world),
  );
  return new PlaneMap(H, points);
}

/** Checked calibration map; throws MechanicsInputError (path relative to the calibration). */
export function makeCalibration(cal: CalibrationInput): CalibrationMap {
  const parsed = CalibrationSchema.safeParse(cal);
  if (!parsed.success) {
    const iss = parsed.error.issues[0];
    throw new MechanicsInputError(iss.path as InputPath, iss.message);
  }
  const p = checkCalibration(parsed.data);
  if (p) throw new MechanicsInputError(p.path, p.message);
  const c = parsed.data;
  const m = c.type === "scaleBar" ? scaleBarMap(c.a, c.b, c.lengthMm) : planeMap(c.points);
  // A plain object whose functions may be passed around on their own (e.g. `const { toWorld } = …`).
  return {
    type: m.type,
    mmPerPx: m.mmPerPx,
    rmsResidualMm: m.rmsResidualMm,
    affine: m.affine,
    H: m.H,
    toWorld: (p) => m.toWorld(p),
    mmPerPxAt: (p) => m.mmPerPxAt(p),
    inFront: (p) => m.inFront(p),
    jacobian: (p) => m.jacobian(p),
  };
}
