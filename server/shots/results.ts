import { log } from "../log";
import { ENGINE_VERSION } from "../../shared/mechanics/index";
import { offLoop } from "../cpu/pool";
import { shotFrameTimes } from "../../shared/schemas/clips";
import { toShotDocument, type StoredResult } from "../../shared/schemas/shots";
import { shotStickInfo } from "../entities/stick/stiffness";
import { canQueueRecompute, sendRecompute, type RecomputeTarget } from "../jobs/recompute-queue";
import * as repo from "../entities/shot/repository";
import { shotIdsWithStick } from "../entities/stick/repository";

// The stored, authoritative results of a shot. Called whenever marks, events, the clip's
// calibration or the stick (or its bench tests) change. Each run re-reads the latest state under a
// per-shot advisory lock, so overlapping saves cannot leave an older result on top of a newer one.

export function toStoredResult(r: { engineVersion: string; results: unknown; error: string | null; shotVersion: number; computedAt: Date; recomputeRequestedAt?: Date | null }): StoredResult {
  return {
    engineVersion: r.engineVersion, results: r.results as StoredResult["results"], error: r.error, shotVersion: r.shotVersion, computedAt: r.computedAt.toISOString(),
    recomputing: !!r.recomputeRequestedAt,
  };
}

/**
 * Recompute one shot with the mechanics engine and store the outcome in shot_result: the results,
 * or (results null) an error saying what is missing or wrong. Returns what was stored; null when the
 * shot no longer exists.
 */
export async function recomputeShot(shotId: string): Promise<StoredResult | null> {
  return repo.withShotResultLock(shotId, async (tx) => {
    const readAt = await repo.clockNow(tx);
    const inputs = await repo.recomputeInputs(tx, shotId);
    if (!inputs) return null;
    const { shot, clip } = inputs;
    const flex = inputs.stick ? shotStickInfo(inputs.stick) : null;
    const frameEnd = shot.frameEnd ?? clip.frameCount ?? shot.frameStart;
    const built = toShotDocument({
      captureFps: clip.captureFps,
      calibration: clip.calibration,
      marks: shot.marks,
      events: shot.events,
      frameStart: shot.frameStart,
      frameEnd,
      stick: flex?.flex ? { flex: flex.flex, benchSpanMm: flex.benchSpanMm } : null,
      frameTimes: shotFrameTimes(clip.frameTimes, clip.storedFps, clip.captureFps, shot.frameStart, frameEnd),
    });
    let results: unknown = null;
    let error: string | null = built.missing;
    if (built.doc) {
      try {
        // In a worker thread: the engine's Monte Carlo takes tens of milliseconds of CPU.
        const out = await offLoop("computeShot", built.doc);
        if ("results" in out) results = out.results;
        else error = `The marks cannot give results yet: ${out.inputError}`;
      } catch (e) {
        log.error({ err: e, shotId }, "mechanics engine failed");
        error = `The mechanics engine failed on this shot: ${(e as Error).message}`;
      }
    }
    const row = await repo.upsertResult(tx, { shotId, teamId: shot.teamId, engineVersion: ENGINE_VERSION, results, error, shotVersion: shot.version }, readAt);
    if (results !== null) await repo.autoPublishIfTeamWants(tx, shotId);
    return toStoredResult(row);
  });
}

/**
 * Results stored by an earlier engine are computed again (a batch per clip sweep), so the readout,
 * the PDF and the CSV show what the Digitise preview — always the current engine — shows. Each is
 * a shot's recompute job, so it joins any other waiting for that shot.
 */
export async function recomputeOutdatedResults(limit = 200): Promise<number> {
  const ids = await repo.shotIdsWithResultsOtherThan(ENGINE_VERSION, limit);
  for (const id of ids) await recomputeLater({ scope: "shot", id });
  return ids.length;
}

/** The shots a recompute target covers, as they are now. */
async function shotsOf(t: RecomputeTarget): Promise<string[]> {
  if (t.scope === "clip") return repo.shotIdsOfClip(t.id);
  if (t.scope === "stick") return shotIdsWithStick(t.id);
  return [t.id];
}

/**
 * After something the results of many shots depend on changed (the clip's calibration, the
 * stick's stiffness): their results are marked "recomputing" and one job is queued for the target,
 * so the request that changed it answers at once (docs/decisions/125-recompute-on-the-queue.md).
 * A process without a job queue (scripts, most tests) recomputes here instead.
 */
export async function recomputeLater(t: RecomputeTarget, reqId?: string): Promise<void> {
  if (!canQueueRecompute()) {
    await runRecompute(t);
    return;
  }
  await repo.markRecomputing(t);
  await sendRecompute(t, reqId);
}

/** The job's work: every shot of the target, each under its own lock, with the inputs of now. */
export async function runRecompute(t: RecomputeTarget): Promise<number> {
  const ids = await shotsOf(t);
  for (const id of ids) await recomputeShot(id);
  return ids.length;
}

/** Results left marked (a job lost with its worker, or never sent) get a job of their own. */
export async function resendForgottenRecomputes(olderThanMs = 5 * 60_000): Promise<number> {
  const ids = await repo.forgottenRecomputes(olderThanMs, 500);
  for (const id of ids) await sendRecompute({ scope: "shot", id });
  return ids.length;
}

/** After a stick's rated flex or bench tests changed (tests and scripts; the stick lab queues it). */
export async function recomputeShotsOfStick(stickId: string): Promise<void> {
  await runRecompute({ scope: "stick", id: stickId });
}
