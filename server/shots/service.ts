import { shotAccess } from "../entities/shot/visibility";
import { policy, type Actor } from "../auth/policy";
import { recordAudit, type AuditEntry } from "../entities/audit/repository";
import { forbidden, HttpError, notFound } from "../http/problem";
import { checkCalibration } from "../../shared/mechanics/calibration";
import { captureTimeOf, shotFrameTimes } from "../../shared/schemas/clips";
import {
  calibrationFrameProblem, canonicalMarks as canonical, LANDMARKS, marksProblem,
  type ClipCalibration, type ClipShots, type CreateShotBody, type DigitiseClip, type FrameBox, type SaveMarksBody, type SaveMarksResponse, type ShotDetail, type ShotSummary, type UpdateShotBody,
} from "../../shared/schemas/shots";
import { VersionConflictError } from "./conflict";
import * as memberRepo from "../entities/member/repository";
import { isUuid } from "../http/ids";
import * as repo from "../entities/shot/repository";
import * as clipRepo from "../entities/clip/repository";
import { stickInTeam, stickLabel } from "../entities/stick/repository";
import { recomputeLater, recomputeShot, toStoredResult } from "./results";
import { shotStickInfo } from "../entities/stick/stiffness";

const invalid = (path: string, message: string) => new HttpError(422, "validation_failed", `${path}: ${message}`, [{ path, message }]);


async function clipOrThrow(a: Actor, clipId: string) {
  if (!isUuid(clipId)) throw notFound("That clip");
  const c = await clipRepo.clipForShots(a.teamId, clipId);
  if (!c) throw notFound("That clip");
  return c;
}

/** A shot the actor may see (else 404, the same answer as a shot that does not exist). */
export async function visibleShot(a: Actor, shotId: string) {
  if (!isUuid(shotId)) throw notFound("That shot");
  const s = await repo.shotById(a.teamId, shotId);
  if (!s) throw notFound("That shot");
  const shares = (await repo.sharesOf([s.id])).get(s.id) ?? [];
  if (!policy.viewShot(a, shotAccess(s, shares))) throw notFound("That shot");
  return s;
}

export async function editableShot(a: Actor, shotId: string) {
  const s = await visibleShot(a, shotId);
  if (!policy.editShot(a, s)) throw forbidden("Players see shots read-only; an analyst or coach edits them.");
  return s;
}

function framesOf(c: clipRepo.ClipForShots): number {
  if (c.frameCount === null || c.width === null || c.height === null)
    throw new HttpError(409, "clip_not_ready", "This clip's frames are not ready yet; wait until extraction finishes.");
  return c.frameCount;
}

function boxOf(c: clipRepo.ClipForShots, s: { frameStart: number; frameEnd: number | null }): FrameBox {
  return { width: c.width ?? 0, height: c.height ?? 0, frameStart: s.frameStart, frameEnd: s.frameEnd ?? c.frameCount ?? s.frameStart };
}

function summary(s: repo.ShotRow): ShotSummary {
  const markCounts: ShotSummary["markCounts"] = {};
  for (const k of LANDMARKS) if (s.marks[k]?.length) markCounts[k] = s.marks[k]!.length;
  const r = s.results as { puckExitSpeed?: { valueMps: number } } | null;
  return {
    id: s.id, clipId: s.clipId, label: s.label, playerId: s.playerId, playerName: s.playerName, stickId: s.stickId, stickLabel: s.stickLabel,
    frameStart: s.frameStart, frameEnd: s.frameEnd ?? s.frameStart, version: s.version, updatedAt: s.updatedAt.toISOString(), updatedByName: s.updatedByName,
    markCounts, events: s.events,
    result: s.resultEngine ? { puckExitSpeedMps: r?.puckExitSpeed?.valueMps ?? null, error: s.resultError, recomputing: !!s.recomputeRequestedAt } : null,
  };
}

