// The rules of the clip library: who sees and changes which clip, retry and delete.
import { policy, type Actor } from "../auth/policy";
import { recordAudit } from "../entities/audit/repository";
import { log } from "../log";
import { forbidden, HttpError, notFound } from "../http/problem";
import { cancelExtract, sendExtract } from "../jobs/clip-queue";
import { clipKeys } from "../storage";
import type { ClipDeletionCounts, ClipDetail, ClipListQuerySchema, ClipOptions, ClipPatch, ClipProgress } from "../../shared/schemas/clips";
import type { z } from "zod";
import { storage } from "./deps";
import { checkMetaRefs } from "./ingest";
import { toDetail, toProgress } from "./present";
import type { ReadWithRole } from "../auth/context";
import * as memberRepo from "../entities/member/repository";
import { countClipShotsOf } from "../entities/shot/players";
import { shotsAndMarksOfClip } from "../entities/shot/repository";
import { isUuid } from "../http/ids";
import { answerCache, answerKey } from "../http/answer-cache";
import * as repo from "../entities/clip/repository";
import * as stickRepo from "../entities/stick/repository";

const clipNotFound = () => notFound("That clip");

/** The clip if the actor may see it; another team's clip or a player's other clips are 404. */
export async function visibleClip(a: Actor, id: string): Promise<repo.JoinedClip> {
  // A malformed id is simply not found; any other failure (the database away) is not "not found".
  if (!isUuid(id)) throw clipNotFound();
  const j = await repo.clipInTeam(a.teamId, id);
  if (!j) throw clipNotFound();
  const resource = { teamId: j.clip.teamId, playerId: j.clip.playerId };
  // A player also reaches a clip through a shot of theirs on it, or one shared with them.
  const viaShot = !policy.viewClip(a, resource) && (await repo.clipReachableByShot(id, a));
  if (!policy.viewClip(a, { ...resource, sharedWith: viaShot ? [a.userId] : [] })) throw clipNotFound();
  return j;
}

async function editableClip(a: Actor, id: string, allowed: (a: Actor, c: { teamId: string }) => boolean, what: string) {
  const j = await visibleClip(a, id);
  if (!allowed(a, j.clip)) throw forbidden(`Your role in this team does not allow ${what} clips.`);
  return j;
}

export async function options(a: Actor): Promise<ClipOptions> {
  if (!policy.uploadClip(a)) throw forbidden("Your role in this team does not allow uploading clips.");
  const [sessions, players, sticks] = await Promise.all([repo.sessionsOf(a.teamId), memberRepo.playersOf(a.teamId), stickRepo.sticksOf(a.teamId)]);
  return { sessions, players, sticks: sticks.map(({ stick: s }) => ({ id: s.id, label: s.label, ownerId: s.ownerId })) };
}

/**
 * The clips table's page as JSON text (ClipPage), with the stored role its statement read for the
 * caller (decision 195): PostgreSQL builds the rows' JSON, so this process neither parses nor
 * serialises them.
 */
export async function listText(a: Actor, q: z.output<typeof ClipListQuerySchema>): Promise<ReadWithRole<{ body: string | Buffer; tag?: string }>> {
  const page = (items: string, total: number) => `{"items":${items},"total":${total},"page":${q.page},"pageSize":${q.pageSize}}`;
  // Players see only the clips of their own shots.
  const playerId = policy.listClips(a) ? q.playerId : a.userId;
  if (!policy.listClips(a) && q.playerId && q.playerId !== a.userId) return { answer: () => ({ body: page("[]", 0) }) };
  // The page this process sent last for exactly this ask, if any: the statement sends the page
  // again only when the team's change stamp moved (decision 192).
  const key = answerKey(a, q);
  const known = clipPages.known(key);
  const r = await repo.clipPageText(a, { playerId, sessionId: q.sessionId, shotType: q.shotType, status: q.status }, q.sort, q.dir, q.page, q.pageSize, known?.stamp);
  return { storedRole: r.role, answer: () => (known?.stamp === r.stamp ? known : clipPages.keep(key, r.stamp, page(r.items ?? "[]", r.total))) };
}
const clipPages = answerCache();

export const get = async (a: Actor, id: string): Promise<ClipDetail> => toDetail(await visibleClip(a, id));

export async function progress(a: Actor, id: string): Promise<ClipProgress> {
  return toProgress((await visibleClip(a, id)).clip);
}

