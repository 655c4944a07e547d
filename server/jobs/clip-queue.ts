// Clip jobs on the queue: send one extraction per clip, find and cancel a clip's jobs, and
// schedule the repair sweep. pg-boss keeps its jobs in PostgreSQL (schema pgboss), so a clip's
// live job is found by its payload.
import { jobStateOf, liveJobsWith, type LiveJobState } from "../db/queue-tables";
import { withNamedLock } from "../db/named-lock";
import { log } from "../log";
import { enqueue, startedQueue } from "./queue";

export interface LiveJob { id: string; state: LiveJobState; startedOn: Date | null; retryCount: number }

function boss() {
  const b = startedQueue();
  if (!b) throw new Error("the job queue is not started in this process");
  return b;
}

export function liveExtractJobs(clipId: string): Promise<LiveJob[]> {
  return liveJobsWith("clip.extract", "clipId", clipId);
}

/**
 * Queue the extraction of a clip unless one is already waiting or running. Without a queue in
 * this process the clip stays "extracting" and the next sweep queues it.
 */
export async function sendExtract(clipId: string, reqId?: string): Promise<string | null> {
  if (!startedQueue()) {
    log.warn({ clipId }, "no job queue in this process; the clip sweep will queue its extraction");
    return null;
  }
  void ensureClipSweepScheduled();
  // Check and send under one lock per clip, so two requests (or a request and the sweep, in any
  // process) cannot both find no job and send one.
  return withNamedLock(`clip.extract:${clipId}`, async () => {
    const live = await liveExtractJobs(clipId);
    if (live.length) return live[0].id;
    return enqueue("clip.extract", { clipId, reqId });
  });
}

/** Cancel waiting and running extraction jobs of a clip (a running handler notices the row is gone). */
export async function cancelExtract(clipId: string): Promise<number> {
  const b = startedQueue();
  if (!b) return 0;
  const ids = (await liveExtractJobs(clipId)).map((j) => j.id);
  if (ids.length) await b.cancel("clip.extract", ids);
  return ids.length;
}

/** Hand an active job back to the queue as failed: pg-boss retries it with backoff while attempts remain. */
export async function failJob(jobId: string, reason: string) {
  await boss().fail("clip.extract", jobId, { message: reason });
}

/** The state pg-boss gives a job after it was failed (retry, or failed once attempts are used up). */
export function jobState(jobId: string): Promise<string | null> {
  return jobStateOf(jobId);
}

export const SWEEP_CRON = "*/5 * * * *";
let scheduled: Promise<void> | undefined;
/** Every five minutes and once now. Idempotent per process; the schedule itself lives in PostgreSQL. */
export function ensureClipSweepScheduled(): Promise<void> {
  scheduled ??= (async () => {
    const b = boss();
    await b.schedule("clip.sweep", SWEEP_CRON, {});
    await b.send("clip.sweep", {});
  })().catch((err) => {
    scheduled = undefined;
    log.warn({ err }, "could not schedule the clip sweep");
  });
  return scheduled;
}
