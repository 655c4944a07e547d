// The shots API (docs/api.md, "Shots"): bodies, answers and the checks both sides share, so the
// Digitise page refuses exactly what the server refuses, with the same words. Marks are in the
// clip's original frame pixels (x right, y down, sub-pixel); frames are the clip's frame numbers
// (the first frame is 1). The mechanics engine's own schemas are reused wherever they fit.
import { z } from "zod";
import { humanText, opaqueId, TEXT_LIMITS } from "./text";
import { PUCK_DIAMETER_MM, LANDMARKS, PlaneCalibration, ScaleBarCalibration, ShotEvents, Tracks, type Landmark, type Mark, type ShotDocumentInput } from "./shot-document";
import type { ShotResults } from "./shot-results";
import { MM_PER_IN } from "../units";

export { LANDMARKS, PUCK_DIAMETER_MM, type Landmark, type Mark };

export const EVENTS = ["iceStrike", "puckStrike", "peakBend", "release"] as const;
export type ShotEventKey = (typeof EVENTS)[number];

export const landmarkLabels: Record<Landmark, string> = {
  puck: "Puck",
  bladeHeel: "Blade heel",
  bladeToe: "Blade toe",
  bottomHand: "Bottom hand",
  topHand: "Top hand",
  buttEnd: "Butt end",
};

export const eventLabels: Record<ShotEventKey, string> = {
  iceStrike: "Ice strike",
  puckStrike: "Puck strike",
  peakBend: "Peak bend",
  release: "Release",
};

/** Marks per landmark; every landmark optional while digitising. */
export const ShotMarks = Tracks.partial();
export type ShotMarks = Partial<Record<Landmark, Mark[]>>;

/** Events set so far; each optional while digitising. */
export const ShotEventsDraft = ShotEvents.partial();
export type ShotEventsDraft = Partial<Record<ShotEventKey, number>>;

const label = humanText({ field: "The label", max: TEXT_LIMITS.label });
const frame = (what: string) =>
  z.number({ error: `${what} must be a frame number` }).int({ error: `${what} must be a whole frame number` }).min(1, { error: `${what} must be 1 or more (the first frame is 1)` });

export const CreateShotBody = z
  .strictObject({
    label: label.optional(),
    frameStart: frame("frameStart"),
    frameEnd: frame("frameEnd"),
    /** Defaults to the clip's player. */
    playerId: opaqueId("playerId").nullable().optional(),
    /** Defaults to the clip's stick. */
    stickId: z.uuid({ error: "stickId must be a stick id" }).nullable().optional(),
  })
  .refine((b) => b.frameEnd >= b.frameStart, { path: ["frameEnd"], error: "frameEnd must not be before frameStart" });
export type CreateShotBody = z.infer<typeof CreateShotBody>;

export const UpdateShotBody = z
  .strictObject({
    label: label.optional(),
    frameStart: frame("frameStart").optional(),
    frameEnd: frame("frameEnd").optional(),
    playerId: opaqueId("playerId").nullable().optional(),
    stickId: z.uuid({ error: "stickId must be a stick id" }).nullable().optional(),
  })
  .refine((b) => Object.keys(b).length > 0, { error: "nothing to change" });
export type UpdateShotBody = z.infer<typeof UpdateShotBody>;

export const SaveMarksBody = z.strictObject({
  /** The version the edits started from; a stale one answers 409 version_conflict. */
  baseVersion: z.number({ error: "baseVersion is required: the shot version your edits started from" }).int().min(1),
  marks: ShotMarks,
  events: ShotEventsDraft,
});
export type SaveMarksBody = { baseVersion: number; marks: ShotMarks; events: ShotEventsDraft };

/** Scale bar as stored with the clip: the engine's fields plus the unit the analyst typed the length in. */
export const ClipScaleBar = ScaleBarCalibration.extend({ lengthUnit: z.enum(["mm", "in"]).default("mm") });
export const ClipPlane = PlaneCalibration;
export const ClipCalibration = z.discriminatedUnion("type", [ClipScaleBar, ClipPlane], { error: 'calibration.type must be "scaleBar" or "plane"' });
export type ClipCalibration = z.output<typeof ClipCalibration>;
export type ClipCalibrationInput = z.input<typeof ClipCalibration>;

export const CalibrationBody = z.strictObject({ calibration: ClipCalibration.nullable() });
export type CalibrationBody = { calibration: ClipCalibrationInput | null };

export const lengthToMm = (value: number, unit: "mm" | "in") => (unit === "in" ? value * MM_PER_IN : value);
export const mmToLength = (mm: number, unit: "mm" | "in") => (unit === "in" ? mm / MM_PER_IN : mm);

/** The engine's calibration: the clip's without the display unit. */
export function engineCalibration(c: ClipCalibration): ShotDocumentInput["calibration"] {
  if (c.type === "scaleBar") return { type: "scaleBar", a: c.a, b: c.b, lengthMm: c.lengthMm };
  return { type: "plane", points: c.points };
}

