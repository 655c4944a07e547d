// The readout's rules: who sees which shot, compare, progress and sharing. Every answer about a
// shot the actor may not see is the same 404 as for a shot that does not exist: nothing leaks.
import { isStaff, policy, type Actor } from "../auth/policy";
import { roleForList } from "../entities/member/role";
import { forbidden, HttpError } from "../http/problem";
import { shotStickInfo } from "../entities/stick/stiffness";
import type { z } from "zod";
import { SHOT_TYPES } from "../../shared/schemas/readout";
import type {
  CompareResponse, PlayersResponse, ProgressQuery, ProgressResponse, ReviewSettings, ShareRow, ShotListPageQuery, ShotListResponse, ShotReadout, ShotType,
} from "../../shared/schemas/readout";
import { listItem, readout } from "./present";
import { shotDate } from "../entities/shot/date";
import { shotAccess } from "../entities/shot/visibility";
import { mostCommonType, progressPoints, summarise } from "./progress";
import * as memberRepo from "../entities/member/repository";
import { isUuid } from "../http/ids";
import { weakTagOf } from "../http/json-answer";
import { answerCache, answerKey, type KeptAnswer } from "../http/answer-cache";
import * as repo from "../entities/shot/readout";
import { shotListPage } from "../entities/shot/list-page";
import { teamSettingsOf } from "../entities/team/repository";
import { latestAuditEntry } from "../entities/audit/repository";
import type { ReadWithRole } from "../auth/context";


const shotNotFound = (which = "That shot") =>
  new HttpError(404, "not_found", `${which} was not found in this team. It may have been deleted, belong to another team, or not be shared with you.`);

const invalid = (path: string, message: string) => new HttpError(422, "validation_failed", `${path}: ${message}`, [{ path, message }]);

function shareRows(rows: Awaited<ReturnType<typeof repo.sharesOf>>): ShareRow[] {
  return rows.map((r) => ({ userId: r.userId, name: r.name, role: r.role === null ? "former member" : roleForList(r.role), sharedAt: r.sharedAt.toISOString(), sharedByName: r.sharedByName }));
}

type FoundShot = repo.ReadoutRow & { resultsText?: string | null; resultsHash?: string; shares?: repo.ShareDbRow[] };

/** A shot the actor may see with its shares, else 404 (410 for staff when the audit log says it was deleted). */
export async function visibleShot(a: Actor, shotId: string, which = "That shot", o: { marks?: "always" } = {}) {
  if (!isUuid(shotId)) throw shotNotFound(which);
  return seenAs(a, await repo.shotById(a.teamId, shotId, { marks: o.marks }), shotId, which);
}

/** The found row (or none) as the actor may see it: the row with its shares, or the 404 / 410. */
async function seenAs(a: Actor, row: FoundShot | null, shotId: string, which: string) {
  if (!row) {
    const gone = isStaff(a) ? await latestAuditEntry(a.teamId, "shot.deleted", shotId) : null;
    if (gone)
      throw new HttpError(410, "shot_deleted", `${which} was deleted on ${gone.at.toISOString().slice(0, 10)}${gone.byName ? ` by ${gone.byName}` : ""}; its marks and results are gone.`);
    throw shotNotFound(which);
  }
  // The text form of the row brings its shares along (decision 178).
  const shares = shareRows(row.shares ?? (await repo.sharesOf(a.teamId, [row.id])));
  if (!policy.viewShot(a, shotAccess(row, shares.map((s) => s.userId)))) throw shotNotFound(which);
  return { row, shares };
}

async function toReadout(a: Actor, v: Awaited<ReturnType<typeof visibleShot>>): Promise<ShotReadout> {
  const r = v.row;
  const st = r.stickId && r.stickLabel !== null ? { id: r.stickId, label: r.stickLabel, ratedFlex: r.stickRatedFlex, testInForce: r.stickTestInForce } : null;
  return readout(v.row, {
    // A player learns only that the shot was shared with them, not with whom else.
    shares: isStaff(a) ? v.shares : v.shares.filter((s) => s.userId === a.userId),
    stick: st ? shotStickInfo(st) : null,
    canEdit: policy.editShot(a, v.row),
    canShare: policy.shareShot(a, v.row),
    canPublish: policy.publishShot(a, v.row),
  });
}

