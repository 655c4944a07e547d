// Tracking runs (table tracking_run), Drizzle only. Every write of a running run names the job
// working on it and requires the row still running: a cancelled or deleted run (the clip or shot
// deleted cascades here) turns every later write into a no-op the worker sees, and a run is
// finished in one update that sets its status and all its proposals together.
import { and, asc, desc, eq, inArray, lt, ne, or, sql } from "drizzle-orm";
import { db } from "../../db/client";
import { clip, shot, trackingRun, user } from "../../db/schema";
import type { TrackingPhase, TrackingProposals } from "../../../shared/schemas/tracking";
import type { ClipCalibration } from "../../../shared/schemas/shots";

const LIVE = ["queued", "running"] as const;

const runColumns = {
  id: trackingRun.id, teamId: trackingRun.teamId, shotId: trackingRun.shotId, status: trackingRun.status, phase: trackingRun.phase,
  done: trackingRun.done, total: trackingRun.total, seedFrame: trackingRun.seedFrame, seeds: trackingRun.seeds, frameStart: trackingRun.frameStart,
  frameEnd: trackingRun.frameEnd, jobId: trackingRun.jobId, attempts: trackingRun.attempts, proposals: trackingRun.proposals,
  failureReason: trackingRun.failureReason, requestedByName: user.name, createdAt: trackingRun.createdAt, startedAt: trackingRun.startedAt,
  finishedAt: trackingRun.finishedAt, updatedAt: trackingRun.updatedAt,
};

function runQuery() {
  return db().select(runColumns).from(trackingRun).leftJoin(user, eq(user.id, trackingRun.requestedBy));
}
type RawRun = Awaited<ReturnType<ReturnType<typeof runQuery>["where"]>>[number];
const typed = (r: RawRun) => ({ ...r, seeds: r.seeds as Record<string, [number, number]>, proposals: r.proposals as TrackingProposals | null, phase: r.phase as TrackingPhase | null });
export type RunRow = ReturnType<typeof typed>;

export async function runById(id: string): Promise<RunRow | null> {
  const [row] = await runQuery().where(eq(trackingRun.id, id));
  return row ? typed(row) : null;
}

/** The shot's newest run, whatever its state. */
export async function latestRun(teamId: string, shotId: string): Promise<RunRow | null> {
  const [row] = await runQuery().where(and(eq(trackingRun.shotId, shotId), eq(trackingRun.teamId, teamId))).orderBy(desc(trackingRun.createdAt)).limit(1);
  return row ? typed(row) : null;
}

export async function liveRun(shotId: string): Promise<RunRow | null> {
  const [row] = await runQuery().where(and(eq(trackingRun.shotId, shotId), inArray(trackingRun.status, LIVE)));
  return row ? typed(row) : null;
}

const isUniqueViolation = (e: unknown) => (e as { code?: string })?.code === "23505" || (e as { cause?: { code?: string } })?.cause?.code === "23505";

/**
 * A new queued run, and older finished runs of the shot removed (the page shows the newest).
 * Null when the shot already has a queued or running run (the partial unique index said so).
 */
export async function insertRun(v: { teamId: string; shotId: string; seedFrame: number; seeds: object; frameStart: number; frameEnd: number; requestedBy: string }) {
  try {
    return await db().transaction(async (tx) => {
      const [row] = await tx.insert(trackingRun).values(v).returning({ id: trackingRun.id });
      await tx.delete(trackingRun).where(and(eq(trackingRun.shotId, v.shotId), ne(trackingRun.id, row.id), sql`${trackingRun.status} not in ('queued', 'running')`));
      return row.id;
    });
  } catch (e) {
    if (isUniqueViolation(e)) return null;
    throw e;
  }
}

export async function setJobId(id: string, jobId: string) {
  await db().update(trackingRun).set({ jobId }).where(and(eq(trackingRun.id, id), eq(trackingRun.status, "queued")));
}

/**
 * The job takes the run: a queued run, or a running one it already held (a retry) or whose
 * worker has gone quiet for `staleMs`. Null when the run is gone, finished or someone else's.
 */
export async function claimRun(id: string, jobId: string, staleMs: number): Promise<RunRow | null> {
  const quiet = new Date(Date.now() - staleMs);
  const [row] = await db()
    .update(trackingRun)
    .set({ status: "running", jobId, attempts: sql`${trackingRun.attempts} + 1`, startedAt: new Date(), updatedAt: new Date(), phase: "decoding", done: 0, failureReason: null })
    .where(
      and(
        eq(trackingRun.id, id),
        or(eq(trackingRun.status, "queued"), and(eq(trackingRun.status, "running"), or(eq(trackingRun.jobId, jobId), lt(trackingRun.updatedAt, quiet)))),
      ),
    )
    .returning({ id: trackingRun.id });
  return row ? runById(row.id) : null;
}

