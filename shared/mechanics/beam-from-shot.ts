// A shot as a three-point bend: the top hand and the blade contact hold the shaft, the bottom
// hand pushes it. The hand's force is the one that bends a shaft of this EI by the shot's
// deflection under the load: δ = F a² b² / (3 EI L), so F = k δ with k = 3 EI (a + b) / (a² b²)
// (AISC "Beam Diagrams and Formulas", case 8). Small deflections: the chord stands for the shaft.
import type { BeamInput } from "./beam-input";
import { StickLabInputError } from "./sticklab-error";
import { hypot } from "./hypot";

/** A point in world millimetres on the plane of the shot. */
export interface WorldPointMm {
  x: number;
  y: number;
}

export interface ShotBeamSource {
  topHand: WorldPointMm;
  bottomHand: WorldPointMm;
  /** Where the blade meets the shaft: the second support. */
  bladeHeel: WorldPointMm;
  /** The shaft's deflection at the bottom hand from the top-hand–heel chord; measured from the points when left out. */
  deflectionMm?: number;
  stickEiNm2: number;
  /** When given, the stick is drawn from the butt end, so the free stretch above the top hand shows. */
  buttEnd?: WorldPointMm;
}

export interface ShotBeam {
  input: BeamInput;
  /** The bottom hand's force on the shaft. */
  forceN: number;
  /** Three-point-bend stiffness under the bottom hand on this chord. */
  stiffnessNPerMm: number;
  /** Top hand to the bottom hand's foot on the chord, and from there to the heel. */
  aMm: number;
  bMm: number;
  deflectionMm: number;
  deflectionSource: "given" | "points";
}

const fail = (message: string, field: string): never => {
  throw new StickLabInputError(message, { field });
};

function checkPoint(p: WorldPointMm, field: string): void {
  if (!p || !Number.isFinite(p.x) || !Number.isFinite(p.y)) fail(`${field} must be a point { x, y } in mm`, field);
}

export function beamFromShot(source: ShotBeamSource): ShotBeam {
  const { topHand, bottomHand, bladeHeel, buttEnd, stickEiNm2 } = source;
  checkPoint(topHand, "topHand");
  checkPoint(bottomHand, "bottomHand");
  checkPoint(bladeHeel, "bladeHeel");
  if (buttEnd !== undefined) checkPoint(buttEnd, "buttEnd");
  if (!Number.isFinite(stickEiNm2) || stickEiNm2 <= 0) fail(`the stick's EI must be greater than zero (got ${stickEiNm2})`, "stickEiNm2");

  const cx = bladeHeel.x - topHand.x;
  const cy = bladeHeel.y - topHand.y;
  const chordMm = hypot(cx, cy);
  if (!(chordMm >= 1)) fail("the top hand and the blade heel are at the same place: the shaft has no length", "bladeHeel");
  const ux = cx / chordMm;
  const uy = cy / chordMm;
  const hx = bottomHand.x - topHand.x;
  const hy = bottomHand.y - topHand.y;
  const aMm = hx * ux + hy * uy;
  if (!(aMm > 0 && aMm < chordMm))
    fail(`the bottom hand must lie between the top hand and the blade heel along the shaft (it is at ${aMm.toFixed(1)} mm of ${chordMm.toFixed(1)} mm)`, "bottomHand");
  const bMm = chordMm - aMm;

  const given = source.deflectionMm;
  if (given !== undefined && !(Number.isFinite(given) && given >= 0))
    fail(`the deflection must be a number of mm, zero or more (got ${given})`, "deflectionMm");
  const deflectionMm = given ?? Math.abs(hx * uy - hy * ux);

  const a = aMm / 1000;
  const b = bMm / 1000;
  const stiffnessNPerMm = (3 * stickEiNm2 * (a + b)) / (a * a * b * b) / 1000;
  const forceN = stiffnessNPerMm * deflectionMm;

  let offsetMm = 0;
  if (buttEnd !== undefined) {
    offsetMm = -((buttEnd.x - topHand.x) * ux + (buttEnd.y - topHand.y) * uy);
    if (offsetMm < 0) fail("the butt end must be beyond the top hand, away from the blade", "buttEnd");
  }
  return {
    input: {
      lengthMm: offsetMm + chordMm,
      supportsMm: [offsetMm, offsetMm + chordMm],
      loads: [{ xMm: offsetMm + aMm, forceN }],
      eiNm2: stickEiNm2,
    },
    forceN,
    stiffnessNPerMm,
    aMm,
    bMm,
    deflectionMm,
    deflectionSource: given === undefined ? "points" : "given",
  };
}
