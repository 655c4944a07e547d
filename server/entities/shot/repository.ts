import { and, asc, eq, inArray, isNull, lt, sql } from "drizzle-orm";
import { alias } from "drizzle-orm/pg-core";
import { db } from "../../db/client";
import { clip, shot, shotResult, shotShare, stick, teamSettings, trainingSession, user } from "../../db/schema";
import { recordAudit, type AuditEntry } from "../audit/repository";
import { shotDateSql } from "./date";
import { benchTestInForce } from "../stick/stiffness";
import type { ClipCalibration, ShotEventsDraft, ShotMarks } from "../../../shared/schemas/shots";

// Drizzle only: every query names the team, so a row of another team is simply not found.

const player = alias(user, "player");
const editor = alias(user, "editor");

const shotColumns = {
  id: shot.id, teamId: shot.teamId, clipId: shot.clipId, label: shot.label, playerId: shot.playerId, playerName: player.name, stickId: shot.stickId,
  stickLabel: stick.label, frameStart: shot.frameStart, frameEnd: shot.frameEnd, marks: shot.marks, events: shot.events, version: shot.version,
  updatedAt: shot.updatedAt, updatedByName: editor.name, publishedAt: shot.publishedAt,
  // The stick's stiffness in force on the shot's date, in the same round trip.
  stickRatedFlex: stick.ratedFlex, stickTestInForce: benchTestInForce(shot.stickId, shotDateSql),
  resultEngine: shotResult.engineVersion, results: shotResult.results, resultError: shotResult.error, resultShotVersion: shotResult.shotVersion, computedAt: shotResult.computedAt,
  recomputeRequestedAt: shotResult.recomputeRequestedAt,
};

function shotQuery() {
  return db()
    .select(shotColumns)
    .from(shot)
    .innerJoin(clip, eq(clip.id, shot.clipId))
    .leftJoin(trainingSession, eq(trainingSession.id, clip.sessionId))
    .leftJoin(player, eq(player.id, shot.playerId))
    .leftJoin(editor, eq(editor.id, shot.updatedBy))
    .leftJoin(stick, eq(stick.id, shot.stickId))
    .leftJoin(shotResult, eq(shotResult.shotId, shot.id));
}

type RawShot = Awaited<ReturnType<ReturnType<typeof shotQuery>["where"]>>[number];
function typed(r: RawShot) {
  return { ...r, marks: r.marks as ShotMarks, events: r.events as ShotEventsDraft };
}
export type ShotRow = ReturnType<typeof typed>;

export async function shotById(teamId: string, shotId: string) {
  const [row] = await shotQuery().where(and(eq(shot.id, shotId), eq(shot.teamId, teamId)));
  return row ? typed(row) : null;
}

export async function shotsOfClip(teamId: string, clipId: string) {
  const rows = await shotQuery().where(and(eq(shot.clipId, clipId), eq(shot.teamId, teamId))).orderBy(asc(shot.frameStart), asc(shot.createdAt));
  return rows.map(typed);
}

/** What deleting a clip takes with it: its shots and the marks they hold (every landmark's points). */
export async function shotsAndMarksOfClip(teamId: string, clipId: string): Promise<{ shots: number; marks: number }> {
  const marksOfShot = sql`(select coalesce(sum(jsonb_array_length(t.v)), 0) from jsonb_each(${shot.marks}) as t(k, v) where jsonb_typeof(t.v) = 'array')`;
  const [row] = await db()
    .select({ shots: sql<number>`count(*)::int`, marks: sql<number>`coalesce(sum(${marksOfShot}), 0)::int` })
    .from(shot)
    .where(and(eq(shot.clipId, clipId), eq(shot.teamId, teamId)));
  return { shots: row?.shots ?? 0, marks: row?.marks ?? 0 };
}

/** Users each shot is shared with. */
export async function sharesOf(shotIds: string[]) {
  const out = new Map<string, string[]>();
  if (!shotIds.length) return out;
  const rows = await db().select({ shotId: shotShare.shotId, userId: shotShare.userId }).from(shotShare).where(inArray(shotShare.shotId, shotIds));
  for (const r of rows) out.set(r.shotId, [...(out.get(r.shotId) ?? []), r.userId]);
  return out;
}


export async function insertShot(v: { teamId: string; clipId: string; label: string; frameStart: number; frameEnd: number; playerId: string | null; stickId: string | null; userId: string }) {
  const [row] = await db()
    .insert(shot)
    .values({ teamId: v.teamId, clipId: v.clipId, label: v.label, frameStart: v.frameStart, frameEnd: v.frameEnd, playerId: v.playerId, stickId: v.stickId, updatedBy: v.userId })
    .returning({ id: shot.id });
  return row.id;
}

/** Saves only when the stored version is still `baseVersion`; null when someone saved in between. */
export async function saveMarks(shotId: string, baseVersion: number, marks: ShotMarks, events: ShotEventsDraft, userId: string) {
  const [row] = await db()
    .update(shot)
    .set({ marks, events, version: sql`${shot.version} + 1`, updatedBy: userId, updatedAt: new Date() })
    .where(and(eq(shot.id, shotId), eq(shot.version, baseVersion)))
    .returning({ version: shot.version, updatedAt: shot.updatedAt });
  return row ?? null;
}

/** The shot's label, frames, player or stick; with `audit`, its entry lands in the same transaction. */
export async function updateShotMeta(shotId: string, v: Partial<{ label: string; frameStart: number; frameEnd: number; playerId: string | null; stickId: string | null }>, audit?: AuditEntry) {
  await db().transaction(async (tx) => {
    await tx.update(shot).set({ ...v, updatedAt: new Date() }).where(eq(shot.id, shotId));
    if (audit) await recordAudit(audit, tx);
  });
}

