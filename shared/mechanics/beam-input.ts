// The beam model's input and its checks, shared by the solver and the zod schema so the CLI, the
// API and the page refuse the same things with the same words.

export interface BeamLoad {
  /** Position along the stick, from its first end. */
  xMm: number;
  /** Positive pushes the stick toward the supports' side (against the reactions). */
  forceN: number;
}

export interface BeamInput {
  /** Stick length; x runs from 0 to lengthMm. */
  lengthMm: number;
  /** The two supports, in order along the stick; overhangs beyond them are allowed. */
  supportsMm: [number, number];
  loads: BeamLoad[];
  /** Flexural rigidity; without it the deflection is not computed. */
  eiNm2?: number;
}

export const BEAM_LIMITS = { maxLoads: 100, maxStations: 20_000, defaultStepMm: 5 } as const;

const isNum = (v: unknown): v is number => typeof v === "number" && Number.isFinite(v);

/** The first problem with a beam input, or null when it can be solved. */
export function beamInputProblem(input: BeamInput): string | null {
  const { lengthMm, supportsMm, loads, eiNm2 } = input ?? ({} as BeamInput);
  if (!isNum(lengthMm) || lengthMm <= 0) return `lengthMm must be a number greater than zero (got ${lengthMm})`;
  if (!Array.isArray(supportsMm) || supportsMm.length !== 2) return "supportsMm must be two positions [x1, x2]";
  const [x1, x2] = supportsMm;
  if (!isNum(x1) || !isNum(x2)) return `supportsMm must be two numbers (got ${x1}, ${x2})`;
  for (const s of supportsMm)
    if (s < 0 || s > lengthMm) return `the support at ${s} mm is off the stick (0 to ${lengthMm} mm)`;
  if (x1 === x2) return `the two supports are at the same place (${x1} mm): they must be apart`;
  if (x1 > x2) return `supports must be in order along the stick, x1 < x2 (got ${x1} and ${x2})`;
  if (!Array.isArray(loads) || loads.length === 0) return "loads must list at least one { xMm, forceN }";
  if (loads.length > BEAM_LIMITS.maxLoads) return `too many loads: ${loads.length} (the limit is ${BEAM_LIMITS.maxLoads})`;
  for (const [i, load] of loads.entries()) {
    if (!isNum(load?.xMm)) return `load ${i + 1}: xMm must be a number (got ${load?.xMm})`;
    if (!isNum(load.forceN)) return `load ${i + 1}: forceN must be a number (got ${load.forceN})`;
    if (load.xMm < 0 || load.xMm > lengthMm) return `load ${i + 1} at ${load.xMm} mm is outside the stick (0 to ${lengthMm} mm)`;
  }
  if (eiNm2 !== undefined && (!isNum(eiNm2) || eiNm2 <= 0)) return `eiNm2 must be a number greater than zero (got ${eiNm2})`;
  return null;
}