async function detail(a: Actor, s: repo.ShotRow): Promise<ShotDetail> {
  const c = await clipOrThrow(a, s.clipId);
  const clock = await clipRepo.clipClock(c.id);
  return {
    ...summary(s),
    marks: s.marks,
    clip: clipFor(c),
    stick: s.stickId && s.stickLabel !== null ? shotStickInfo({ id: s.stickId, label: s.stickLabel, ratedFlex: s.stickRatedFlex, testInForce: s.stickTestInForce }) : null,
    storedResult: s.resultEngine
      ? toStoredResult({ engineVersion: s.resultEngine, results: s.results, error: s.resultError, shotVersion: s.resultShotVersion!, computedAt: s.computedAt!, recomputeRequestedAt: s.recomputeRequestedAt })
      : null,
    canEdit: policy.editShot(a, s),
    frameTimes: clock ? shotFrameTimes(clock.frameTimes, clock.storedFps, clock.captureFps, s.frameStart, s.frameEnd ?? c.frameCount ?? s.frameStart) : null,
    startS: captureTimeOf(clock?.frameTimes, clock?.storedFps ?? null, c.captureFps, s.frameStart),
  };
}

function clipFor(c: clipRepo.ClipForShots): DigitiseClip {
  return {
    id: c.id, title: c.title, status: c.status, captureFps: c.captureFps, frameCount: c.frameCount ?? 0, width: c.width ?? 0, height: c.height ?? 0,
    frameFormat: c.frameFormat, playerId: c.playerId, calibration: c.calibration,
  };
}

export async function listShots(a: Actor, clipId: string): Promise<ClipShots> {
  const c = await clipOrThrow(a, clipId);
  const rows = await repo.shotsOfClip(a.teamId, clipId);
  const shares = await repo.sharesOf(rows.map((r) => r.id));
  const visible = rows.filter((r) => policy.viewShot(a, shotAccess(r, shares.get(r.id))));
  if (!visible.length && !policy.viewClip(a, { teamId: c.teamId, playerId: c.playerId })) throw notFound("That clip");
  return { clip: clipFor(c), shots: visible.map(summary), canEdit: policy.editShot(a, c) };
}

async function checkPeople(a: Actor, playerId: string | null | undefined, stickId: string | null | undefined) {
  if (playerId && !(await memberRepo.isMember(a.teamId, playerId))) throw invalid("playerId", "that player is not a member of this team");
  if (stickId && !(await stickInTeam(a.teamId, stickId))) throw invalid("stickId", "that stick is not one of this team's sticks");
}

function checkRange(frameStart: number, frameEnd: number, frameCount: number) {
  if (frameEnd > frameCount) throw invalid("frameEnd", `the clip has ${frameCount} frames; frameEnd must be ${frameCount} or less`);
  if (frameStart > frameEnd) throw invalid("frameEnd", "frameEnd must not be before frameStart");
}

export async function createShot(a: Actor, clipId: string, b: CreateShotBody): Promise<ShotDetail> {
  if (!policy.editShot(a, { teamId: a.teamId })) throw forbidden("Only staff (analyst, coach, team admin) create shots.");
  const c = await clipOrThrow(a, clipId);
  if (c.status !== "ready") throw new HttpError(409, "clip_not_ready", "This clip's frames are not ready yet; wait until extraction finishes.");
  checkRange(b.frameStart, b.frameEnd, framesOf(c));
  await checkPeople(a, b.playerId, b.stickId);
  const id = await repo.insertShot({
    teamId: a.teamId, clipId, label: b.label ?? "", frameStart: b.frameStart, frameEnd: b.frameEnd,
    playerId: b.playerId === undefined ? c.playerId : b.playerId, stickId: b.stickId === undefined ? c.stickId : b.stickId, userId: a.userId,
  });
  await recomputeShot(id);
  return detail(a, (await repo.shotById(a.teamId, id))!);
}

export async function getShot(a: Actor, shotId: string) {
  return detail(a, await visibleShot(a, shotId));
}

export async function saveMarks(a: Actor, shotId: string, b: SaveMarksBody): Promise<SaveMarksResponse> {
  const s = await editableShot(a, shotId);
  const c = await clipOrThrow(a, s.clipId);
  const p = marksProblem(b.marks, b.events, boxOf(c, s));
  if (p) throw invalid(p.path, p.message);
  const next = canonical(b.marks, b.events);
  // The same edits again (a retried autosave whose answer was lost) succeed without a new version.
  if (next.key === canonical(s.marks, s.events).key)
    return { version: s.version, updatedAt: s.updatedAt.toISOString(), updatedByName: s.updatedByName, storedResult: await currentResult(s) };
  const saved = await repo.saveMarks(shotId, b.baseVersion, next.marks, next.events, a.userId);
  if (!saved) {
    const now = (await repo.shotById(a.teamId, shotId))!;
    throw new VersionConflictError({ currentVersion: now.version, savedBy: now.updatedByName, savedAt: now.updatedAt.toISOString() });
  }
  const storedResult = await recomputeShot(shotId);
  const now = (await repo.shotById(a.teamId, shotId))!;
  return { version: saved.version, updatedAt: saved.updatedAt.toISOString(), updatedByName: now.updatedByName, storedResult };
}

