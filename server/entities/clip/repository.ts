// The only Drizzle code of clip ingest.
import { and, asc, desc, eq, inArray, isNotNull, lt, sql, type SQL } from "drizzle-orm";
import { alias } from "drizzle-orm/pg-core";
import { db } from "../../db/client";
import { preparedBy, rawPrepared } from "../../db/prepared";
import { viewerStoredRole } from "../member/repository";
import { knownStamp, teamStampSql } from "../../db/answer-stamp";
import { clipSummaryJson } from "./summary-json";
import { clip, shot, stick, trainingSession, user } from "../../db/schema";
import { CLIP_PAGE_SIZE, type ClipSort, type ShotType } from "../../../shared/schemas/clips";
import type { ClipCalibration } from "../../../shared/schemas/shots";
import { recordAudit, type AuditEntry } from "../audit/repository";
import { countClipShotsOf, moveClipShots } from "../shot/players";
import type { Actor } from "../member/role";
import { shotVisibleWhere } from "../shot/visibility";
import { shotHasResults } from "../shot/readout";

export type ClipRow = typeof clip.$inferSelect;
export type NewClipRow = typeof clip.$inferInsert;

const uploader = alias(user, "uploader");

/** A clip with the names the API shows next to it. */
const joined = () =>
  db()
    .select({
      clip,
      playerName: user.name,
      uploaderName: uploader.name,
      session: { id: trainingSession.id, date: trainingSession.date, venue: trainingSession.venue, drill: trainingSession.drill },
      stickLabel: stick.label,
    })
    .from(clip)
    .leftJoin(user, eq(user.id, clip.playerId))
    .leftJoin(uploader, eq(uploader.id, clip.uploadedBy))
    .leftJoin(trainingSession, eq(trainingSession.id, clip.sessionId))
    .leftJoin(stick, eq(stick.id, clip.stickId));
export type JoinedClip = Awaited<ReturnType<typeof joined>>[number];
/** What the clips table shows of a clip: none of the heavy columns (the probe, one timestamp per frame, the calibration). */
export type JoinedClipSummary = Omit<JoinedClip, "clip"> & { clip: Omit<ClipRow, "probe" | "frameTimes" | "calibration"> };

export async function clipInTeam(teamId: string, id: string): Promise<JoinedClip | null> {
  const [row] = await joined().where(and(eq(clip.teamId, teamId), eq(clip.id, id)));
  return row ?? null;
}

export async function clipById(id: string): Promise<ClipRow | null> {
  const [row] = await db().select().from(clip).where(eq(clip.id, id));
  return row ?? null;
}

export interface ListFilter {
  playerId?: string;
  sessionId?: string;
  shotType?: ShotType;
  status?: ClipRow["status"];
}

const sortColumn: Record<ClipSort, SQL | typeof clip.createdAt> = {
  created: clip.createdAt,
  title: sql`lower(${clip.title})`,
  player: sql`lower(${user.name})`,
  session: sql`${trainingSession.date}`,
  shotType: sql`${clip.shotType}`,
  captureFps: sql`${clip.captureFps}`,
  frames: sql`coalesce(${clip.frameCount}, 0)`,
  status: sql`${clip.status}`,
};

const filterKeys = ["playerId", "sessionId", "shotType", "status"] as const;
const filterColumn = { playerId: clip.playerId, sessionId: clip.sessionId, shotType: clip.shotType, status: clip.status } as const;
type PageKey = `${ClipSort}:${"asc" | "desc"}:${string}:${typeof CLIP_PAGE_SIZE | ""}`;

