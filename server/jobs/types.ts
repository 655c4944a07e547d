// One union of job payloads, with per-type attempts, time limit and concurrency. Feature areas
// add their job here and their handler in handlers.ts.
export interface JobTypes {
  /** Probe-then-extract every frame of an uploaded clip. */
  "clip.extract": { clipId: string; reqId?: string };
  /** Repair pass: re-queue clips that lack frames, remove orphaned files; hand back tracking runs whose worker died; announce grace that ended by the clock; drop ended limit windows. */
  "clip.sweep": Record<string, never>;
  /** Track every seeded landmark of a shot and propose its events (one tracking_run). */
  "shot.track": { runId: string; shotId: string; reqId?: string };
  /** Recompute the stored results of every shot of a clip, of a stick, or one shot (docs/decisions/125-recompute-on-the-queue.md). */
  "shot.recompute": RecomputeTarget & { reqId?: string };
}

/** Whose shots to recompute: one pending job per target (its singleton key). */
export interface RecomputeTarget {
  scope: "clip" | "stick" | "shot";
  id: string;
}
export type JobName = keyof JobTypes;

export interface JobPolicy {
  retryLimit: number;
  retryDelaySeconds: number;
  retryBackoff: boolean;
  expireInSeconds: number;
  /** Jobs of this type one worker process runs at once. */
  concurrency: number;
  /** pg-boss 10's queue policy; "stately": at most one waiting and one running job per singleton key. */
  policy?: "standard" | "stately";
}

export const jobPolicies: Record<JobName, JobPolicy> = {
  "clip.extract": { retryLimit: 3, retryDelaySeconds: 3, retryBackoff: true, expireInSeconds: 2 * 3600, concurrency: 1 },
  "clip.sweep": { retryLimit: 0, retryDelaySeconds: 0, retryBackoff: false, expireInSeconds: 600, concurrency: 1 },
  // CPU-bound on one core: one at a time per worker process; more workers, more shots at once.
  "shot.track": { retryLimit: 2, retryDelaySeconds: 2, retryBackoff: true, expireInSeconds: 1800, concurrency: 1 },
  // Coalesced per clip, stick or shot: repeated triggers while one waits join it.
  "shot.recompute": { retryLimit: 3, retryDelaySeconds: 5, retryBackoff: true, expireInSeconds: 1800, concurrency: 1, policy: "stately" },
};
