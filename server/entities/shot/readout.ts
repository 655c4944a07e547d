import { and, asc, desc, eq, gt, isNotNull, isNull, sql, type SQL } from "drizzle-orm";
import { alias } from "drizzle-orm/pg-core";
import type { SelectResultFields } from "drizzle-orm/query-builders/select.types";
import { LRUCache } from "lru-cache";
import { db } from "../../db/client";
import { prepared, preparedBy } from "../../db/prepared";
import { clip, member, shot, shotResult, shotShare, stick, teamSettings, trainingSession, user } from "../../db/schema";
import { benchTestInForce } from "../stick/stiffness";
import type { Actor } from "../member/role";
import { newestShotFirst, shotDateSql } from "./date";
import { shotVisibleWhere } from "./visibility";
import { viewerStoredRole } from "../member/repository";
import { knownStamp, teamStampSql } from "../../db/answer-stamp";
import { ShotResults } from "../../../shared/schemas/shot-results";
import type { ClipCalibration, ShotEventsDraft, ShotMarks } from "../../../shared/schemas/shots";
import type { ShotListQuery } from "../../../shared/schemas/readout";

// Drizzle only. Every query names the team, so a row of another team is simply not found. Reads
// the shots, clips and results tables of other areas directly (read-only) to join them in one go.

const player = alias(user, "player");
const sharer = alias(user, "sharer");

const baseColumns = {
  id: shot.id, teamId: shot.teamId, clipId: shot.clipId, label: shot.label, playerId: shot.playerId, playerName: player.name,
  stickId: shot.stickId, stickLabel: stick.label, frameStart: shot.frameStart, frameEnd: shot.frameEnd, events: shot.events, version: shot.version,
  createdAt: shot.createdAt, updatedAt: shot.updatedAt, publishedAt: shot.publishedAt,
  clipTitle: clip.title, clipStatus: clip.status, shotType: clip.shotType, cameraView: clip.cameraView, captureFps: clip.captureFps,
  frameCount: clip.frameCount, width: clip.width, height: clip.height, frameFormat: clip.frameFormat, calibration: clip.calibration,
  clipCreatedAt: clip.createdAt, sessionId: clip.sessionId, sessionDate: trainingSession.date, venue: trainingSession.venue,
  resultShotVersion: shotResult.shotVersion, resultError: shotResult.error, computedAt: shotResult.computedAt,
  recomputeRequestedAt: shotResult.recomputeRequestedAt,
};

const withResultSummary = {
  ...baseColumns,
  // Kept by PostgreSQL beside the full results (a generated column), so lists never detoast them.
  summary: sql<Omit<ShotResults, "series"> | null>`${shotResult.summary}`,
};
const withEverything = {
  ...withResultSummary,
  results: sql<unknown>`${shotResult.results}`,
  marks: sql<unknown>`${shot.marks}`,
  // The clip's frame clock, for event and mark times (one shot's readout and exports only).
  storedFps: clip.storedFps,
  clipFrameTimes: sql<number[] | null>`${clip.frameTimes}`,
  // The stick's stiffness in force on the shot's date, in the same round trip.
  stickRatedFlex: stick.ratedFlex,
  stickTestInForce: benchTestInForce(shot.stickId, shotDateSql),
  publishedByName: sql<string | null>`(select ${user.name} from ${user} where ${user.id} = ${shot.publishedBy})`,
};

/** The shot (of the outer query) has stored results: it waits for review until published. */
export const shotHasResults = sql`exists (select 1 from ${shotResult} where ${shotResult.shotId} = ${shot.id} and ${shotResult.results} is not null)`;

// The joins of every shot query: its clip, session, player, stick and stored result.
function joined(columns: typeof withEverything) {
  return db()
    .select(columns)
    .from(shot)
    .innerJoin(clip, eq(clip.id, shot.clipId))
    .leftJoin(trainingSession, eq(trainingSession.id, clip.sessionId))
    .leftJoin(player, eq(player.id, shot.playerId))
    .leftJoin(stick, eq(stick.id, shot.stickId))
    .leftJoin(shotResult, eq(shotResult.shotId, shot.id));
}

