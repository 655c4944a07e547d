// Tracking jobs on the queue: send one per run, cancel a run's waiting job, hand a dead worker's
// job back. pg-boss's own API only; the run row (server/tracking) is the truth about a run.
import { log } from "../log";
import { enqueue, startedQueue } from "./queue";
import { ensureClipSweepScheduled } from "./clip-queue";

/** Queue the run; without a queue in this process it stays queued and the sweep sends it. */
export async function sendTrack(runId: string, shotId: string, reqId?: string): Promise<string | null> {
  if (!startedQueue()) {
    log.warn({ runId }, "no job queue in this process; the sweep will queue the tracking run");
    return null;
  }
  void ensureClipSweepScheduled();
  return enqueue("shot.track", { runId, shotId, reqId });
}

/** Take a waiting job off the queue (a running one notices its cancelled row itself). */
export async function cancelTrackJob(jobId: string) {
  const boss = startedQueue();
  if (!boss) return;
  const job = await boss.getJobById("shot.track", jobId);
  if (job && (job.state === "created" || job.state === "retry")) await boss.cancel("shot.track", jobId);
}

export interface TrackJobState {
  state: string;
  retryCount: number;
}

export async function trackJobState(jobId: string): Promise<TrackJobState | null> {
  const boss = startedQueue();
  const job = boss ? await boss.getJobById("shot.track", jobId) : null;
  return job ? { state: job.state, retryCount: job.retryCount } : null;
}

/** Hand an active job back as failed: pg-boss retries it with backoff while attempts remain. */
export async function failTrackJob(jobId: string, reason: string) {
  await startedQueue()?.fail("shot.track", jobId, { message: reason });
}