export async function deleteShot(shotId: string) {
  await db().delete(shot).where(eq(shot.id, shotId));
}

export async function shotIdsOfClip(clipId: string) {
  return (await db().select({ id: shot.id }).from(shot).where(eq(shot.clipId, clipId))).map((r) => r.id);
}

/** Shots whose stored result came from another engine version (oldest first), at most `limit`. */
export async function shotIdsWithResultsOtherThan(engineVersion: string, limit: number) {
  const rows = await db()
    .select({ id: shotResult.shotId })
    .from(shotResult)
    .where(sql`${shotResult.engineVersion} <> ${engineVersion}`)
    .orderBy(asc(shotResult.computedAt))
    .limit(limit);
  return rows.map((r) => r.id);
}

/** What recomputing needs, read inside the caller's transaction. */
export async function recomputeInputs(tx: Tx, shotId: string) {
  const [s] = await tx
    .select({
      teamId: shot.teamId, clipId: shot.clipId, stickId: shot.stickId, marks: shot.marks, events: shot.events, version: shot.version, frameStart: shot.frameStart, frameEnd: shot.frameEnd,
      captureFps: clip.captureFps, storedFps: clip.storedFps, frameTimes: clip.frameTimes, frameCount: clip.frameCount, calibration: clip.calibration,
      stickLabel: stick.label, stickRatedFlex: stick.ratedFlex, stickTestInForce: benchTestInForce(shot.stickId, shotDateSql),
    })
    .from(shot)
    .innerJoin(clip, eq(clip.id, shot.clipId))
    .leftJoin(trainingSession, eq(trainingSession.id, clip.sessionId))
    .leftJoin(stick, eq(stick.id, shot.stickId))
    .where(eq(shot.id, shotId));
  if (!s) return null;
  return {
    shot: { ...s, marks: s.marks as ShotMarks, events: s.events as ShotEventsDraft },
    clip: { captureFps: s.captureFps, storedFps: s.storedFps, frameTimes: s.frameTimes, frameCount: s.frameCount, calibration: s.calibration as ClipCalibration | null },
    // The stick and its stiffness in force on the shot's date (docs/decisions/122-stiffness-in-force.md).
    stick: s.stickId && s.stickLabel !== null ? { id: s.stickId, label: s.stickLabel, ratedFlex: s.stickRatedFlex, testInForce: s.stickTestInForce } : null,
  };
}

export type Tx = Parameters<Parameters<ReturnType<typeof db>["transaction"]>[0]>[0];

/** Runs `fn` in a transaction holding the shot's results lock, so two runs for one shot store one after the other. */
export function withShotResultLock<T>(shotId: string, fn: (tx: Tx) => Promise<T>): Promise<T> {
  return db().transaction(async (tx) => {
    await tx.execute(sql`select pg_advisory_xact_lock(hashtext(${"shot-result:" + shotId}))`);
    return fn(tx);
  });
}

/** A team that skips the review step: a shot with results is published by itself (by nobody). */
export async function autoPublishIfTeamWants(tx: Tx, shotId: string) {
  await tx
    .update(shot)
    .set({ publishedAt: sql`now()` })
    .where(and(eq(shot.id, shotId), isNull(shot.publishedAt), sql`exists (select 1 from ${teamSettings} where ${teamSettings.teamId} = ${shot.teamId} and ${teamSettings.autoPublish})`));
}


/** The transaction's clock now, to the microsecond (as text: a JS Date would round it). */
export async function clockNow(tx: Tx): Promise<string> {
  const r = await tx.execute<{ t: string }>(sql`select clock_timestamp()::text as t`);
  return r.rows[0].t;
}

/**
 * Stores a run's outcome. `readAt`: when the run read its inputs; a recompute requested up to
 * then is answered by this run (its marker cleared), one requested later stays for its own job.
 */
export async function upsertResult(tx: Tx, v: { shotId: string; teamId: string; engineVersion: string; results: unknown; error: string | null; shotVersion: number }, readAt: string) {
  const { shotId, teamId, engineVersion, results, error, shotVersion } = v;
  const [row] = await tx
    .insert(shotResult)
    .values({ shotId, teamId, engineVersion, results, error, shotVersion, computedAt: new Date() })
    .onConflictDoUpdate({
      target: shotResult.shotId,
      set: {
        engineVersion, results, error, shotVersion, computedAt: new Date(),
        recomputeRequestedAt: sql`case when ${shotResult.recomputeRequestedAt} <= ${readAt}::timestamptz then null else ${shotResult.recomputeRequestedAt} end`,
      },
    })
    .returning();
  return row;
}

/** Marks the shots' stored results as being recomputed (shots without stored results have nothing to mark). */
export async function markRecomputing(target: { scope: "clip" | "stick" | "shot"; id: string }) {
  const column = { clip: shot.clipId, stick: shot.stickId, shot: shot.id }[target.scope];
  await db()
    .update(shotResult)
    .set({ recomputeRequestedAt: sql`clock_timestamp()` })
    .where(inArray(shotResult.shotId, db().select({ id: shot.id }).from(shot).where(eq(column, target.id))));
}

/** Shots marked for a recompute longer ago than `olderThanMs` (their job may have been lost), oldest first. */
export async function forgottenRecomputes(olderThanMs: number, limit: number) {
  const rows = await db()
    .select({ id: shotResult.shotId })
    .from(shotResult)
    .where(lt(shotResult.recomputeRequestedAt, new Date(Date.now() - olderThanMs)))
    .orderBy(asc(shotResult.recomputeRequestedAt))
    .limit(limit);
  return rows.map((r) => r.id);
}