async function currentResult(s: repo.ShotRow) {
  if (s.resultEngine && s.resultShotVersion === s.version)
    return toStoredResult({ engineVersion: s.resultEngine, results: s.results, error: s.resultError, shotVersion: s.resultShotVersion, computedAt: s.computedAt!, recomputeRequestedAt: s.recomputeRequestedAt });
  return recomputeShot(s.id);
}

export async function updateShot(a: Actor, shotId: string, b: UpdateShotBody): Promise<ShotDetail> {
  const s = await editableShot(a, shotId);
  const c = await clipOrThrow(a, s.clipId);
  const frameStart = b.frameStart ?? s.frameStart;
  const frameEnd = b.frameEnd ?? s.frameEnd ?? frameStart;
  checkRange(frameStart, frameEnd, framesOf(c));
  const p = marksProblem(s.marks, s.events, boxOf(c, { frameStart, frameEnd }));
  if (p) throw invalid(b.frameStart !== undefined ? "frameStart" : "frameEnd", `the new frame range leaves marks outside it: ${p.message}`);
  await checkPeople(a, b.playerId, b.stickId);
  await repo.updateShotMeta(shotId, b, reassignEntry(a, s, b, b.stickId ? await stickLabel(a.teamId, b.stickId) : null));
  if (b.stickId !== undefined || b.frameStart !== undefined || b.frameEnd !== undefined) await recomputeShot(shotId);
  return detail(a, (await repo.shotById(a.teamId, shotId))!);
}

/** The audit entry when staff correct who took the shot or with which stick; none when neither changes. */
function reassignEntry(a: Actor, s: repo.ShotRow, b: UpdateShotBody, toLabel: string | null): AuditEntry | undefined {
  const player = b.playerId !== undefined && b.playerId !== s.playerId ? { from: s.playerId, fromName: s.playerName, to: b.playerId } : undefined;
  const stick = b.stickId !== undefined && b.stickId !== s.stickId ? { from: s.stickId, fromLabel: s.stickLabel, to: b.stickId, toLabel } : undefined;
  if (!player && !stick) return undefined;
  return {
    teamId: a.teamId, actorId: a.userId, action: "shot.reassigned", targetType: "shot", targetId: s.id,
    detail: { clipId: s.clipId, label: s.label, ...(player ? { player } : {}), ...(stick ? { stick } : {}) },
  };
}

export async function deleteShot(a: Actor, shotId: string) {
  const s = await editableShot(a, shotId);
  await repo.deleteShot(shotId);
  await recordAudit({
    teamId: a.teamId, actorId: a.userId, action: "shot.deleted", targetType: "shot", targetId: shotId,
    detail: { clipId: s.clipId, label: s.label, frames: [s.frameStart, s.frameEnd], version: s.version },
  });
}

export async function setCalibration(a: Actor, clipId: string, cal: ClipCalibration | null, reqId?: string) {
  const c = await clipOrThrow(a, clipId);
  // Someone who may not even see the clip learns nothing about it: 404, as for no clip at all.
  if (!policy.viewClip(a, { teamId: c.teamId, playerId: c.playerId })) throw notFound("That clip");
  if (!policy.editClip(a, c)) throw forbidden("Players see calibrations read-only.");
  framesOf(c);
  if (cal) {
    const onFrame = calibrationFrameProblem(cal, { width: c.width!, height: c.height! });
    if (onFrame) throw invalid(onFrame.path, onFrame.message);
    const p = checkCalibration(cal.type === "scaleBar" ? { type: "scaleBar", a: cal.a, b: cal.b, lengthMm: cal.lengthMm } : cal);
    if (p) throw invalid(["calibration", ...p.path].join("."), p.message);
  }
  await clipRepo.setClipCalibration(clipId, cal);
  // The clip's shots are recomputed on the queue; until then their pages say "recomputing".
  await recomputeLater({ scope: "clip", id: clipId }, reqId);
  return { calibration: cal };
}
