// shot.track: one auto-digitise run. The clip's original decoded once, straight to grey, over the
// shot's frames; every seeded landmark followed back and on from the seed frame; the events and a
// scale bar proposed from the tracks; all of it stored in one write. Cancelled, or the shot or clip
// deleted meanwhile: the next progress write finds the row gone and the run stops, writing nothing.
// A deterministic failure (bad seeds, a clip ffmpeg cannot read) fails the run with its reason;
// anything else is thrown so pg-boss retries, and the last attempt fails the run.
import { createWriteStream } from "node:fs";
import path from "node:path";
import { pipeline } from "node:stream/promises";
import type pino from "pino";
import { z } from "zod";
import { env } from "../env";
import { decodeGrayFrames, isRetryable, withJobDir } from "../media";
import { clipKeys } from "../storage";
import { mediaConfig, storage } from "../clips/deps";
import { FrameStore } from "../tracking/frame-store";
import { buildProposals } from "../tracking/proposals";
import { startRunCost, type RunCostMeter } from "../tracking/run-cost";
import * as repo from "../entities/tracking-run/repository";
import { isTrackInputError } from "../../shared/tracking/errors";
import { trackShot } from "../../shared/tracking/shot-tracker";
import type { Landmark } from "../../shared/schemas/shot-document";

/** A running run that wrote nothing for this long has lost its worker (TRACK_STALE_SECONDS for the fault tests). */
export const trackStaleMs = () => z.coerce.number().positive().default(60).parse(process.env.TRACK_STALE_SECONDS) * 1000;
const PROGRESS_EVERY_MS = 300;
const HEARTBEAT_MS = 10_000;

export interface TrackRun {
  jobId: string;
  log: pino.Logger;
  lastAttempt: boolean;
}

export type TrackOutcome = "done" | "failed" | "skipped";

class RunGone extends Error {}

export async function runTracking(runId: string, job: TrackRun): Promise<TrackOutcome> {
  const cost = startRunCost();
  try {
    return await track(runId, job, cost);
  } finally {
    cost.stop();
  }
}

async function track(runId: string, job: TrackRun, cost: RunCostMeter): Promise<TrackOutcome> {
  const run = await repo.claimRun(runId, job.jobId, trackStaleMs());
  if (!run) {
    job.log.info({ runId }, "tracking run not waiting (cancelled, deleted or taken); skipped");
    return "skipped";
  }
  const fail = async (reason: string) => {
    job.log.warn({ runId, reason }, "tracking run failed");
    return (await repo.failRun(runId, job.jobId, reason)) ? "failed" : "skipped";
  };
  const work = await repo.workOf(run.shotId);
  if (!work) return "skipped"; // the shot is gone, and the run with it
  if (work.clipStatus !== "ready" || !work.width || !work.height || !work.frameCount) return fail("The clip's frames are not ready; track again once they are.");
  const first = Math.max(1, run.frameStart);
  const last = Math.min(work.frameCount, run.frameEnd);
  if (run.seedFrame < first || run.seedFrame > last) return fail(`The seed frame ${run.seedFrame} is outside the shot's frames ${first}–${last}.`);

  const abort = new AbortController();
  let lastWrite = 0;
  let writes = Promise.resolve();
  const progress = (phase: "decoding" | "tracking" | "events", done: number, total: number, force = false) => {
    const now = Date.now();
    if (!force && now - lastWrite < PROGRESS_EVERY_MS) return;
    lastWrite = now;
    writes = writes.then(async () => {
      if (!(await repo.setProgress(runId, job.jobId, { phase, done, total }))) abort.abort(new RunGone("the run was cancelled or deleted"));
    });
  };
  cost.phase("claim");
  let last$ = { phase: "decoding" as "decoding" | "tracking" | "events", done: 0, total: 0 };
  const beat = setInterval(() => progress(last$.phase, last$.done, last$.total, true), HEARTBEAT_MS);
  progress("decoding", 0, 0, true);

  try {
    const result = await withJobDir({ tmpRoot: mediaConfig().tmpRoot }, `track-${runId}`, async (dir) => {
      const st = storage();
      const originalKey = clipKeys.original(work.clipId);
      let input = st.localPath(originalKey);
      if (!input) {
        input = path.join(dir, "original");
        await pipeline((await st.get(originalKey)).body, createWriteStream(input));
      }
      const store = new FrameStore({ first, last, width: work.width!, height: work.height!, budgetBytes: env().TRACK_MEMORY_MB * 1024 * 1024, spillDir: dir });
      const decoding = decodeGrayFrames(mediaConfig(), {
        input, videoStreamIndex: work.probe?.videoStreamIndex ?? 0, first, last, width: work.width!, height: work.height!, signal: abort.signal,
        pixelFormat: work.probe?.pixelFormat, colorRange: work.probe?.colorRange, interlaced: work.probe?.interlaced, pixelAspect: work.probe?.pixelAspect, bitsPerSample: work.probe?.bitsPerSample,
        onFrame: (f, data) => store.put(f, data),
      }).then(
        (n) => store.end(n === last - first + 1 ? undefined : new Error(`the clip gave ${n} of the shot's ${last - first + 1} frames`)),
        (err) => {
          store.end(err);
          throw err;
        },
      );
      decoding.catch(() => undefined); // surfaced through the frames the tracker waits for, or awaited below
      try {
        const tracked = await trackShot(
          { frames: store, first, last, seedFrame: run.seedFrame, seeds: run.seeds as Partial<Record<Landmark, [number, number]>>, signal: abort.signal },
          (p) => {
            last$ = { phase: "tracking", done: p.done, total: p.total };
            progress("tracking", p.done, p.total);
          },
        );
        cost.phase("decode and track");
        return tracked;
      } finally {
        abort.abort(new RunGone("finished"));
        await decoding.catch(() => undefined);
        await store.close();
      }
    });
    await writes;
    cost.phase("decoder's end, progress writes");
    if (abort.signal.reason instanceof RunGone && abort.signal.reason.message !== "finished") return "skipped";
    last$ = { phase: "events", done: result.work, total: result.work };
    const proposals = buildProposals(run.seedFrame, run.seeds as Partial<Record<Landmark, [number, number]>>, result, { calibrated: !!work.calibration });
    cost.phase("events");
    if (!(await repo.finishRun(runId, job.jobId, proposals, result.work))) return "skipped";
    cost.phase("store");
    job.log.info({ runId, landmarkFrames: result.work, cost: cost.end() }, "tracking run done");
    return "done";
  } catch (err) {
    await writes.catch(() => undefined);
    if (abort.signal.reason instanceof RunGone && abort.signal.reason.message !== "finished") {
      job.log.info({ runId }, "tracking run cancelled or deleted while it ran; nothing stored");
      return "skipped";
    }
    if (isTrackInputError(err)) return fail(`The seeds cannot be tracked: ${err.message}`);
    if (!isRetryable(err)) return fail((err as Error).message || "Tracking failed");
    if (job.lastAttempt) return fail(`${(err as Error).message || "Tracking failed"} (gave up after several attempts)`);
    throw err;
  } finally {
    clearInterval(beat);
  }
}