// ---- checks at the point of entry -------------------------------------------------------------

export interface EntryProblem {
  path: string;
  message: string;
}

export interface FrameBox {
  width: number;
  height: number;
  frameStart: number;
  frameEnd: number;
}

const inside = (box: FrameBox, x: number, y: number) => x >= 0 && y >= 0 && x <= box.width && y <= box.height;

/** A point outside the picture, as one sentence. */
export function outsideFrameMessage(box: FrameBox, x: number, y: number): string {
  return `(${x.toFixed(1)}, ${y.toFixed(1)}) is outside the frame (0–${box.width} × 0–${box.height} px)`;
}

/**
 * Event order as the engine demands it (shared/mechanics/validate-shot.ts), applied to whichever
 * events are set so far: ice strike ≤ puck strike < release, peak bend between ice strike and release.
 */
export function eventOrderProblem(e: ShotEventsDraft): EntryProblem | null {
  const { iceStrike: ice, puckStrike: puck, peakBend: peak, release: rel } = e;
  if (ice !== undefined && puck !== undefined && ice > puck)
    return { path: "events.iceStrike", message: `ice strike (frame ${ice}) must not come after puck strike (frame ${puck})` };
  if (puck !== undefined && rel !== undefined && rel <= puck)
    return { path: "events.release", message: `release (frame ${rel}) must come after puck strike (frame ${puck})` };
  if (ice !== undefined && rel !== undefined && rel <= ice)
    return { path: "events.release", message: `release (frame ${rel}) must come after ice strike (frame ${ice})` };
  if (peak !== undefined && ice !== undefined && peak < ice)
    return { path: "events.peakBend", message: `peak bend (frame ${peak}) must not come before ice strike (frame ${ice})` };
  if (peak !== undefined && rel !== undefined && peak > rel)
    return { path: "events.peakBend", message: `peak bend (frame ${peak}) must not come after release (frame ${rel})` };
  return null;
}

/** Marks and events against the frame and the shot's frame range; the first problem, or null. */
export function marksProblem(marks: ShotMarks, events: ShotEventsDraft, box: FrameBox): EntryProblem | null {
  for (const k of LANDMARKS) {
    const track = marks[k];
    if (!track) continue;
    const seen = new Set<number>();
    for (let i = 0; i < track.length; i++) {
      const [f, x, y] = track[i];
      const path = `marks.${k}.${i}`;
      if (f < box.frameStart || f > box.frameEnd)
        return { path, message: `${landmarkLabels[k]} is marked on frame ${f}, outside this shot's frames ${box.frameStart}–${box.frameEnd}` };
      if (!inside(box, x, y)) return { path, message: `${landmarkLabels[k]} on frame ${f}: ${outsideFrameMessage(box, x, y)}` };
      if (seen.has(f)) return { path, message: `${landmarkLabels[k]} is marked twice on frame ${f}` };
      seen.add(f);
    }
  }
  for (const k of EVENTS) {
    const f = events[k];
    if (f !== undefined && (f < box.frameStart || f > box.frameEnd))
      return { path: `events.${k}`, message: `${eventLabels[k]} (frame ${f}) is outside this shot's frames ${box.frameStart}–${box.frameEnd}` };
  }
  return eventOrderProblem(events);
}

/** Calibration points must lie on the picture. */
export function calibrationFrameProblem(c: ClipCalibrationInput, box: { width: number; height: number }): EntryProblem | null {
  const b: FrameBox = { ...box, frameStart: 1, frameEnd: 1 };
  if (c.type === "scaleBar") {
    for (const end of ["a", "b"] as const) {
      const [x, y] = c[end];
      if (!inside(b, x, y)) return { path: `calibration.${end}`, message: `scale bar end ${end}: ${outsideFrameMessage(b, x, y)}` };
    }
    return null;
  }
  for (let i = 0; i < c.points.length; i++) {
    const [x, y] = c.points[i].image;
    if (!inside(b, x, y)) return { path: `calibration.points.${i}.image`, message: `plane point ${i + 1}: ${outsideFrameMessage(b, x, y)}` };
  }
  return null;
}

/** Sorted by frame, empty tracks dropped, events in a fixed order: the same edits give the same key. */
export function canonicalMarks(marks: ShotMarks, events: ShotEventsDraft): { marks: ShotMarks; events: ShotEventsDraft; key: string } {
  const m: ShotMarks = {};
  for (const k of LANDMARKS) {
    const t = marks[k];
    if (t?.length) m[k] = [...t].sort((p, q) => p[0] - q[0]);
  }
  const e: ShotEventsDraft = {};
  for (const k of EVENTS) if (events[k] !== undefined) e[k] = events[k];
  return { marks: m, events: e, key: JSON.stringify([m, e]) };
}

// ---- from a shot to the engine's document ------------------------------------------------------