export async function getReadout(a: Actor, shotId: string): Promise<ShotReadout> {
  return toReadout(a, await visibleShot(a, shotId));
}

/**
 * The same readout as JSON text, with the stored results put in as PostgreSQL holds them: they
 * are most of the answer (tens of kB), and parsing and serialising them again was the route's
 * largest CPU cost (decision 175). Its statement also reads the caller's stored role, in place of
 * a membership query before it (decision 195).
 */
export async function readoutJson(a: Actor, shotId: string): Promise<ReadWithRole<KeptAnswer>> {
  // The readout this process sent last for this person, role and shot, if any: the statement
  // sends the shot again only when the team's change stamp moved (decision 192).
  const key = answerKey(a, shotId);
  const known = readouts.known(key);
  const found = isUuid(shotId) ? await repo.shotTextById(a, shotId, known?.stamp) : null;
  return {
    storedRole: found?.viewerRole,
    answer: async () => {
      if (found && known?.stamp === found.stamp) return known;
      const v = await seenAs(a, found?.row ?? null, shotId, "That shot");
      const { results: _none, ...rest } = await toReadout(a, v);
      const head = JSON.stringify(rest).slice(0, -1);
      const { body, length } = readoutBytes(head, v.row.resultsText ?? "null");
      // Its validator from the head and the results' stored hash (decision 199).
      return readouts.keepBytes(key, found!.stamp, body, weakTagOf(length, head, v.row.resultsHash ?? ""));
    },
  };
}
const readouts = answerCache();

const RESULTS_KEY = `,"results":`;
/**
 * The readout's UTF-8 bytes, `${head},"results":${results}}`, each piece encoded straight into one
 * buffer of the exact size, and the text's length in UTF-16 units (for the ETag). The joined text
 * is never made: whenever the head holds a character beyond Latin-1 (an en dash in a stick's
 * label), V8 would make it one string of two-byte characters, copying the ~80 kB of stored results
 * into a ~160 kB string, a fresh large object whose pages the kernel must hand over (decision 199).
 */
function readoutBytes(head: string, results: string) {
  const headBytes = Buffer.byteLength(head);
  const resultsAt = headBytes + RESULTS_KEY.length;
  const body = Buffer.allocUnsafe(resultsAt + Buffer.byteLength(results) + 1);
  body.write(head, 0, "utf8");
  body.write(RESULTS_KEY, headBytes, "latin1");
  body[body.write(results, resultsAt, "utf8") + resultsAt] = 0x7d; // "}"
  return { body, length: head.length + RESULTS_KEY.length + results.length + 1 };
}

/**
 * The Shots page's request: one statement reads the caller's stored role, the page, its total and
 * the filter choices (decisions 191, 195); the answer is made only once readAsTeamMember has held
 * that role to the one the statement ran as.
 */
export async function listShots(a: Actor, q: z.output<typeof ShotListPageQuery>): Promise<ReadWithRole<KeptAnswer>> {
  const filters = { playerId: q.playerId, stickId: q.stickId, shotType: q.shotType, review: q.review };
  // The page this process sent last for exactly this ask, if any: the statement reads the page
  // again only when the team's change stamp moved (decision 192).
  const key = answerKey(a, q);
  const known = shotPages.known(key);
  const page = await shotListPage(a, filters, { limit: q.pageSize, offset: (q.page - 1) * q.pageSize }, known?.stamp);
  return {
    storedRole: page.storedRole,
    answer: () => (page.unchanged && known?.stamp === page.stamp ? known : shotPages.keep(key, page.stamp, JSON.stringify(shotListAnswer(a, q, page)))),
  };
}
const shotPages = answerCache();