// Stored results are only used when they have the engine's shape: a row written some other way
// (by hand, by an older engine) reads as "no results yet" rather than failing the page.
const fullResults = (v: unknown): ShotResults | null => (ShotResults.safeParse(v).success ? (v as ShotResults) : null);
export function summaryResults(v: unknown): Omit<ShotResults, "series"> | null {
  const r = v as { puckExitSpeed?: { valueMps?: unknown }; contactTimeMs?: unknown; notes?: unknown } | null;
  return r && typeof r.puckExitSpeed?.valueMps === "number" && typeof r.contactTimeMs === "number" && Array.isArray(r.notes) ? (v as Omit<ShotResults, "series">) : null;
}

function typed<R extends { events: unknown; calibration: unknown }>(r: R) {
  return { ...r, events: r.events as ShotEventsDraft, calibration: r.calibration as ClipCalibration | null };
}

// The readout needs a shot's marks (tens of kB) only to say what is missing while it has no
// results; reading them for every readout would double what each request parses.
const marksWhenNoResults = sql<unknown>`case when json_typeof(${shotResult.results}) = 'object' then null else ${shot.marks} end`;

const shotQuery = preparedBy("readout_shot", (name, marks: "always" | "without results") =>
  joined({ ...withEverything, marks: marks === "always" ? withEverything.marks : marksWhenNoResults })
    .where(and(eq(shot.id, sql.placeholder("shotId")), eq(shot.teamId, sql.placeholder("teamId"))))
    .prepare(name),
);

/**
 * One shot with everything the readout shows, results (with time series) included. Marks are
 * read when asked for (`marks: "always"`), else only while the shot has no results.
 */
export async function shotById(teamId: string, shotId: string, o: { marks?: "always" | "without results" } = {}) {
  const [row] = await shotQuery(o.marks ?? "without results").execute({ teamId, shotId });
  return row ? { ...typed(row), results: fullResults(row.results), marks: row.marks as ShotMarks | null } : null;
}
export type ReadoutRow = NonNullable<Awaited<ReturnType<typeof shotById>>>;

// The shot's shares as sharesOf gives them (same columns, same order), as JSON text, so the
// readout needs one round trip to the database instead of two (decision 178).
const sharesJson = sql<string>`(select coalesce(json_agg(json_build_object('shotId', s.shot_id, 'userId', s.user_id, 'name', u.name, 'role', m.role,
    'sharedAt', s.created_at, 'sharedByName', b.name) order by u.name), '[]')::text
  from ${shotShare} s join ${user} u on u.id = s.user_id
  left join ${member} m on m.user_id = s.user_id and m.organization_id = s.team_id
  left join ${user} b on b.id = s.shared_by
  where s.team_id = ${shot.teamId} and s.shot_id = ${shot.id})`;

const textColumns = { ...withEverything, summary: sql<null>`null`, marks: marksWhenNoResults, results: sql<string | null>`${shotResult.results}::text`, resultsMd5: shotResult.resultsMd5, shares: sharesJson };
const shotTextQuery = prepared("readout_shot_text", (name) =>
  // One row always: the caller's stored role (decision 195) and the team's change stamp (decision
  // 192), with the shot's columns only for a member, when the shot is there and when the stamp
  // differs from the one of the readout the caller holds (else they are null). The results summary
  // (~2 kB of JSON that pg would parse) is left out: the readout shows the full results.
  db()
    .select({ ...textColumns, viewerRole: viewerStoredRole, stamp: sql<string>`now.stamp` })
    .from(sql`(select ${teamStampSql} as stamp) now`)
    .leftJoin(shot, and(eq(shot.id, sql.placeholder("shotId")), eq(shot.teamId, sql.placeholder("teamId")), isNotNull(viewerStoredRole), sql`now.stamp is distinct from ${knownStamp}`))
    .leftJoin(clip, eq(clip.id, shot.clipId))
    .leftJoin(trainingSession, eq(trainingSession.id, clip.sessionId))
    .leftJoin(player, eq(player.id, shot.playerId))
    .leftJoin(stick, eq(stick.id, shot.stickId))
    .leftJoin(shotResult, eq(shotResult.shotId, shot.id))
    .prepare(name),
);
type TextRow = SelectResultFields<typeof textColumns>;
/** The SQL text of one shot's readout statement (which tables it reads, decision 192). */
export const readoutStatementText = () => shotTextQuery().getQuery().sql;
// Whether a stored result has the engine's shape, by the MD5 of its exact text that PostgreSQL keeps
// beside it (decision 199): the same text is checked once per process, not parsed on every read.
const shapeChecked = new LRUCache<string, boolean>({ max: 20_000 });

