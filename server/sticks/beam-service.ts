// The beam model over HTTP: solve a beam as given, or build one from a digitised shot. The shot's
// stored results hold the shaft's chord at peak bend (top hand → blade heel, the bottom hand's
// foot on it at a, and the deflection there); those three points in world mm are all the engine's
// beamFromShot needs. See docs/decisions/081-beam-from-shot.md.
import { z } from "zod";
import { shotAccess } from "../entities/shot/visibility";
import { policy, type Actor } from "../auth/policy";
import { HttpError, notFound } from "../http/problem";
import { parse } from "../http/validate";
import { beamFromShot, solveBeam } from "../../shared/mechanics/sticklab";
import { beamInputSchema, type BeamSolveResponse, type ShotBeamResponse } from "../../shared/schemas/sticks";
import { viaEngine } from "./engine-errors";
import * as repo from "../entities/stick/repository";
import { stickStiffness } from "./stiffness";

export function solveBeamRequest(_a: Actor, body: unknown): BeamSolveResponse {
  const input = parse(beamInputSchema, body);
  return { result: viaEngine(() => solveBeam(input)) };
}

/** The part of the stored shot results the beam needs (shared/schemas/shot-results.ts). */
const StoredDeflection = z.object({
  shaftDeflection: z.object({ valueMm: z.number(), aMm: z.number().positive(), bMm: z.number().positive(), frame: z.number().int() }).nullable().optional(),
});

const unusable = (message: string, path = "shotId") => new HttpError(422, "shot_not_usable", message, [{ path, message }]);

export async function beamFromShotRequest(a: Actor, shotId: string): Promise<ShotBeamResponse> {
  const found = await repo.shotForBeam(a.teamId, shotId);
  if (!found || !policy.viewShot(a, shotAccess(found.shot, found.sharedWith))) throw notFound("That shot");
  const { shot } = found;
  if (!shot.stickId) throw unusable("This shot is not linked to a stick: choose the stick it was taken with on the Digitise page first.");
  const stickRow = await repo.stickById(a.teamId, shot.stickId);
  if (!stickRow) throw unusable("The stick this shot was taken with no longer exists.");
  if (!found.results)
    throw unusable(
      found.resultError
        ? `This shot has no results yet: ${found.resultError}`
        : "This shot has no results yet: digitise it (calibration, top hand, bottom hand and blade heel through peak bend) first.",
    );
  const stored = StoredDeflection.safeParse(found.results);
  const deflection = stored.success ? stored.data.shaftDeflection : null;
  if (!deflection)
    throw unusable("This shot's results have no shaft deflection: mark the top hand, the bottom hand and the blade heel on the peak-bend frame.");
  const stiffness = await stickStiffness(a.teamId, shot.stickId, found.date);
  if (!stiffness)
    throw unusable(`The stick "${stickRow.stick.label}" has neither a bench test nor a rated flex: add one to know its stiffness.`, "stickId");

  // The chord in its own frame: top hand at the origin, blade heel along x, bottom hand off it by the deflection.
  const { aMm, bMm, valueMm, frame } = deflection;
  const beam = viaEngine(() =>
    beamFromShot({
      topHand: { x: 0, y: 0 },
      bladeHeel: { x: aMm + bMm, y: 0 },
      bottomHand: { x: aMm, y: valueMm },
      deflectionMm: Math.abs(valueMm),
      stickEiNm2: stiffness.eiNm2,
    }),
  );
  return {
    shot: { id: shot.id, label: shot.label, date: found.date, stickId: shot.stickId, stickLabel: stickRow.stick.label, frame },
    stiffness,
    beam,
    result: viaEngine(() => solveBeam(beam.input)),
  };
}
