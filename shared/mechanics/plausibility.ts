import type { ResultNote, ShotResults } from "../schemas/shot-results";

// Notes that flag results a coach should not act on without a second look. They never block a
// result; the thresholds and their sources are listed here so the readout can show them.

/** Fastest recorded skills-competition slap shot 48.64 m/s (NHL All-Star skills competition, 2012) [P]; flag above ~52 m/s [CP]. */
export const MAX_PLAUSIBLE_SPEED_MPS = 52;
/** Blade–puck contact 27 ± 5 ms to 38 ± 9 ms in lab slap shots (J Appl Biomech 22(3), 2006) [P]; flag outside 5–60 ms [CP]. */
export const CONTACT_MS_RANGE: [number, number] = [5, 60];
/** Lowest high-speed rate used in shot studies (240 Hz) [CP]: below it the number may be a playback rate. */
export const MIN_HIGH_SPEED_FPS = 240;
/**
 * Largest plausible peak bend between the shaft's halves. [calc] A bench flex test bends a shaft by
 * one inch over 1 m, 2·atan(25.4/500) ≈ 5.8°; 20° on the 1.3 m chord of the synthetic shot means
 * ~0.2 m of deflection at the bottom hand, several times what a flex rating is measured at. [CP]
 * Larger values come from a bottom-hand or top-hand mark off the shaft.
 */
export const MAX_PLAUSIBLE_BEND_DEG = 20;
/**
 * Largest plausible deflection as a share of the chord (top hand → blade heel). [calc] 20° with the
 * bottom hand near mid-chord is a deflection of about 17 % of the chord.
 */
export const MAX_PLAUSIBLE_DEFLECTION_SHARE = 0.17;
/**
 * Largest plausible energy stored in the shaft, J. [calc] The puck of the fastest recorded
 * skills-competition shot, 48.64 m/s (REFERENCES.md), carried ½·0.170 kg·(48.64 m/s)² ≈ 201 J at
 * the heaviest regulation mass (IIHF Rule 13.1); a shaft storing more than the fastest puck ever
 * received is a mis-mark or a wrong flex. Measured shaft energies in lab shots are tens of joules
 * at most (Worobets, Fairbairn & Stefanyshyn, Sports Eng 9:191–200, 2006) [M].
 */
export const MAX_PLAUSIBLE_ENERGY_J = 0.5 * 0.17 * 48.64 ** 2;
/** Relative standard uncertainty above which a result is flagged. */
export const LARGE_RELATIVE_U = 0.1;
/** Flight marks scattered this many times the digitising error off a straight line suggest a mis-mark. */
export const FLIGHT_SCATTER_FACTOR = 3;
/**
 * One flight mark this many times the expected scatter off the line is a mis-mark: with Gaussian
 * digitising error the distance is Rayleigh-distributed, P(d > 4·RMS) = e^−16 ≈ 1e-7 per mark [calc].
 */
export const FLIGHT_OUTLIER_FACTOR = 4;

export interface PlausibilityContext {
  captureFps: number;
  /** Expected RMS scatter of a world mark from digitising alone, mm. */
  expectedScatterMm: number;
  /** Frames from puck strike to release. */
  contactFrames: number;
  /** Largest distance of one flight mark from the fitted line, mm. */
  flightMaxResidualMm?: number;
}

function relLarge(value: number, u: number | null): boolean {
  return u !== null && value > 0 && u / value > LARGE_RELATIVE_U;
}

