// Drizzle only: the few small reads of the home page. Each names the team; each list comes back
// with its full count (a window count) and at most `limit` rows, so the page costs a handful of
// index reads whatever the team's size.
import { and, asc, desc, eq, gt, inArray, isNotNull, isNull, sql, type SQL } from "drizzle-orm";
import { db } from "../db/client";
import { clip, shot, shotResult, shotShare, trackingRun, user } from "../db/schema";
import type { Actor } from "../entities/member/role";
import { newestShotFirst, shotDateSql } from "../entities/shot/date";
import { shotVisibleWhere } from "../entities/shot/visibility";
import type { ShotResults } from "../../shared/schemas/shot-results";

const total = sql<number>`(count(*) over ())::int`;
const LIMIT = 3;

const hasResults = (shotId: SQL | typeof shot.id) => sql`exists (select 1 from ${shotResult} where ${shotResult.shotId} = ${shotId} and ${shotResult.results} is not null)`;

export type ClipWait = "rateUnconfirmed" | "failed" | "notDigitised";

/** Clips of the team waiting for staff, newest first. */
export async function clipsWaiting(teamId: string, kind: ClipWait) {
  const cond = {
    // Frames come out meanwhile, but no time (so no result) can be trusted until someone confirms the rate.
    rateUnconfirmed: and(eq(clip.captureFpsConfirmed, false), inArray(clip.status, ["probing", "extracting", "ready"])),
    failed: eq(clip.status, "failed"),
    notDigitised: and(
      eq(clip.status, "ready"),
      eq(clip.captureFpsConfirmed, true),
      sql`not exists (select 1 from ${shot} where ${shot.clipId} = ${clip.id} and ${hasResults(shot.id)})`,
    ),
  }[kind];
  return db()
    .select({ id: clip.id, title: clip.title, originalName: clip.originalName, total })
    .from(clip)
    .where(and(eq(clip.teamId, teamId), cond))
    .orderBy(desc(clip.createdAt), asc(clip.id))
    .limit(LIMIT);
}

/** Shots with results that staff have not yet published to their player. */
export async function shotsInReview(teamId: string) {
  return db()
    .select({ id: shot.id, label: shot.label, playerName: user.name, total })
    .from(shot)
    .leftJoin(user, eq(user.id, shot.playerId))
    .where(and(eq(shot.teamId, teamId), isNull(shot.publishedAt), isNotNull(shot.playerId), hasResults(shot.id)))
    .orderBy(...newestShotFirst)
    .limit(LIMIT);
}

/** Tracking runs queued or running, oldest first. */
export async function liveTrackingRuns(teamId: string) {
  return db()
    .select({ shotId: shot.id, clipId: shot.clipId, label: shot.label, status: trackingRun.status, done: trackingRun.done, total: trackingRun.total, all: total })
    .from(trackingRun)
    .innerJoin(shot, eq(shot.id, trackingRun.shotId))
    .where(and(eq(trackingRun.teamId, teamId), inArray(trackingRun.status, ["queued", "running"])))
    .orderBy(asc(trackingRun.createdAt))
    .limit(LIMIT);
}

/** Shots of teammates shared with the viewer since `since` that the viewer may see, newest share first. */
export async function recentlySharedWith(a: Actor, since: Date, limit = 5) {
  return db()
    .select({
      id: shot.id, label: shot.label, date: shotDateSql, shotType: clip.shotType, playerName: user.name, sharedAt: shotShare.createdAt,
      summary: sql<Omit<ShotResults, "series"> | null>`${shotResult.summary}`,
    })
    .from(shotShare)
    .innerJoin(shot, eq(shot.id, shotShare.shotId))
    .innerJoin(clip, eq(clip.id, shot.clipId))
    .leftJoin(user, eq(user.id, shot.playerId))
    .leftJoin(shotResult, eq(shotResult.shotId, shot.id))
    .where(and(eq(shotShare.userId, a.userId), gt(shotShare.createdAt, since), shotVisibleWhere(a)))
    .orderBy(desc(shotShare.createdAt))
    .limit(limit);
}
