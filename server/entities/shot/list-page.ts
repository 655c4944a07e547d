// The Shots page's request — one page of the list, its total and the filter choices — in ONE
// round trip, as one prepared statement per viewer role and filter combination
// (docs/decisions/191-shots-list-one-statement.md). Profiles of the web process put most of the
// list's CPU in round trips (socket writes and reads), in building the SQL on every request and
// in parsing 50 results summaries of ~2 kB each of which the list shows five numbers; the
// statement below answers with one row of JSON text holding only what the page shows.
import { and, eq, isNotNull, sql, type SQL } from "drizzle-orm";
import { db } from "../../db/client";
import { preparedBy } from "../../db/prepared";
import { organization } from "../../db/auth-schema";
import { clip, shot, shotResult, shotShare, shotTally, stick, trainingSession, user } from "../../db/schema";
import type { Actor, Role } from "../member/role";
import { viewerStoredRole } from "../member/repository";
import { knownStamp, teamStampSql } from "../../db/answer-stamp";
import { newestShotFirst } from "./date";
import { listWhere, orderedIdsQuery, pageIdsQuery, summaryResults } from "./readout";
import { seesWholeTeam } from "./visibility";
import type { ShotListQuery } from "../../../shared/schemas/readout";

/** One shot of a page, as the statement gives it. */
export interface PageRow {
  id: string; teamId: string; label: string; clipId: string; clipTitle: string; playerId: string | null; playerName: string | null;
  stickId: string | null; stickLabel: string | null; shotType: string; date: string; sessionId: string | null; venue: string | null;
  captureFps: number; publishedAt: string | null; resultError: string | null; recomputing: boolean;
  /** Only the parts of the results summary the list shows (null without results). */
  summary: ReturnType<typeof summaryResults>;
  /** Everyone the shot is shared with (user ids). */
  shareIds: string[];
}
export interface ListPage {
  /** The viewer's stored role in the team, read by the same statement (decision 195); null for a non-member. */
  storedRole: string | null;
  /** The team's change stamp (decision 192). */
  stamp: string;
  /** The stamp is the one the caller passed: nothing the page shows changed, and the page was not read. */
  unchanged: boolean;
  total: number;
  rows: PageRow[];
  players: { id: string; name: string }[];
  sticks: { id: string; label: string }[];
}

// The viewer as placeholders: one statement serves every viewer of a role, and the visibility
// rule (visibility.ts) is still the one that writes the condition.
const viewer = (role: Role): Actor => ({ role, userId: sql.placeholder("viewerId") as unknown as string, teamId: sql.placeholder("teamId") as unknown as string });

type Filters = Pick<ShotListQuery, "playerId" | "stickId" | "shotType" | "review">;
// The filters as placeholders: which ones are set shapes the statement, their values do not.
const shapeOf = (f: Filters) => ({
  ...(f.playerId ? { playerId: sql.placeholder("playerId") as unknown as string } : {}),
  ...(f.stickId ? { stickId: sql.placeholder("stickId") as unknown as string } : {}),
  ...(f.shotType ? { shotType: sql.placeholder("shotType") as unknown as NonNullable<Filters["shotType"]> } : {}),
  ...(f.review ? { review: f.review } : {}),
});
/**
 * The page as the Shots page opens it (the first 50) is written into its statement: PostgreSQL
 * can then plan it once and reuse the plan (a generic plan), where a placeholder page size or
 * offset makes it plan each execution again (decision 191). Any other page uses placeholders.
 */
export const OPENING_PAGE = { limit: 50, offset: 0 } as const;
const isOpening = (p: { limit: number; offset: number }) => p.limit === OPENING_PAGE.limit && p.offset === OPENING_PAGE.offset;

// The statement's key: the role, which filters are set ("p" player, "s" stick, "t" type), the review filter, and "1" for the opening page.
const keyOf = (role: Role, f: Filters, opening: boolean) => `${role}:${f.playerId ? "p" : ""}${f.stickId ? "s" : ""}${f.shotType ? "t" : ""}:${f.review ?? ""}:${opening ? "1" : ""}`;
function fromKey(key: string): { role: Role; f: Filters; opening: boolean } {
  const [role, set, review, opening] = key.split(":");
  return {
    role: role as Role,
    opening: opening === "1",
    f: shapeOf({ playerId: set.includes("p") ? "set" : undefined, stickId: set.includes("s") ? "set" : undefined, shotType: set.includes("t") ? "slap" : undefined, review: (review || undefined) as Filters["review"] }),
  };
}

