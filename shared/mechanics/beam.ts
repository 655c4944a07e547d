// Beam on two supports with point loads, overhangs allowed: reactions by statics, shear and
// moment by sections, deflection by integrating EI u'' = M twice in closed form (Macaulay's
// bracket functions, i.e. superposition of each force's cubic) with u = 0 at both supports.
// Signs and the choice of method: docs/decisions/020-beam-solver.md.
import { BEAM_LIMITS, beamInputProblem, type BeamInput } from "./beam-input";
import { StickLabInputError } from "./sticklab-error";

/** Said wherever beam-model results are shown. */
export const BEAM_MODEL_NOTICE =
  "These are estimates for coaching from a simple beam model, not a substitute for an engineer's assessment " +
  "or the stick maker's specifications.";

export interface BeamOptions {
  /** Spacing of the regular stations; default 5 mm. Load and support points are always added. */
  stepMm?: number;
}

/** One point along the stick. At a load or support the shear jumps: two stations share its x, left value first. */
export interface BeamStation {
  xMm: number;
  /** Sum of the forces to the left, upward (against the loads) positive. */
  shearN: number;
  /** Sagging positive: the side away from the supports in tension. */
  momentNm: number;
  /** Displacement in the direction of positive loads; present with eiNm2. */
  deflectionMm?: number;
}

export interface BeamResult {
  /** Reactions at supportsMm[0] and supportsMm[1], positive against positive loads. */
  reactionsN: [number, number];
  /** The signed moment of largest magnitude and where it is: the predicted break point. */
  maxMoment: { valueNm: number; xMm: number };
  /** The signed shear of largest magnitude, and the start of the stretch where it acts. */
  maxShearN: number;
  maxShearXMm: number;
  /** The signed deflection of largest magnitude and where it is; present with eiNm2. */
  maxDeflectionMm?: number;
  maxDeflectionXMm?: number;
  stations: BeamStation[];
}

interface PointForce {
  s: number; // m
  p: number; // N, upward positive
}

/** The solved beam as functions of x in metres; everything else is read from these. */
function model(input: BeamInput) {
  const problem = beamInputProblem(input);
  if (problem) throw new StickLabInputError(problem);
  const L = input.lengthMm / 1000;
  const [x1, x2] = input.supportsMm.map((v) => v / 1000);
  const loads = input.loads.map((l) => ({ s: l.xMm / 1000, p: -l.forceN }));
  const total = input.loads.reduce((sum, l) => sum + l.forceN, 0);
  // Moments about the first support: R2 (x2 − x1) = Σ F (x − x1).
  const r2 = input.loads.reduce((sum, l) => sum + l.forceN * (l.xMm / 1000 - x1), 0) / (x2 - x1);
  const r1 = total - r2;
  const forces: PointForce[] = [...loads, { s: x1, p: r1 }, { s: x2, p: r2 }].sort((a, b) => a.s - b.s);
  const scale = forces.reduce((sum, f) => sum + Math.abs(f.p), 0);
  const snap = (v: number, size: number) => (Math.abs(v) < 1e-12 * size ? 0 : v);

  const shear = (x: number, includeAtX: boolean) =>
    snap(forces.reduce((sum, f) => (f.s < x || (includeAtX && f.s === x) ? sum + f.p : sum), 0), scale);
  const moment = (x: number) => snap(forces.reduce((sum, f) => (f.s < x ? sum + f.p * (x - f.s) : sum), 0), scale * L);
  const phi = (x: number) => forces.reduce((sum, f) => (f.s < x ? sum + (f.p * (x - f.s) ** 3) / 6 : sum), 0);
  const c2 = -phi(x1);
  const c1 = -(phi(x2) + c2) / (x2 - x1);
  const ei = input.eiNm2;
  // Downward (load-direction) deflection in mm: w = −u, EI u = Φ(x) + C1 (x − x1) + C2.
  const deflection = ei === undefined ? undefined : (x: number) => (-(phi(x) + c1 * (x - x1) + c2) / ei) * 1000;
  const breaks = [...new Set([0, L, ...forces.map((f) => f.s)])].sort((a, b) => a - b);
  return { L, reactions: [r1, r2] as [number, number], forces, shear, moment, deflection, breaks, c1 };
}

type Model = ReturnType<typeof model>;