// One statement per sort, direction and set of filters used: the viewer's stored role, the total
// and the page as the clips table shows it, built by PostgreSQL as JSON text, in one row and one
// round trip (decisions 178, 195). The rows are read only when the viewer's stored role is the one
// the caller assumed (the filters depend on it); otherwise the caller learns the role and asks again.
const pageQueries = preparedBy<PageKey, ReturnType<typeof buildPage>>("clip_page", (name, key) => buildPage(name, key));
function buildPage(name: string, key: PageKey) {
  const [sort, dir, used, size] = key.split(":") as [ClipSort, "asc" | "desc", string, string];
  const asAssumed = sql`${viewerStoredRole} = ${sql.placeholder("assumedRole")}`;
  const where = and(eq(clip.teamId, sql.placeholder("teamId")), ...filterKeys.filter((k) => used.split(",").includes(k)).map((k) => eq(filterColumn[k], sql.placeholder(k))), asAssumed);
  const order = dir === "asc" ? asc : desc;
  const orderBy = [order(sortColumn[sort]), desc(clip.createdAt), asc(clip.id)];
  // The page's ids first, sorting only the keys (with the one join a sort by name or session
  // needs); then the 25 rows with every join. Sorting whole joined rows of a team's 5,000 clips to
  // keep 25 cost ~40 ms (scripts/bench/load.ts); newest first is read straight from an index.
  const keys = db().select({ id: clip.id }).from(clip);
  const keyed = sort === "player" ? keys.leftJoin(user, eq(user.id, clip.playerId)) : sort === "session" ? keys.leftJoin(trainingSession, eq(trainingSession.id, clip.sessionId)) : keys;
  // The Clips page's own page size is written into its statement: with a placeholder, PostgreSQL
  // prices a reusable (generic) plan as reading a tenth of the team, so it planned every request
  // anew (0.6 ms) and ran a slower plan (2.0 against 0.6 ms on the bench team). Other sizes keep
  // the placeholder (one statement each would let a caller make a hundred).
  const limit = size ? sql.raw(String(CLIP_PAGE_SIZE)) : sql.placeholder("limit");
  const ids = sql`${keyed.where(where).orderBy(...orderBy)} limit ${limit} offset ${sql.placeholder("offset")}`;
  const total = db().select({ n: sql<number>`count(*)::int` }).from(clip).where(where);
  // The page's ids as an array, so each row is found by its key: as "id in (…)", PostgreSQL's
  // generic plan (which guesses 500 ids) read all of the team's clips to hash-join 25 of them.
  const items = db()
    .select({ items: sql`coalesce(json_agg(${clipSummaryJson(uploader.name)} order by ${sql.join(orderBy, sql`, `)}), '[]')::text` })
    .from(clip)
    .leftJoin(user, eq(user.id, clip.playerId))
    .leftJoin(uploader, eq(uploader.id, clip.uploadedBy))
    .leftJoin(trainingSession, eq(trainingSession.id, clip.sessionId))
    .leftJoin(stick, eq(stick.id, clip.stickId))
    .where(sql`${clip.id} = any(array(${ids}))`);
  // The team's change stamp comes along, and the page only when it differs from the one of the
  // answer the caller holds (decision 192).
  const changed = sql`now.stamp is distinct from ${knownStamp}`;
  return rawPrepared<{ role: string | null; stamp: string; total: number | null; items: string | null }>(name, () =>
    sql`select ${viewerStoredRole} as role, now.stamp, case when ${changed} then (${total}) end as total,
      case when ${asAssumed} and ${changed} then (${items}) end as items from (select ${teamStampSql} as stamp) now`);
}

/**
 * One page of the team's clips as the clips table shows it: `items` is the JSON text of the
 * ClipSummary array (null when `viewer.role` is not the viewer's stored role, which comes back as
 * `role`: null when not a member; null too when the team's change `stamp` is `knownStamp`, the
 * stamp of the page the caller holds: nothing it shows has changed).
 */
export async function clipPageText(viewer: Actor, f: ListFilter, sort: ClipSort, dir: "asc" | "desc", page: number, pageSize: number, knownStamp = "") {
  const used = filterKeys.filter((k) => f[k]);
  const params = { viewerId: viewer.userId, teamId: viewer.teamId, assumedRole: viewer.role, knownStamp, ...Object.fromEntries(used.map((k) => [k, f[k]])), limit: pageSize, offset: (page - 1) * pageSize };
  const [row] = await pageQueries(`${sort}:${dir}:${used.join(",")}:${pageSize === CLIP_PAGE_SIZE ? CLIP_PAGE_SIZE : ""}`)(params);
  return { role: row.role, stamp: row.stamp, total: row.total ?? 0, items: row.items };
}

/** The SQL text of the clips table's statement with every filter set and the widest sort (which tables it reads, decision 192). */
export const clipPageStatementText = () => pageQueries("player:asc:playerId,sessionId,shotType,status:").text();

/** Inserts a clip; null when the team already has a clip with this checksum (unique index). */
export async function insertClip(values: NewClipRow): Promise<ClipRow | null> {
  const rows = await db().insert(clip).values(values).onConflictDoNothing().returning();
  return rows[0] ?? null;
}

/** Updates a clip; null when it no longer exists (deleted meanwhile). */
export async function updateClip(id: string, patch: Partial<NewClipRow>): Promise<ClipRow | null> {
  const [row] = await db().update(clip).set({ ...patch, updatedAt: new Date() }).where(eq(clip.id, id)).returning();
  return row ?? null;
}