/**
 * The list's total. Where the viewer sees the whole team, a sum over the team's tally rows
 * (decision 190; a few hundred rows at most, however many shots); the review queue ("waiting",
 * which needs the results) and anyone who sees only some shots count them directly: the
 * unpublished shots have their own index, a player's shots are their own and their shares.
 */
function totalOf(a: Actor, f: Filters): SQL {
  if (seesWholeTeam(a) && f.review !== "waiting") {
    const where: SQL[] = [eq(shotTally.teamId, a.teamId)];
    if (f.playerId) where.push(eq(shotTally.playerId, f.playerId));
    if (f.stickId) where.push(eq(shotTally.stickId, f.stickId));
    if (f.shotType) where.push(eq(shotTally.shotType, f.shotType));
    if (f.review === "published") where.push(eq(shotTally.published, true));
    return sql`(select coalesce(sum(${shotTally.n}), 0)::int from ${shotTally} where ${and(...where)})`;
  }
  return sql`(select count(*)::int from ${shot} where ${listWhere(a, f)})`;
}

/** The page's shots as one JSON array, newest first, with only what the list shows. */
function rowsOf(a: Actor, f: Filters, opening: boolean): SQL {
  // (The query builder would send even a constant page size as a placeholder, so the opening page's is written here.)
  const ids = opening
    ? sql`${orderedIdsQuery(a, f)} limit ${sql.raw(String(OPENING_PAGE.limit))}`
    : pageIdsQuery(a, f, { limit: sql.placeholder("limit") as unknown as number, offset: sql.placeholder("offset") as unknown as number });
  const sm = shotResult.summary;
  return sql`(select coalesce(json_agg(json_build_object(
      'id', ${shot.id}, 'teamId', ${shot.teamId}, 'label', ${shot.label}, 'clipId', ${shot.clipId}, 'clipTitle', ${clip.title},
      'playerId', ${shot.playerId}, 'playerName', ${user.name}, 'stickId', ${shot.stickId}, 'stickLabel', ${stick.label},
      'shotType', ${shot.shotType}, 'date', ${shot.shotDate}::text, 'sessionId', ${clip.sessionId}, 'venue', ${trainingSession.venue},
      'captureFps', ${clip.captureFps}, 'publishedAt', ${shot.publishedAt}, 'resultError', ${shotResult.error},
      'recomputing', ${shotResult.recomputeRequestedAt} is not null,
      'summary', case when ${sm} is not null then jsonb_build_object(
        'puckExitSpeed', jsonb_build_object('valueMps', ${sm} #> '{puckExitSpeed,valueMps}'),
        'bladeSpeedAtStrike', jsonb_build_object('valueMps', ${sm} #> '{bladeSpeedAtStrike,valueMps}'),
        'peakBend', jsonb_build_object('angleDeg', ${sm} #> '{peakBend,angleDeg}'),
        'loadTimeMs', ${sm} -> 'loadTimeMs', 'contactTimeMs', ${sm} -> 'contactTimeMs', 'notes', ${sm} -> 'notes') end,
      'shareIds', (select coalesce(json_agg(${shotShare.userId}), '[]') from ${shotShare} where ${shotShare.shotId} = ${shot.id} and ${shotShare.teamId} = ${shot.teamId})
    ) order by ${sql.join(newestShotFirst, sql`, `)}), '[]')::text
    from ${shot}
    join ${clip} on ${clip.id} = ${shot.clipId}
    left join ${trainingSession} on ${trainingSession.id} = ${clip.sessionId}
    left join ${user} on ${user.id} = ${shot.playerId}
    left join ${stick} on ${stick.id} = ${shot.stickId}
    left join ${shotResult} on ${shotResult.shotId} = ${shot.id}
    where ${shot.id} = any(array(${ids})))`;
}

/**
 * The distinct values of a shot column (player, stick) among the shots the viewer may see. Where
 * that is the whole team, a skip scan hops from one value to the next through the (team, column …)
 * index, one probe per value, instead of reading every shot of the team ("loose index scan",
 * PostgreSQL wiki). Anyone else sees their own and shared shots, few enough to read directly.
 */
