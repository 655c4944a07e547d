// Clip rows as the API shows them (shared/schemas/clips.ts).
import { needsCaptureRateConfirmation, type ClipDetail, type ClipProgress, type ClipSummary } from "../../shared/schemas/clips";
import type { ClipRow, JoinedClip, JoinedClipSummary } from "../entities/clip/repository";

export const clipBase = (teamId: string, clipId: string) => `/api/teams/${teamId}/clips/${clipId}`;

export function progressOf(c: Pick<ClipRow, "status" | "framesDone" | "frameCount">): number {
  if (c.status === "ready") return 1;
  if (!c.frameCount) return 0;
  return Math.min(1, c.framesDone / c.frameCount);
}

export function toSummary(j: JoinedClipSummary): ClipSummary {
  const c = j.clip;
  const base = clipBase(c.teamId, c.id);
  const hasFrames = c.framesDone > 0 || c.status === "ready";
  return {
    id: c.id,
    title: c.title,
    status: c.status,
    failureReason: c.failureReason,
    framesDone: c.framesDone,
    frameCount: c.frameCount,
    progress: progressOf(c),
    captureFps: c.captureFps,
    captureFpsConfirmed: c.captureFpsConfirmed,
    storedFps: c.storedFps,
    needsCaptureRateConfirmation: needsCaptureRateConfirmation(c),
    shotType: c.shotType,
    cameraView: c.cameraView,
    player: c.playerId ? { id: c.playerId, name: j.playerName ?? "" } : null,
    session: j.session?.id ? { id: j.session.id, date: j.session.date, venue: j.session.venue, drill: j.session.drill } : null,
    stick: c.stickId ? { id: c.stickId, label: j.stickLabel ?? "" } : null,
    width: c.width,
    height: c.height,
    durationS: c.durationS,
    rotationDeg: c.rotationDeg,
    variableFrameRate: c.variableFrameRate,
    timing: c.timing ?? null,
    codec: c.codec,
    sizeBytes: c.sizeBytes,
    originalName: c.originalName,
    uploadedBy: c.uploadedBy ? { id: c.uploadedBy, name: j.uploaderName ?? "" } : null,
    createdAt: c.createdAt.toISOString(),
    thumbnailUrl: hasFrames ? `${base}/thumbnail` : null,
    stripUrl: c.status === "ready" ? `${base}/strip` : null,
    frameUrlBase: `${base}/frames`,
  };
}

export function toDetail(j: JoinedClip): ClipDetail {
  const c = j.clip;
  return { ...toSummary(j), exposureUs: c.exposureUs, notes: c.notes, frameTimes: c.frameTimes ?? null, sha256: c.sha256, originalUrl: `${clipBase(c.teamId, c.id)}/original` };
}

export const toProgress = (c: ClipRow): ClipProgress => ({
  id: c.id, status: c.status, framesDone: c.framesDone, frameCount: c.frameCount, progress: progressOf(c), failureReason: c.failureReason,
});
