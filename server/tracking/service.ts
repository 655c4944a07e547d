// Auto-digitise: start a tracking run from the analyst's seeds, read the shot's latest run, cancel
// the live one. Two analysts starting at once get the same run (one per shot at a time).
import type { Actor } from "../auth/policy";
import { HttpError } from "../http/problem";
import { editableShot, visibleShot } from "../shots/service";
import { cancelTrackJob, sendTrack } from "../jobs/track-queue";
import { LANDMARKS, landmarkLabels, outsideFrameMessage } from "../../shared/schemas/shots";
import type { StartTrackingBody, TrackingAnswer, TrackingRun } from "../../shared/schemas/tracking";
import * as repo from "../entities/tracking-run/repository";

const invalid = (path: string, message: string) => new HttpError(422, "validation_failed", `${path}: ${message}`, [{ path, message }]);

export function present(r: repo.RunRow, withProposals = true): TrackingRun {
  return {
    id: r.id, shotId: r.shotId, status: r.status, phase: r.phase, done: r.done, total: r.total, seedFrame: r.seedFrame, seeds: r.seeds,
    failureReason: r.failureReason, requestedByName: r.requestedByName, createdAt: r.createdAt.toISOString(), finishedAt: r.finishedAt?.toISOString() ?? null,
    proposals: withProposals ? r.proposals : null,
  };
}

export async function startTracking(a: Actor, shotId: string, b: StartTrackingBody, reqId?: string): Promise<{ run: TrackingRun; started: boolean }> {
  const s = await editableShot(a, shotId);
  const work = await repo.workOf(s.id);
  if (!work || work.clipStatus !== "ready" || !work.width || !work.height || !work.frameCount)
    throw new HttpError(409, "clip_not_ready", "This clip's frames are not ready yet; wait until extraction finishes.");
  const frameEnd = s.frameEnd ?? work.frameCount;
  if (b.seedFrame < s.frameStart || b.seedFrame > frameEnd) throw invalid("seedFrame", `frame ${b.seedFrame} is outside this shot's frames ${s.frameStart}–${frameEnd}`);
  for (const k of LANDMARKS) {
    const p = b.seeds[k];
    if (p && !(p[0] >= 0 && p[1] >= 0 && p[0] <= work.width && p[1] <= work.height))
      throw invalid(`seeds.${k}`, `${landmarkLabels[k]}: ${outsideFrameMessage({ width: work.width, height: work.height, frameStart: 1, frameEnd: 1 }, p[0], p[1])}`);
  }
  const live = await repo.liveRun(s.id);
  if (live) return { run: present(live, false), started: false };
  const id = await repo.insertRun({ teamId: a.teamId, shotId: s.id, seedFrame: b.seedFrame, seeds: b.seeds, frameStart: s.frameStart, frameEnd, requestedBy: a.userId });
  if (!id) {
    // Someone else's start won the race between our check and our insert: theirs is the run.
    const theirs = await repo.liveRun(s.id);
    if (theirs) return { run: present(theirs, false), started: false };
    throw new HttpError(409, "tracking_busy", "Another tracking run of this shot just started or ended; try again.");
  }
  const jobId = await sendTrack(id, s.id, reqId);
  if (jobId) await repo.setJobId(id, jobId);
  return { run: present((await repo.runById(id))!, false), started: true };
}

export async function getTracking(a: Actor, shotId: string): Promise<TrackingAnswer> {
  const s = await visibleShot(a, shotId);
  const r = await repo.latestRun(a.teamId, s.id);
  return { run: r ? present(r) : null };
}

/** The latest run, for the progress stream (already checked visible). */
export async function latestFor(teamId: string, shotId: string) {
  const r = await repo.latestRun(teamId, shotId);
  return r ? present(r) : null;
}

export async function cancelTracking(a: Actor, shotId: string, byName: string): Promise<void> {
  const s = await editableShot(a, shotId);
  const cancelled = await repo.cancelLiveRun(s.id, byName);
  if (cancelled?.jobId) await cancelTrackJob(cancelled.jobId);
}