function distinctVisible(a: Actor, col: typeof shot.playerId | typeof shot.stickId): SQL {
  const where = listWhere(a, {});
  if (!seesWholeTeam(a)) return sql`select distinct ${col} from ${shot} where ${and(where, isNotNull(col))}`;
  return sql`with recursive v(id) as (
    (select ${col} from ${shot} where ${where} and ${col} is not null order by ${col} limit 1)
    union all
    select (select ${col} from ${shot} where ${where} and ${col} > v.id order by ${col} limit 1) from v where v.id is not null
  ) select id from v where id is not null`;
}

const pageQuery = preparedBy("shot_list_page", (name, key: string) => {
  const { role, f, opening } = fromKey(key);
  const a = viewer(role);
  // The team's change stamp comes along, and the page only when it differs from the one of the
  // answer the caller holds (decision 192).
  const changed = (v: SQL) => sql`case when now.stamp is distinct from ${knownStamp} then ${v} end`;
  return db()
    .select({
      // Membership in the same statement (decision 195): the answer is made only for this role.
      storedRole: viewerStoredRole,
      stamp: sql<string>`now.stamp`,
      total: changed(totalOf(a, f)).mapWith(Number),
      rows: sql<string | null>`${changed(rowsOf(a, f, opening))}`,
      players: sql<string | null>`${changed(sql`(select coalesce(json_agg(json_build_object('id', ${user.id}, 'name', ${user.name})), '[]')::text from ${user} where ${user.id} in (${distinctVisible(a, shot.playerId)}))`)}`,
      sticks: sql<string | null>`${changed(sql`(select coalesce(json_agg(json_build_object('id', ${stick.id}, 'label', ${stick.label})), '[]')::text from ${stick} where ${stick.id} in (${distinctVisible(a, shot.stickId)}))`)}`,
    })
    .from(organization)
    .innerJoin(sql`(select ${teamStampSql} as stamp) now`, sql`true`)
    .where(eq(organization.id, sql.placeholder("teamId")))
    .prepare(name);
});

/** The SQL text of the Shots list's statements with every filter set, as staff and as a player (which tables they read, decision 192). */
export const shotListStatementText = () =>
  (["coach", "player"] as const).flatMap((role) => (["waiting", "published"] as const).map((review) => pageQuery(keyOf(role, { playerId: "p", stickId: "s", shotType: "slap", review }, false)).getQuery().sql)).join("\n");

/**
 * One page of the team's Shots list as the viewer may see it, its total and the filter choices,
 * with the team's change `stamp`; `unchanged` (and no page) when the stamp is `knownStamp`, the
 * stamp of the answer the caller holds (decision 192).
 */
export async function shotListPage(a: Actor, f: Filters, page: { limit: number; offset: number }, knownStamp = ""): Promise<ListPage> {
  const opening = isOpening(page);
  const [row] = await pageQuery(keyOf(a.role, f, opening)).execute({
    teamId: a.teamId, viewerId: a.userId, knownStamp, ...(opening ? {} : { limit: page.limit, offset: page.offset }),
    ...(f.playerId ? { playerId: f.playerId } : {}), ...(f.stickId ? { stickId: f.stickId } : {}), ...(f.shotType ? { shotType: f.shotType } : {}),
  });
  if (!row) return { storedRole: null, stamp: "", unchanged: false, total: 0, rows: [], players: [], sticks: [] };
  if (row.rows === null) return { storedRole: row.storedRole, stamp: row.stamp, unchanged: true, total: 0, rows: [], players: [], sticks: [] };
  const rows = (JSON.parse(row.rows) as (Omit<PageRow, "summary"> & { summary: unknown })[]).map((r) => ({ ...r, summary: summaryResults(r.summary) }));
  return {
    storedRole: row.storedRole,
    stamp: row.stamp,
    unchanged: false,
    total: row.total,
    rows,
    players: (JSON.parse(row.players!) as ListPage["players"]).sort((x, y) => x.name.localeCompare(y.name)),
    sticks: (JSON.parse(row.sticks!) as ListPage["sticks"]).sort((x, y) => x.label.localeCompare(y.label)),
  };
}
