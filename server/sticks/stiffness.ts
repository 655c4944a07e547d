// A stick's stiffness for the rest of the app (shot results, the beam model): the bench test
// nearest before the day asked about, else the earliest one (a shaft only softens with use
// [CP], so the first test is the closest guess for an earlier day), else the printed rating.
import { eiFromFlex } from "../../shared/mechanics/sticklab";
import type { StickStiffness } from "../../shared/schemas/sticks";
import { log } from "../log";
import { recomputeShot } from "../shots/results";
import * as repo from "./repository";

export async function stickStiffness(teamId: string, stickId: string, onDate?: string): Promise<StickStiffness | null> {
  const row = await repo.stickById(teamId, stickId);
  if (!row) return null;
  const tests = (await repo.benchTestsOf(teamId, [stickId])).map((t) => t.test);
  const before = onDate ? tests.filter((t) => t.testedOn <= onDate) : tests;
  const test = before.at(-1) ?? tests[0];
  if (test) return { eiNm2: test.eiNm2, source: "bench", measuredFlex: test.measuredFlex, testedOn: test.testedOn };
  if (row.stick.ratedFlex) return { eiNm2: eiFromFlex(row.stick.ratedFlex), source: "rated", measuredFlex: null, testedOn: null };
  return null;
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
 * the old stiffness, so the shots area recomputes them. Never fails the caller's request.
 */
export async function stickStiffnessChanged(teamId: string, stickId: string, shotIds?: string[]): Promise<StiffnessChange> {
  const change = { teamId, stickId, shotIds: shotIds ?? (await repo.shotIdsWithStick(teamId, stickId)) };
  for (const shotId of change.shotIds) {
    try {
      await recomputeShot(shotId);
    } catch (err) {
      log.error({ err, stickId, shotId }, "recomputing a shot after a stiffness change failed");
    }
  }
  return change;
}