export interface PlayerChange {
  from: string | null;
  to: string;
  /** Move the clip's shots of `from` to `to` (else they stay with `from`). */
  moveShots: boolean;
  /** The audit entry, given how many shots moved and how many stayed. */
  audit: (moved: number, kept: number) => AuditEntry;
}

/** A clip's new values with a new player: its shots moved (or kept) and the audit entry, all in one transaction. */
export async function updateClipAndPlayer(id: string, patch: Partial<NewClipRow>, change: PlayerChange): Promise<ClipRow | null> {
  return db().transaction(async (tx) => {
    const [row] = await tx.update(clip).set({ ...patch, playerId: change.to, updatedAt: new Date() }).where(eq(clip.id, id)).returning();
    if (!row) return null;
    const moved = change.moveShots ? await moveClipShots(tx, id, change.from, change.to) : 0;
    const kept = change.moveShots ? 0 : await countClipShotsOf(id, change.from, tx);
    await recordAudit(change.audit(moved, kept), tx);
    return row;
  });
}

export async function setProgress(id: string, framesDone: number): Promise<boolean> {
  const r = await db().update(clip).set({ framesDone, updatedAt: new Date() }).where(eq(clip.id, id)).returning({ id: clip.id });
  return r.length > 0;
}

export async function deleteClipRow(teamId: string, id: string): Promise<ClipRow | null> {
  const [row] = await db().delete(clip).where(and(eq(clip.teamId, teamId), eq(clip.id, id))).returning();
  return row ?? null;
}

export async function clipBySha(teamId: string, sha256: string) {
  const [row] = await db().select({ id: clip.id, title: clip.title, originalName: clip.originalName, createdAt: clip.createdAt }).from(clip)
    .where(and(eq(clip.teamId, teamId), eq(clip.sha256, sha256)));
  return row ?? null;
}

export async function teamUsageBytes(teamId: string): Promise<number> {
  const [row] = await db().select({ n: sql<string>`coalesce(sum(${clip.sizeBytes}), 0)` }).from(clip).where(eq(clip.teamId, teamId));
  return Number(row?.n ?? 0);
}



export async function sessionsOf(teamId: string) {
  return db().select({ id: trainingSession.id, date: trainingSession.date, venue: trainingSession.venue, drill: trainingSession.drill })
    .from(trainingSession).where(eq(trainingSession.teamId, teamId)).orderBy(desc(trainingSession.date), asc(trainingSession.venue)).limit(500);
}

export async function sessionInTeam(teamId: string, id: string) {
  const [row] = await db().select({ id: trainingSession.id }).from(trainingSession).where(and(eq(trainingSession.teamId, teamId), eq(trainingSession.id, id)));
  return row ?? null;
}

/**
 * The team's session with this date, venue and drill, created when there is none. Two requests
 * naming the same new session at once are served one after the other (a transaction-scoped
 * advisory lock on the team's sessions), so the second finds the first's row.
 */
export async function findOrCreateSession(teamId: string, s: { date: string; venue: string; drill: string }) {
  const match = and(eq(trainingSession.teamId, teamId), eq(trainingSession.date, s.date), eq(trainingSession.venue, s.venue), eq(trainingSession.drill, s.drill));
  return db().transaction(async (tx) => {
    await tx.execute(sql`select pg_advisory_xact_lock(hashtext(${`training_session:${teamId}`}))`);
    const [found] = await tx.select({ id: trainingSession.id }).from(trainingSession).where(match);
    if (found) return found.id;
    const [row] = await tx.insert(trainingSession).values({ teamId, ...s }).returning({ id: trainingSession.id });
    return row.id;
  });
}

// --- repair (clip.sweep) ----------------------------------------------------------------------

/** Clips still extracting whose row has not moved for `staleMs` (their worker may be gone). */
export async function staleExtracting(staleMs: number) {
  return db().select({ id: clip.id }).from(clip)
    .where(and(eq(clip.status, "extracting"), lt(clip.updatedAt, new Date(Date.now() - staleMs))));
}

/** Which of these ids still have a clip row. */
export async function existingClipIds(ids: string[]): Promise<Set<string>> {
  if (!ids.length) return new Set();
  const rows = await db().select({ id: clip.id }).from(clip).where(inArray(clip.id, ids));
  return new Set(rows.map((r) => r.id));
}