export function plausibilityNotes(r: Omit<ShotResults, "notes">, ctx: PlausibilityContext): ResultNote[] {
  const notes: ResultNote[] = [];
  const p = r.puckExitSpeed;
  if (p.valueMps > MAX_PLAUSIBLE_SPEED_MPS)
    notes.push({
      code: "PUCK_SPEED_IMPLAUSIBLE",
      message: `puck exit speed ${p.valueMps.toFixed(1)} m/s is above ${MAX_PLAUSIBLE_SPEED_MPS} m/s, faster than any recorded shot: check the capture rate and the calibration`,
    });
  const b = r.bladeSpeedAtStrike;
  if (b && b.valueMps > MAX_PLAUSIBLE_SPEED_MPS)
    notes.push({ code: "BLADE_SPEED_IMPLAUSIBLE", message: `blade speed ${b.valueMps.toFixed(1)} m/s is above ${MAX_PLAUSIBLE_SPEED_MPS} m/s: check the blade marks and the calibration` });
  const [cLo, cHi] = CONTACT_MS_RANGE;
  if (r.contactTimeMs < cLo || r.contactTimeMs > cHi)
    notes.push({
      code: "CONTACT_TIME_OUTSIDE_RANGE",
      message: `contact time ${r.contactTimeMs.toFixed(1)} ms is outside the usual ${cLo}–${cHi} ms: check the puck-strike and release frames`,
    });
  if (ctx.captureFps < MIN_HIGH_SPEED_FPS)
    notes.push({
      code: "CAPTURE_RATE_LOW",
      message: `capture rate ${ctx.captureFps} fps is below ${MIN_HIGH_SPEED_FPS} fps: make sure it is the camera's capture rate, not the file's playback rate`,
    });
  if (ctx.contactFrames < 5)
    notes.push({ code: "CONTACT_FEW_FRAMES", message: `contact spans only ${ctx.contactFrames} frame${ctx.contactFrames > 1 ? "s" : ""}: times are good to one frame (${r.frameTimeMs.toFixed(2)} ms)` });
  if (p.marksUsed < 5)
    notes.push({ code: "PUCK_FLIGHT_FEW_MARKS", message: `puck exit speed rests on ${p.marksUsed} flight marks; 10 give a steadier fit` });
  const outlier = (ctx.flightMaxResidualMm ?? 0) > FLIGHT_OUTLIER_FACTOR * ctx.expectedScatterMm;
  if (ctx.expectedScatterMm > 0 && (p.rmsResidualMm > FLIGHT_SCATTER_FACTOR * ctx.expectedScatterMm || outlier))
    notes.push({
      code: "PUCK_FLIGHT_NOT_STRAIGHT",
      message: `puck flight marks stray ${p.rmsResidualMm.toFixed(1)} mm (RMS) from a straight line, more than digitising error explains: check for a mis-placed mark`,
    });
  if (relLarge(p.valueMps, p.uncertaintyMps))
    notes.push({ code: "PUCK_SPEED_UNCERTAIN", message: `puck exit speed uncertainty is over ${LARGE_RELATIVE_U * 100} % of the value` });
  if (b && relLarge(b.valueMps, b.uncertaintyMps))
    notes.push({ code: "BLADE_SPEED_UNCERTAIN", message: `blade speed uncertainty is over ${LARGE_RELATIVE_U * 100} % of the value` });
  const bend = r.peakBend;
  if (bend && bend.angleDeg > MAX_PLAUSIBLE_BEND_DEG)
    notes.push({
      code: "BEND_IMPLAUSIBLE",
      message: `peak bend ${bend.angleDeg.toFixed(1)}° is above ${MAX_PLAUSIBLE_BEND_DEG}°, more than a shaft bends in a shot: check that the top-hand, bottom-hand and blade-heel marks sit on the shaft`,
    });
  const d = r.shaftDeflection;
  if (d && d.valueMm > MAX_PLAUSIBLE_DEFLECTION_SHARE * (d.aMm + d.bMm))
    notes.push({
      code: "BEND_DEFLECTION_IMPLAUSIBLE",
      message: `shaft deflection ${d.valueMm.toFixed(0)} mm is over ${MAX_PLAUSIBLE_DEFLECTION_SHARE * 100} % of the ${(d.aMm + d.bMm).toFixed(0)} mm from top hand to blade heel: check the bottom-hand mark`,
    });
  const e = r.storedEnergy;
  if (e && e.valueJ > MAX_PLAUSIBLE_ENERGY_J)
    notes.push({
      code: "STORED_ENERGY_IMPLAUSIBLE",
      message: `stored energy ${e.valueJ.toFixed(0)} J is more than the ${MAX_PLAUSIBLE_ENERGY_J.toFixed(0)} J the puck of the fastest recorded shot carried: check the bend marks and the stick's flex`,
    });
  if (bend && relLarge(bend.angleDeg, bend.uncertaintyDeg))
    notes.push({ code: "BEND_UNCERTAIN", message: `peak bend uncertainty is over ${LARGE_RELATIVE_U * 100} % of the value` });
  if (e && relLarge(e.valueJ, e.uncertaintyJ))
    notes.push({ code: "STORED_ENERGY_UNCERTAIN", message: `stored energy uncertainty is over ${LARGE_RELATIVE_U * 100} % of the value` });
  return notes;
}