/**
 * The readout's row with the stored results as the JSON text PostgreSQL holds (the page's
 * largest part, tens of kB), for answering without parsing and re-serialising it (decision 175).
 * `results` is null where the stored value lacks the engine's shape, as in shotById. `viewerRole`
 * is the viewer's stored role in the team (null when not a member) and `stamp` the team's change
 * stamp; `row` is null when the viewer is not a member, the shot is not in the team, or `stamp`
 * equals `knownStamp` (the stamp of the readout the caller holds: nothing it shows has changed).
 */
export async function shotTextById(viewer: Pick<Actor, "userId" | "teamId">, shotId: string, knownStamp = "") {
  const [found] = await shotTextQuery().execute({ teamId: viewer.teamId, shotId, viewerId: viewer.userId, knownStamp });
  const { viewerRole, stamp } = found;
  return { viewerRole, stamp, row: found.id === null ? null : textRow(found as unknown as TextRow) };
}

function textRow(row: TextRow) {
  const text = row.results as string | null;
  const key = row.resultsMd5 ?? "";
  let ok = text === null ? false : shapeChecked.get(key);
  if (ok === undefined) shapeChecked.set(key, (ok = fullResults(JSON.parse(text!)) !== null));
  const { shares: sharesText, resultsMd5: _hash, ...rest } = row;
  const shares = sharesText === "[]" ? [] : (JSON.parse(sharesText) as (Omit<ShareDbRow, "sharedAt"> & { sharedAt: string })[]).map((x) => ({ ...x, sharedAt: new Date(x.sharedAt) }));
  return { ...typed(rest), results: null, resultsText: ok ? text : null, resultsHash: ok ? key : "", marks: row.marks as ShotMarks | null, shares: shares as ShareDbRow[] };
}

/** The shots of the actor's team that the actor may see (entities/shot/visibility.ts), filtered. */
export function listWhere(a: Actor, f: ShotListQuery) {
  const where: SQL[] = [shotVisibleWhere(a)];
  if (f.playerId) where.push(eq(shot.playerId, f.playerId));
  if (f.stickId) where.push(eq(shot.stickId, f.stickId));
  if (f.shotType) where.push(eq(shot.shotType, f.shotType));
  if (f.review === "published") where.push(isNotNull(shot.publishedAt));
  if (f.review === "waiting") where.push(isNull(shot.publishedAt), shotHasResults);
  return and(...where);
}

const newestFirst = newestShotFirst;

/**
 * The ids of one page of the list, in order: read from the (team, date …) or (team, player,
 * date …) index, which holds the list's order (the stored shot date, decision 173), so a page
 * costs the rows it shows, not a sort of every shot of the team; the shot type is stored on the
 * shot too (decision 176), with its own index in the same order.
 */
export function pageIdsQuery(a: Actor, f: ShotListQuery, page: { limit: number; offset: number }) {
  return orderedIdsQuery(a, f).limit(page.limit).offset(page.offset);
}
/** The same ids in the list's order, for a caller that writes its own LIMIT. */
export const orderedIdsQuery = (a: Actor, f: ShotListQuery) => db().select({ id: shot.id }).from(shot).where(listWhere(a, f)).orderBy(...newestFirst);

/**
 * Shots of the team, newest first, with the results summary but without time series or marks
 * (small rows), all of them (a player's progress needs every shot). The Shots page reads one
 * page through list-page.ts.
 */
export async function listShots(a: Actor, f: ShotListQuery) {
  const rows = await joined({ ...withEverything, results: sql<null>`null`, marks: sql<null>`null`, stickTestInForce: sql<null>`null`, clipFrameTimes: sql<null>`null` })
    .where(listWhere(a, f))
    .orderBy(...newestFirst);
  return rows.map(({ results: _r, marks: _m, stickTestInForce: _t, clipFrameTimes: _f, ...r }) => ({ ...typed(r), summary: summaryResults(r.summary) }));
}
export type ListRow = Awaited<ReturnType<typeof listShots>>[number];

