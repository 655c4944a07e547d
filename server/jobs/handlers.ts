import type pino from "pino";
import type { JobName, JobTypes } from "./types";
import { jobPolicies } from "./types";
import { extractClip } from "./clip-extract";
import { sweepClips } from "./clip-sweep";
import { backfillClipTiming } from "./clip-timing-backfill";
import { runTracking } from "./shot-track";
import { sweepTracking } from "./track-sweep";
import { announceGraceEnded } from "../billing/sync";
import { removeEndedWindows } from "../security/rate-limit-store";
import { recomputeOutdatedResults, resendForgottenRecomputes, runRecompute } from "../shots/results";

export interface JobContext {
  jobId: string;
  log: pino.Logger;
  retryCount: number;
}
export type JobHandler<N extends JobName> = (data: JobTypes[N], ctx: JobContext) => Promise<void>;

export const handlers: { [N in JobName]?: JobHandler<N> } = {
  "clip.extract": async ({ clipId }, ctx) => {
    await extractClip(clipId, { log: ctx.log, lastAttempt: ctx.retryCount >= jobPolicies["clip.extract"].retryLimit });
  },
  "clip.sweep": async (_data, ctx) => {
    await sweepClips(ctx.log);
    await backfillClipTiming(ctx.log);
    await sweepTracking(ctx.log);
    await announceGraceEnded(ctx.log);
    await removeEndedWindows();
    const recomputed = await recomputeOutdatedResults();
    if (recomputed) ctx.log.info({ recomputed }, "results from an earlier engine computed again");
    const resent = await resendForgottenRecomputes();
    if (resent) ctx.log.info({ resent }, "results left marked for a recompute were queued again");
  },
  "shot.recompute": async ({ scope, id }, ctx) => {
    const shots = await runRecompute({ scope, id });
    ctx.log.info({ scope, id, shots }, "results recomputed");
  },
  "shot.track": async ({ runId }, ctx) => {
    await runTracking(runId, { jobId: ctx.jobId, log: ctx.log, lastAttempt: ctx.retryCount >= jobPolicies["shot.track"].retryLimit });
  },
};
