// A stick's stiffness on a day for the beam model: the one rule of
// shared/mechanics/stiffness-in-force.ts (the bench test in force, else the rating).
import { stiffnessInForce } from "../entities/stick/stiffness";
import type { StickStiffness } from "../../shared/schemas/sticks";
import { log } from "../log";
import { recomputeLater } from "../shots/results";
import type { RecomputeTarget } from "../jobs/types";
import * as repo from "../entities/stick/repository";

export async function stickStiffness(teamId: string, stickId: string, onDate: string): Promise<StickStiffness | null> {
  const row = await repo.stickById(teamId, stickId);
  if (!row) return null;
  const tests = (await repo.benchTestsOf(teamId, [stickId])).map((t) => t.test);
  const k = stiffnessInForce({ ratedFlex: row.stick.ratedFlex, tests }, onDate);
  if (!k) return null;
  return { eiNm2: k.eiNm2, source: k.source, measuredFlex: k.source === "bench" ? k.flex : null, testedOn: k.testedOn };
}

export interface StiffnessChange {
  teamId: string;
  stickId: string;
  /** Shots taken with the stick, whose stored results used the old stiffness. */
  shotIds: string[];
}

/**
 * After a bench test is added or removed, the rating changes or the stick is deleted (pass the
 * shots it had, as they are unlinked by then): the shots' stored results (stored energy) used
 * the old stiffness, so they are recomputed on the job queue. Never fails the caller's request.
 */
export async function stickStiffnessChanged(teamId: string, stickId: string, shotIds?: string[], reqId?: string): Promise<StiffnessChange> {
  const change = { teamId, stickId, shotIds: shotIds ?? (await repo.shotIdsWithStick(stickId, teamId)) };
  const targets: RecomputeTarget[] = shotIds ? shotIds.map((id) => ({ scope: "shot", id })) : [{ scope: "stick", id: stickId }];
  for (const t of targets) {
    try {
      await recomputeLater(t, reqId);
    } catch (err) {
      log.error({ err, stickId, target: t }, "queueing the recompute of shots after a stiffness change failed");
    }
  }
  return change;
}