/** Everyone each shot is shared with, with names and roles in the team. */
const sharesQuery = prepared("readout_shares", (name) =>
  db()
    .select({ shotId: shotShare.shotId, userId: shotShare.userId, name: user.name, role: member.role, sharedAt: shotShare.createdAt, sharedByName: sharer.name })
    .from(shotShare)
    .innerJoin(user, eq(user.id, shotShare.userId))
    .leftJoin(member, and(eq(member.userId, shotShare.userId), eq(member.organizationId, sql.placeholder("teamId"))))
    .leftJoin(sharer, eq(sharer.id, shotShare.sharedBy))
    .where(and(eq(shotShare.teamId, sql.placeholder("teamId")), sql`${shotShare.shotId} = any(${sql.placeholder("shotIds")}::uuid[])`))
    .orderBy(asc(user.name))
    .prepare(name),
);

export async function sharesOf(teamId: string, shotIds: string[]) {
  if (!shotIds.length) return [];
  return sharesQuery().execute({ teamId, shotIds });
}
export type ShareDbRow = Awaited<ReturnType<typeof sharesOf>>[number];

/** Adds shares; returns the user ids that were new (an existing share stays as it was). */
export async function addShares(v: { teamId: string; shotId: string; userIds: string[]; sharedBy: string }) {
  if (!v.userIds.length) return [];
  const rows = await db()
    .insert(shotShare)
    .values(v.userIds.map((userId) => ({ shotId: v.shotId, userId, teamId: v.teamId, sharedBy: v.sharedBy })))
    .onConflictDoNothing()
    .returning({ userId: shotShare.userId });
  return rows.map((r) => r.userId);
}

export async function removeShare(teamId: string, shotId: string, userId: string) {
  const rows = await db()
    .delete(shotShare)
    .where(and(eq(shotShare.teamId, teamId), eq(shotShare.shotId, shotId), eq(shotShare.userId, userId)))
    .returning({ userId: shotShare.userId });
  return rows.length > 0;
}


/** Shots per player in the team that the actor may see (any result state). */
export async function shotCountsByPlayer(a: Actor) {
  const rows = await db()
    .select({ playerId: shot.playerId, n: sql<number>`count(*)::int` })
    .from(shot)
    .where(shotVisibleWhere(a))
    .groupBy(shot.playerId);
  return new Map(rows.filter((r) => r.playerId).map((r) => [r.playerId!, r.n]));
}

/** Turning auto-publish on also publishes the shots that already have results and wait for review. */
export async function setAutoPublish(teamId: string, autoPublish: boolean) {
  await db().transaction(async (tx) => {
    await tx.insert(teamSettings).values({ teamId, autoPublish }).onConflictDoUpdate({ target: teamSettings.teamId, set: { autoPublish } });
    if (autoPublish)
      await tx
        .update(shot)
        .set({ publishedAt: sql`now()` })
        .where(and(eq(shot.teamId, teamId), isNull(shot.publishedAt), shotHasResults));
  });
}

/** Publish (at = now) or take back (null) a shot of this team; false when it was already so. */
export async function setPublished(teamId: string, shotId: string, publish: boolean, by: string | null) {
  const rows = await db()
    .update(shot)
    .set(publish ? { publishedAt: sql`now()`, publishedBy: by } : { publishedAt: null, publishedBy: null })
    .where(and(eq(shot.teamId, teamId), eq(shot.id, shotId), publish ? isNull(shot.publishedAt) : isNotNull(shot.publishedAt)))
    .returning({ id: shot.id });
  return rows.length > 0;
}

const total = sql<number>`(count(*) over ())::int`;

/** Shots with results that staff have not yet published to their player, newest first: at most
 * `limit`, each row with the count of all of them. */
export async function shotsInReview(teamId: string, limit: number) {
  return db()
    .select({ id: shot.id, label: shot.label, playerName: user.name, total })
    .from(shot)
    .leftJoin(user, eq(user.id, shot.playerId))
    .where(and(eq(shot.teamId, teamId), isNull(shot.publishedAt), isNotNull(shot.playerId), shotHasResults))
    .orderBy(...newestShotFirst)
    .limit(limit);
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