export async function patch(a: Actor, id: string, p: ClipPatch): Promise<ClipDetail> {
  const j = await editableClip(a, id, policy.editClip, "editing");
  const c = j.clip;
  await checkMetaRefs(a.teamId, { playerId: p.playerId ?? c.playerId ?? "", sessionId: p.sessionId, stickId: p.stickId }).catch((err) => {
    // A clip whose player left the team can still be edited as long as the player is not touched.
    if (err instanceof HttpError && err.errors?.[0]?.path === "playerId" && p.playerId === undefined) return;
    throw err;
  });
  const sessionId = p.newSession ? await repo.findOrCreateSession(a.teamId, p.newSession) : p.sessionId;
  // Stating the capture rate is confirming it, unless the person says otherwise.
  const captureFpsConfirmed = p.captureFpsConfirmed ?? (p.captureFps !== undefined ? true : undefined);
  const { newSession: _n, moveShots, ...rest } = p;
  const values = { ...rest, ...(sessionId ? { sessionId } : {}), ...(captureFpsConfirmed !== undefined ? { captureFpsConfirmed } : {}) };
  if (p.playerId !== undefined && p.playerId !== c.playerId) {
    await repo.updateClipAndPlayer(c.id, values, playerChange(a, j, p.playerId, moveShots ?? (await askedToMove(c))));
  } else {
    await repo.updateClip(c.id, values);
  }
  return get(a, id);
}

/** A new player on a clip with shots of its previous player: the person must say whether they move. */
async function askedToMove(c: repo.ClipRow): Promise<boolean> {
  const n = await countClipShotsOf(c.id, c.playerId);
  if (!n) return false;
  const shots = n === 1 ? "1 shot" : `${n} shots`;
  const message = `This clip has ${shots} of its previous player: say whether they move to the new player.`;
  throw new HttpError(422, "validation_failed", `moveShots: ${message}`, [{ path: "moveShots", message }]);
}

function playerChange(a: Actor, j: repo.JoinedClip, to: string, moveShots: boolean): repo.PlayerChange {
  return {
    from: j.clip.playerId, to, moveShots,
    audit: (moved, kept) => ({
      teamId: a.teamId, actorId: a.userId, action: "clip.player_changed", targetType: "clip", targetId: j.clip.id,
      detail: { title: j.clip.title, from: j.clip.playerId, fromName: j.playerName, to, shotsMoved: moved, shotsKept: kept },
    }),
  };
}

export async function retry(a: Actor, id: string, reqId?: string): Promise<ClipDetail> {
  const j = await editableClip(a, id, policy.editClip, "retrying");
  if (j.clip.status !== "failed") throw new HttpError(409, "not_failed", "Only a clip that failed can be retried; this one is " + j.clip.status + ".");
  await repo.updateClip(j.clip.id, { status: "extracting", failureReason: null, framesDone: 0 });
  await sendExtract(j.clip.id, reqId);
  return get(a, id);
}

/** What deleting the clip would take with it, asked by those who may delete it (the dialog says it). */
export async function deletionCounts(a: Actor, id: string): Promise<ClipDeletionCounts> {
  const j = await editableClip(a, id, policy.deleteClip, "deleting");
  return { frames: j.clip.frameCount ?? j.clip.framesDone, ...(await shotsAndMarksOfClip(a.teamId, j.clip.id)) };
}

export async function remove(a: Actor, id: string): Promise<void> {
  const j = await editableClip(a, id, policy.deleteClip, "deleting");
  const c = j.clip;
  await cancelExtract(c.id).catch((err) => log.warn({ err, clipId: c.id }, "could not cancel the clip's job"));
  // Shots, their results and shares go with the row (foreign keys cascade).
  const gone = await repo.deleteClipRow(a.teamId, c.id);
  if (!gone) throw clipNotFound();
  await recordAudit({
    teamId: a.teamId, actorId: a.userId, action: "clip.deleted", targetType: "clip", targetId: c.id,
    detail: { title: c.title, originalName: c.originalName, sha256: c.sha256, frameCount: c.frameCount },
  });
  // A worker still writing frames removes them itself when it sees the row gone; the sweep catches the rest.
  await storage().deletePrefix(clipKeys.prefix(c.id)).catch((err) => log.warn({ err, clipId: c.id }, "clip files left for the sweep"));
}