/** Ready clips (checked by the sweep for missing frames). */
export async function readyClips() {
  return db().select({ id: clip.id, frameCount: clip.frameCount, frameFormat: clip.frameFormat }).from(clip)
    .where(and(eq(clip.status, "ready"), isNotNull(clip.frameCount)));
}

/** Whether a player reaches a clip through one of its shots: their own, or one shared with them. */
/** True when the actor may see a shot on this clip (their own once published, or one shared with them). */
export async function clipReachableByShot(clipId: string, a: Actor): Promise<boolean> {
  const found = await db().select({ id: shot.id }).from(shot).where(and(eq(shot.clipId, clipId), shotVisibleWhere(a))).limit(1);
  return found.length > 0;
}

export type ClipWait = "rateUnconfirmed" | "failed" | "notDigitised";

/** Clips of the team waiting for staff, newest first: at most `limit`, each row with the count of all of them. */
export async function clipsWaiting(teamId: string, kind: ClipWait, limit: number) {
  const cond = {
    // Frames come out meanwhile, but no time (so no result) can be trusted until someone confirms the rate.
    rateUnconfirmed: and(eq(clip.captureFpsConfirmed, false), inArray(clip.status, ["probing", "extracting", "ready"])),
    failed: eq(clip.status, "failed"),
    notDigitised: and(
      eq(clip.status, "ready"),
      eq(clip.captureFpsConfirmed, true),
      sql`not exists (select 1 from ${shot} where ${shot.clipId} = ${clip.id} and ${shotHasResults})`,
    ),
  }[kind];
  return db()
    .select({ id: clip.id, title: clip.title, originalName: clip.originalName, total: sql<number>`(count(*) over ())::int` })
    .from(clip)
    .where(and(eq(clip.teamId, teamId), cond))
    .orderBy(desc(clip.createdAt), asc(clip.id))
    .limit(limit);
}

// --- clip.timing backfill (clip.sweep, decision 137) ------------------------------------------

/** Ready clips stored before their frame clock was kept, oldest first. */
export async function clipsWithoutTiming(limit: number) {
  return db().select({ id: clip.id, frameCount: clip.frameCount, frameTimes: clip.frameTimes, storedFps: clip.storedFps }).from(clip)
    .where(and(eq(clip.status, "ready"), sql`${clip.timing} is null`, isNotNull(clip.frameTimes)))
    .orderBy(asc(clip.createdAt)).limit(limit);
}

/** How many such clips are left. */
export async function countClipsWithoutTiming(): Promise<number> {
  const [r] = await db().select({ n: sql<number>`count(*)::int` }).from(clip)
    .where(and(eq(clip.status, "ready"), sql`${clip.timing} is null`, isNotNull(clip.frameTimes)));
  return r?.n ?? 0;
}

/** Store the clip's frame clock, only while it still has none (two sweeps at once write it once). */
export async function setClipTiming(id: string, patch: Pick<NewClipRow, "timing" | "frameTimes" | "storedFps">): Promise<boolean> {
  const rows = await db().update(clip).set({ ...patch, updatedAt: new Date() }).where(and(eq(clip.id, id), sql`${clip.timing} is null`)).returning({ id: clip.id });
  return rows.length > 0;
}

// --- a clip for its shots (Digitise) -------------------------------------------------------------

/** A clip of the team as the Digitise page and a clip's shots need it: frames, size, player, stick, calibration. */
export async function clipForShots(teamId: string, clipId: string) {
  const [row] = await db()
    .select({
      id: clip.id, teamId: clip.teamId, title: clip.title, status: clip.status, captureFps: clip.captureFps, frameCount: clip.frameCount,
      width: clip.width, height: clip.height, frameFormat: clip.frameFormat, playerId: clip.playerId, stickId: clip.stickId, calibration: clip.calibration,
    })
    .from(clip)
    .where(and(eq(clip.id, clipId), eq(clip.teamId, teamId)));
  return row ? { ...row, calibration: row.calibration as ClipCalibration | null } : null;
}
export type ClipForShots = NonNullable<Awaited<ReturnType<typeof clipForShots>>>;

/** The clip's stored frame times and rates (a separate read: the array can be long). */
export async function clipClock(clipId: string) {
  const [row] = await db().select({ captureFps: clip.captureFps, storedFps: clip.storedFps, frameTimes: clip.frameTimes }).from(clip).where(eq(clip.id, clipId));
  return row ?? null;
}

export async function setClipCalibration(clipId: string, calibration: ClipCalibration | null) {
  await db().update(clip).set({ calibration, updatedAt: new Date() }).where(eq(clip.id, clipId));
}