/** The Shots page's answer from the page its statement read, for a role that statement confirmed. */
export function shotListAnswer(a: Actor, q: z.output<typeof ShotListPageQuery>, page: Awaited<ReturnType<typeof shotListPage>>): ShotListResponse {
  const staff = isStaff(a);
  // The query already keeps to what the viewer may see; the policy is asked again for each row.
  const visible = page.rows.filter((r) => policy.viewShot(a, shotAccess(r, r.shareIds)));
  return {
    shots: visible.map((r) => listItem(r, { viewerId: a.userId, viewerIsStaff: staff, sharedWithViewer: r.shareIds.includes(a.userId), shareCount: r.shareIds.length })),
    total: page.total,
    page: q.page,
    pageSize: q.pageSize,
    players: page.players,
    sticks: page.sticks,
  };
}

export async function compare(a: Actor, ids: { a: string; b: string }): Promise<CompareResponse> {
  const x = await visibleShot(a, ids.a, "Shot A");
  const y = await visibleShot(a, ids.b, "Shot B");
  const own = (v: typeof x) => shotAccess(v.row, v.shares.map((s) => s.userId));
  if (!policy.compareShots(a, own(x), own(y))) throw shotNotFound("One of the two shots");
  return { a: await toReadout(a, x), b: await toReadout(a, y) };
}

export async function players(a: Actor): Promise<PlayersResponse> {
  const [members, counts] = await Promise.all([memberRepo.teamMembers(a.teamId), repo.shotCountsByPlayer(a)]);
  const listed = members.filter((m) => (isStaff(a) ? m.role === "player" || counts.has(m.userId) : m.userId === a.userId));
  return { players: listed.map((m) => ({ id: m.userId, name: m.name, shots: counts.get(m.userId) ?? 0 })) };
}

export async function progress(a: Actor, q: ProgressQuery): Promise<ProgressResponse> {
  const playerId = q.playerId ?? a.userId;
  if (!policy.viewProgress(a, playerId)) throw forbidden("Players see their own progress only.");
  const who = (await memberRepo.teamMembers(a.teamId)).find((m) => m.userId === playerId);
  if (!who) throw new HttpError(404, "not_found", "That player is not a member of this team.");
  const all = await repo.listShots(a, { playerId });
  const sticks = new Map<string, string>();
  const counts: Partial<Record<ShotType, number>> = {};
  for (const r of all) {
    if (r.stickId && r.stickLabel) sticks.set(r.stickId, r.stickLabel);
    if (r.summary) counts[r.shotType as ShotType] = (counts[r.shotType as ShotType] ?? 0) + 1;
  }
  const types = new Set<ShotType>(all.map((r) => r.shotType as ShotType));
  // One shot type at a time unless asked for all: a slap shot's and a wrist shot's speeds are not one trend.
  const shotType = q.shotType === "all" ? null : (q.shotType ?? mostCommonType(counts, SHOT_TYPES));
  const rows = all.filter((r) => (!q.stickId || r.stickId === q.stickId) && (!shotType || r.shotType === shotType));
  const points = progressPoints(
    rows.map((r) => ({
      shotId: r.id, label: r.label, date: shotDate(r), sessionId: r.sessionId, venue: r.venue || null, stickId: r.stickId, stickLabel: r.stickLabel,
      shotType: r.shotType as ShotType, results: r.summary,
    })),
  );
  return {
    player: { id: who.userId, name: who.name },
    sticks: [...sticks].map(([id, label]) => ({ id, label })).sort((x, y) => x.label.localeCompare(y.label)),
    shotTypes: [...types],
    shotTypeCounts: counts,
    shotType,
    points,
    summary: summarise(points),
    withoutResults: rows.filter((r) => !r.summary).length,
  };
}

export async function reviewSettings(a: Actor): Promise<ReviewSettings> {
  const { autoPublish } = await teamSettingsOf(a.teamId);
  return { autoPublish };
}

export async function updateReviewSettings(a: Actor, body: ReviewSettings): Promise<ReviewSettings> {
  if (!policy.manageTeamSettings(a)) throw forbidden("Only a team admin decides whether shots wait for a coach's review.");
  await repo.setAutoPublish(a.teamId, body.autoPublish);
  return reviewSettings(a);
}

/** The shot's results or a 409 that says what is still missing (exports need numbers). */
export function resultsOrThrow(v: ShotReadout) {
  if (!v.results) throw new HttpError(409, "no_results", `This shot has no results yet. ${v.missing ?? ""}`.trim());
  return v.results;
}

export { invalid };