/** Points of zero slope inside (p, q): EI u'(p + t) = A t² + B t + C with the forces left of p. */
function slopeRoots(m: Model, p: number, q: number): number[] {
  const active = m.forces.filter((f) => f.s <= p);
  const A = active.reduce((s, f) => s + f.p, 0) / 2;
  const B = active.reduce((s, f) => s + f.p * (p - f.s), 0);
  const C = active.reduce((s, f) => s + (f.p * (p - f.s) ** 2) / 2, 0) + m.c1;
  const h = q - p;
  let ts: number[];
  if (Math.abs(A) * h * h <= 1e-14 * (Math.abs(B) * h + Math.abs(C))) ts = B === 0 ? [] : [-C / B];
  else {
    const disc = B * B - 4 * A * C;
    if (disc < 0) return [];
    // Stable form: no subtraction of nearly equal numbers.
    const r = -(B + (B >= 0 ? 1 : -1) * Math.sqrt(disc)) / 2;
    ts = [r / A, ...(r !== 0 ? [C / r] : [])];
  }
  return ts.filter((t) => t > 0 && t < h).map((t) => p + t);
}

/** Largest |value| of f over xs (first one wins a tie within rounding). */
function extreme(xs: readonly number[], f: (x: number) => number): { x: number; v: number } {
  let best = { x: xs[0], v: f(xs[0]) };
  for (const x of xs.slice(1)) {
    const v = f(x);
    if (Math.abs(v) > Math.abs(best.v) * (1 + 1e-12) + 1e-300) best = { x, v };
  }
  return best;
}

/** Solve the beam and sample it along the stick. Throws StickLabInputError on bad input. */
export function solveBeam(input: BeamInput, options: BeamOptions = {}): BeamResult {
  const m = model(input);
  const step = options.stepMm ?? BEAM_LIMITS.defaultStepMm;
  if (!Number.isFinite(step) || step <= 0) throw new StickLabInputError(`the station step must be greater than zero (got ${step} mm)`);
  if (input.lengthMm / step > BEAM_LIMITS.maxStations)
    throw new StickLabInputError(`the station step ${step} mm gives more than ${BEAM_LIMITS.maxStations} stations; use a larger step`);

  const maxMoment = extreme(m.breaks, m.moment);
  const maxShear = extreme(m.breaks, (x) => m.shear(x, true));
  let maxDeflection: { x: number; v: number } | undefined;
  // Every peak of the deflected shape is a station, so a drawing or a reader finds them exactly.
  const peaks: number[] = [];
  if (m.deflection) {
    for (let i = 0; i + 1 < m.breaks.length; i++) peaks.push(...slopeRoots(m, m.breaks[i], m.breaks[i + 1]));
    maxDeflection = extreme([...m.breaks, ...peaks].sort((a, b) => a - b), m.deflection);
  }

  // Stations in mm; force points carry a left and a right value of the shear.
  const forceXs = new Set(m.forces.map((f) => f.s));
  const exact = [...m.breaks, ...peaks];
  const regular: number[] = [];
  for (let k = 1; k * step < input.lengthMm; k++) {
    const x = (k * step) / 1000;
    // A regular station within a nanometre of an exact point would only add a sliver.
    if (!exact.some((e) => Math.abs(e - x) < 1e-9)) regular.push(x);
  }
  const sorted = [...new Set([...exact, ...regular])].sort((a, b) => a - b);
  const stations: BeamStation[] = [];
  for (const x of sorted) {
    const at = (shearN: number): BeamStation => ({
      xMm: x * 1000,
      shearN,
      momentNm: m.moment(x),
      ...(m.deflection ? { deflectionMm: m.deflection(x) } : {}),
    });
    if (forceXs.has(x)) stations.push(at(m.shear(x, false)));
    stations.push(at(m.shear(x, true)));
  }

  return {
    reactionsN: m.reactions,
    maxMoment: { valueNm: maxMoment.v, xMm: maxMoment.x * 1000 },
    maxShearN: maxShear.v,
    maxShearXMm: maxShear.x * 1000,
    ...(maxDeflection ? { maxDeflectionMm: maxDeflection.v, maxDeflectionXMm: maxDeflection.x * 1000 } : {}),
    stations,
  };
}

export interface BeamPoint {
  xMm: number;
  shearLeftN: number;
  shearRightN: number;
  momentNm: number;
  deflectionMm?: number;
}

/** The beam's values at one point, e.g. under a pointer on the diagrams. */
export function beamAt(input: BeamInput, xMm: number): BeamPoint {
  const m = model(input);
  if (!Number.isFinite(xMm) || xMm < 0 || xMm > input.lengthMm)
    throw new StickLabInputError(`x must lie on the stick, 0 to ${input.lengthMm} mm (got ${xMm})`);
  const x = xMm / 1000;
  return {
    xMm,
    shearLeftN: m.shear(x, false),
    shearRightN: m.shear(x, true),
    momentNm: m.moment(x),
    ...(m.deflection ? { deflectionMm: m.deflection(x) } : {}),
  };
}