export interface ShotDocumentParts {
  captureFps: number;
  calibration: ClipCalibration | null;
  marks: ShotMarks;
  events: ShotEventsDraft;
  frameStart: number;
  frameEnd: number;
  stick: { flex: number; benchSpanMm: number } | null;
  /** The clip's own frame clock over the shot's frames (shotFrameTimes), null when even. */
  frameTimes?: { firstFrame: number; seconds: number[] } | null;
}

/**
 * The engine's document for a shot, or what is still missing to compute one, said so a person
 * knows the next step. `pixelsOnly` computes with 1 mm per px when there is no calibration (the
 * Digitise page's preview: numbers then read in px).
 */
export function toShotDocument(p: ShotDocumentParts, opts: { pixelsOnly?: boolean } = {}): { doc: ShotDocumentInput; missing: null } | { doc: null; missing: string } {
  const missing: string[] = [];
  if (!p.calibration && !opts.pixelsOnly) missing.push("a calibration for the clip (scale bar or plane)");
  if (p.events.puckStrike === undefined) missing.push("the puck strike event");
  if (p.events.release === undefined) missing.push("the release event");
  const rel = p.events.release;
  const flight = rel === undefined ? 0 : (p.marks.puck ?? []).filter((m) => m[0] >= rel).length;
  if (flight < 3) missing.push(`at least 3 puck marks from release on (${flight} so far)`);
  if (missing.length) return { doc: null, missing: `To compute results this shot still needs ${joinList(missing)}.` };
  const tracks: ShotDocumentInput["tracks"] = { puck: p.marks.puck ?? [] };
  for (const k of LANDMARKS) if (k !== "puck" && p.marks[k]?.length) tracks[k] = p.marks[k];
  return {
    missing: null,
    doc: {
      captureFps: p.captureFps,
      calibration: p.calibration ? engineCalibration(p.calibration) : { type: "scaleBar", a: [0, 0], b: [1, 0], lengthMm: 1 },
      tracks,
      events: p.events as ShotDocumentInput["events"],
      frameRange: [p.frameStart, p.frameEnd],
      stick: p.stick,
      ...(p.frameTimes ? { frameTimes: p.frameTimes } : {}),
    },
  };
}

function joinList(items: string[]): string {
  return items.length <= 1 ? items.join("") : `${items.slice(0, -1).join(", ")} and ${items[items.length - 1]}`;
}

// ---- answers ---------------------------------------------------------------------------------

export interface StoredResult {
  engineVersion: string;
  /** Null with `error` saying what is missing or wrong. */
  results: ShotResults | null;
  error: string | null;
  /** The shot version the result was computed from. */
  shotVersion: number;
  computedAt: string;
  /** Something the results depend on changed (the clip's calibration, the stick's stiffness): new ones are being computed; these are the previous ones. */
  recomputing: boolean;
}

export interface ShotSummary {
  id: string;
  clipId: string;
  label: string;
  playerId: string | null;
  playerName: string | null;
  stickId: string | null;
  stickLabel: string | null;
  frameStart: number;
  frameEnd: number;
  version: number;
  updatedAt: string;
  updatedByName: string | null;
  /** Marks per landmark. */
  markCounts: Partial<Record<Landmark, number>>;
  events: ShotEventsDraft;
  result: { puckExitSpeedMps: number | null; error: string | null; recomputing: boolean } | null;
}

export interface DigitiseClip {
  id: string;
  title: string;
  status: string;
  captureFps: number;
  frameCount: number;
  width: number;
  height: number;
  frameFormat: string;
  playerId: string | null;
  calibration: ClipCalibration | null;
}

/** GET /clips/:clipId/shots: the clip, the shots the caller may see, and whether they may add some. */
export interface ClipShots {
  clip: DigitiseClip;
  shots: ShotSummary[];
  canEdit: boolean;
}

export interface ShotStickInfo {
  id: string;
  label: string;
  /** lbf/in used for stored energy: the latest bench test's measured flex, else the rated flex. */
  flex: number | null;
  flexSource: "measured" | "rated" | null;
  benchSpanMm: number;
  testedOn: string | null;
}

export interface ShotDetail extends ShotSummary {
  marks: ShotMarks;
  clip: DigitiseClip;
  stick: ShotStickInfo | null;
  storedResult: StoredResult | null;
  /** Whether the caller may edit (staff); players see the shot read-only. */
  canEdit: boolean;
  /** The clip's frame clock over frameStart..frameEnd in capture seconds; null when it is even (frame ÷ rate). */
  frameTimes: { firstFrame: number; seconds: number[] } | null;
  /** Capture seconds from the clip's first frame to frameStart, on the clip's own clock. */
  startS: number;
}

export interface SaveMarksResponse {
  version: number;
  updatedAt: string;
  updatedByName: string | null;
  storedResult: StoredResult | null;
}

export interface CalibrationResponse {
  calibration: ClipCalibration | null;
}

/** Extension members of the 409 `version_conflict` problem. */
export interface VersionConflict {
  currentVersion: number;
  savedBy: string | null;
  savedAt: string;
}