/** Progress (and a heartbeat); false when the run is no longer this job's to write. */
export async function setProgress(id: string, jobId: string, p: { phase: TrackingPhase; done: number; total: number }): Promise<boolean> {
  const r = await db()
    .update(trackingRun)
    .set({ ...p, updatedAt: new Date() })
    .where(and(eq(trackingRun.id, id), eq(trackingRun.jobId, jobId), eq(trackingRun.status, "running")))
    .returning({ id: trackingRun.id });
  return r.length > 0;
}

/** Done with every proposal at once; false when the run was cancelled or deleted meanwhile. */
export async function finishRun(id: string, jobId: string, proposals: TrackingProposals, total: number): Promise<boolean> {
  const r = await db()
    .update(trackingRun)
    .set({ status: "done", proposals, phase: null, done: total, total, finishedAt: new Date(), updatedAt: new Date() })
    .where(and(eq(trackingRun.id, id), eq(trackingRun.jobId, jobId), eq(trackingRun.status, "running")))
    .returning({ id: trackingRun.id });
  return r.length > 0;
}

/** Failed with a reason, without proposals; jobId null fails it whoever holds it (the sweep). */
export async function failRun(id: string, jobId: string | null, reason: string): Promise<boolean> {
  const r = await db()
    .update(trackingRun)
    .set({ status: "failed", failureReason: reason, phase: null, proposals: null, finishedAt: new Date(), updatedAt: new Date() })
    .where(and(eq(trackingRun.id, id), inArray(trackingRun.status, LIVE), ...(jobId ? [eq(trackingRun.jobId, jobId)] : [])))
    .returning({ id: trackingRun.id });
  return r.length > 0;
}

/** Back to queued for another attempt (its progress gone with it). */
export async function requeueRun(id: string, jobId: string, reason: string) {
  await db()
    .update(trackingRun)
    .set({ status: "queued", failureReason: reason, phase: null, done: 0, updatedAt: new Date() })
    .where(and(eq(trackingRun.id, id), eq(trackingRun.jobId, jobId), eq(trackingRun.status, "running")));
}

/** Cancel the shot's live run; its id and job when there was one. */
export async function cancelLiveRun(shotId: string, by: string): Promise<{ id: string; jobId: string | null } | null> {
  const [row] = await db()
    .update(trackingRun)
    .set({ status: "cancelled", failureReason: `Cancelled by ${by}.`, phase: null, finishedAt: new Date(), updatedAt: new Date() })
    .where(and(eq(trackingRun.shotId, shotId), inArray(trackingRun.status, LIVE)))
    .returning({ id: trackingRun.id, jobId: trackingRun.jobId });
  return row ?? null;
}

/** Running runs whose worker has written nothing for `staleMs`, and queued ones waiting that long. */
export async function quietRuns(staleMs: number) {
  return db()
    .select({ id: trackingRun.id, status: trackingRun.status, jobId: trackingRun.jobId, shotId: trackingRun.shotId, attempts: trackingRun.attempts })
    .from(trackingRun)
    .where(and(inArray(trackingRun.status, LIVE), lt(trackingRun.updatedAt, new Date(Date.now() - staleMs))));
}

/** What the grey decode needs of the clip's stored probe (server/media/probe.ts). */
interface ClipDecodeFacts {
  videoStreamIndex?: number;
  pixelFormat?: string | null;
  colorRange?: string | null;
  interlaced?: boolean;
  pixelAspect?: number | null;
  bitsPerSample?: number | null;
}

/** What a run needs of its shot and clip to decode and track. */
export async function workOf(shotId: string) {
  const [row] = await db()
    .select({
      shotId: shot.id, teamId: shot.teamId, frameStart: shot.frameStart, frameEnd: shot.frameEnd, clipId: clip.id, clipStatus: clip.status,
      width: clip.width, height: clip.height, frameCount: clip.frameCount, probe: clip.probe, calibration: clip.calibration, captureFps: clip.captureFps,
    })
    .from(shot)
    .innerJoin(clip, eq(clip.id, shot.clipId))
    .where(eq(shot.id, shotId));
  return row ? { ...row, calibration: row.calibration as ClipCalibration | null, probe: row.probe as ClipDecodeFacts | null } : null;
}

/** The team's runs queued or running, oldest first: at most `limit`, each row with the count of all of them. */
export async function liveTrackingRuns(teamId: string, limit: number) {
  return db()
    .select({ shotId: shot.id, clipId: shot.clipId, label: shot.label, status: trackingRun.status, done: trackingRun.done, total: trackingRun.total, all: sql<number>`(count(*) over ())::int` })
    .from(trackingRun)
    .innerJoin(shot, eq(shot.id, trackingRun.shotId))
    .where(and(eq(trackingRun.teamId, teamId), inArray(trackingRun.status, LIVE)))
    .orderBy(asc(trackingRun.createdAt))
    .limit(limit);
}
