// Repair of tracking runs, run with the clip sweep: a run whose worker stopped writing (killed,
// out of memory) is handed back to pg-boss to retry, or failed with the reason once its attempts
// are spent; a run queued with no job (this process had no queue) is queued now. Nothing a dead
// worker half-did survives: a run's proposals are only ever written whole.
import type pino from "pino";
import * as repo from "../entities/tracking-run/repository";
import { failTrackJob, sendTrack, trackJobState } from "./track-queue";
import { jobPolicies } from "./types";
import { trackStaleMs } from "./shot-track";

export interface TrackSweepReport { handedBack: string[]; failed: string[]; queued: string[] }

export async function sweepTracking(log: pino.Logger): Promise<TrackSweepReport> {
  const report: TrackSweepReport = { handedBack: [], failed: [], queued: [] };
  for (const run of await repo.quietRuns(trackStaleMs())) {
    const job = run.jobId ? await trackJobState(run.jobId) : null;
    if (run.status === "queued") {
      if (!job || !["created", "retry", "active"].includes(job.state)) {
        const jobId = await sendTrack(run.id, run.shotId);
        if (jobId) await repo.setJobId(run.id, jobId);
        report.queued.push(run.id);
      }
      continue;
    }
    const spent = (job?.retryCount ?? 0) >= jobPolicies["shot.track"].retryLimit;
    if (job?.state === "active" && !spent) {
      await failTrackJob(run.jobId!, "The worker stopped writing progress (it may have been killed); trying again.");
      report.handedBack.push(run.id);
    } else if (!job || job.state === "active" || job.state === "failed" || job.state === "completed" || job.state === "cancelled") {
      if (job?.state === "active") await failTrackJob(run.jobId!, "The worker stopped on every attempt.");
      await repo.failRun(run.id, null, "The worker tracking this shot stopped (it may have been killed or run out of memory) on every attempt. Press Track to try again.");
      report.failed.push(run.id);
    }
  }
  if (Object.values(report).some((v) => v.length)) log.info(report, "tracking sweep repaired");
  return report;
}
