// From stored rows to the answers of the readout API. Pure apart from nothing: no queries here.
import { EVENTS, toShotDocument, type ShotStickInfo } from "../../shared/schemas/shots";
import { frameClockMs, type ReadoutEvent, type ShareRow, type ShotListItem, type ShotReadout, type ShotType } from "../../shared/schemas/readout";
import type { ReadoutRow } from "../entities/shot/readout";
import type { PageRow } from "../entities/shot/list-page";
import { shotDate } from "../entities/shot/date";
import { shotFrameTimes } from "../../shared/schemas/clips";

/** The shot's frames on the clip's own clock, or null where that is frame ÷ rate (decision 131). */
export const shotClockOf = (r: Pick<ReadoutRow, "clipFrameTimes" | "storedFps" | "captureFps" | "frameStart" | "frameEnd" | "frameCount">) =>
  shotFrameTimes(r.clipFrameTimes, r.storedFps, r.captureFps, r.frameStart, r.frameEnd ?? r.frameCount ?? r.frameStart);

type Common = Pick<ReadoutRow, "sessionDate" | "clipCreatedAt" | "resultShotVersion" | "resultError" | "calibration" | "events" | "frameStart" | "frameEnd" | "frameCount" | "captureFps">;


const NOT_COMPUTED = "Results have not been computed for this shot yet: open it on the Digitise page and save its marks.";

/** What is still needed, for a row read without its marks (the Shots list): the stored engine message, else the next step. */
export const missingWithoutMarks = (resultError: string | null, hasResults: boolean): string | null => (hasResults ? null : resultError || NOT_COMPUTED);

/**
 * What is still needed before there are results, said as the next step. The stored engine message
 * when there is one; else the same check the server runs before computing.
 */
export function missingOf(r: Common & { marks?: ReadoutRow["marks"] }, hasResults: boolean): string | null {
  if (hasResults || r.resultError || !r.marks) return missingWithoutMarks(r.resultError, hasResults);
  const built = toShotDocument({
    captureFps: r.captureFps, calibration: r.calibration, marks: r.marks, events: r.events,
    frameStart: r.frameStart, frameEnd: r.frameEnd ?? r.frameCount ?? r.frameStart, stick: null,
  });
  return built.missing || NOT_COMPUTED;
}

export function eventsOf(r: Pick<Common, "events" | "frameStart" | "captureFps"> & { frameTimes?: { firstFrame: number; seconds: number[] } | null }): ReadoutEvent[] {
  const strike = r.events.puckStrike;
  const ms = frameClockMs(r.frameTimes, r.captureFps);
  return EVENTS.filter((k) => r.events[k] !== undefined).map((key) => {
    const frame = r.events[key]!;
    return {
      key,
      frame,
      tMs: ms(frame, r.frameStart),
      tFromStrikeMs: strike === undefined ? null : ms(frame, strike),
    };
  });
}

export function listItem(r: PageRow, opts: { viewerId: string; sharedWithViewer: boolean; shareCount: number; viewerIsStaff: boolean }): ShotListItem {
  const s = r.summary;
  return {
    id: r.id, label: r.label, clipId: r.clipId, clipTitle: r.clipTitle, playerId: r.playerId, playerName: r.playerName,
    stickId: r.stickId, stickLabel: r.stickLabel, shotType: r.shotType as ShotType, date: r.date, sessionId: r.sessionId, venue: r.venue || null,
    captureFps: r.captureFps, hasResults: !!s, missing: missingWithoutMarks(r.resultError, !!s),
    puckExitSpeedMps: s?.puckExitSpeed.valueMps ?? null,
    bladeSpeedMps: s?.bladeSpeedAtStrike?.valueMps ?? null,
    peakBendDeg: s?.peakBend?.angleDeg ?? null,
    loadTimeMs: s?.loadTimeMs ?? null,
    contactTimeMs: s?.contactTimeMs ?? null,
    recomputing: r.recomputing,
    sharedWithMe: opts.sharedWithViewer && r.playerId !== opts.viewerId && !opts.viewerIsStaff,
    shareCount: opts.viewerIsStaff ? opts.shareCount : 0,
    published: r.publishedAt !== null,
  };
}

export function readout(r: ReadoutRow & { resultsText?: string | null }, o: { shares: ShareRow[]; stick: ShotStickInfo | null; canEdit: boolean; canShare: boolean; canPublish: boolean }): ShotReadout {
  const hasResults = !!r.results || !!r.resultsText;
  const frameTimes = shotClockOf(r);
  return {
    shot: {
      id: r.id, label: r.label, clipId: r.clipId, playerId: r.playerId, playerName: r.playerName, stickId: r.stickId, stickLabel: r.stickLabel,
      shotType: r.shotType as ShotType, cameraView: r.cameraView, date: shotDate(r), venue: r.venue || null,
      frameStart: r.frameStart, frameEnd: r.frameEnd ?? r.frameCount ?? r.frameStart, version: r.version, updatedAt: r.updatedAt.toISOString(),
    },
    clip: {
      id: r.clipId, title: r.clipTitle, status: r.clipStatus, captureFps: r.captureFps, frameCount: r.frameCount ?? 0, width: r.width ?? 0, height: r.height ?? 0,
      frameFormat: r.frameFormat, calibration: r.calibration?.type ?? null,
    },
    events: eventsOf({ ...r, frameTimes }),
    frameTimes,
    results: r.results,
    missing: missingOf(r, hasResults),
    stale: hasResults && r.resultShotVersion !== null && r.resultShotVersion !== r.version,
    recomputing: !!r.recomputeRequestedAt,
    computedAt: r.computedAt?.toISOString() ?? null,
    stick: o.stick,
    shares: o.shares,
    publication: r.publishedAt ? { publishedAt: r.publishedAt.toISOString(), publishedByName: r.publishedByName } : null,
    can: { edit: o.canEdit, share: o.canShare, publish: o.canPublish },
  };
}
