import { z } from "zod";
import { humanText, opaqueId, TEXT_LIMITS } from "./text";
import type { ProblemCode } from "./problem-codes";

// Clip metadata and the clip API's shapes, checked by the upload form and by the server.

export const shotTypes = ["slap", "wrist", "snap", "backhand"] as const;
export const cameraViews = ["side", "front", "overhead", "other"] as const;
export const clipStatuses = ["uploading", "probing", "extracting", "ready", "failed"] as const;
export type ShotType = (typeof shotTypes)[number];
export type CameraView = (typeof cameraViews)[number];
export type ClipStatus = (typeof clipStatuses)[number];

export const shotTypeLabels: Record<ShotType, string> = { slap: "Slap shot", wrist: "Wrist shot", snap: "Snap shot", backhand: "Backhand" };
export const cameraViewLabels: Record<CameraView, string> = { side: "Side", front: "Front", overhead: "Overhead", other: "Other" };
export const clipStatusLabels: Record<ClipStatus, string> = {
  uploading: "Uploading", probing: "Checking file", extracting: "Extracting frames", ready: "Ready", failed: "Failed",
};

/** A stored rate at or below this is usually a playback rate, not what the camera captured. */
export const PLAYBACK_RATE_MAX_FPS = 60;
export const MAX_CAPTURE_FPS = 1_000_000;

/**
 * A clip's frame clock as ingest found it (docs/decisions/131-clip-timing.md). Frames counted from 1.
 * - even: every frame on a regular grid; snapped: a coarse container clock, put on that grid;
 *   uneven: times that no grid explains, kept as they are (a phone's variable rate).
 */
export interface ClipTiming {
  clock: "even" | "snapped" | "uneven";
  /** Rate of the grid in the stored timeline (the typical rate of an uneven clock). */
  nominalFps: number;
  /** Resolution of the container's clock, seconds. */
  tickS: number;
  /** Frame `after` is followed by about `missing` missing frames. At most 200 listed. */
  gaps: { after: number; missing: number }[];
  gapCount: number;
  /** Frames at the same instant as the frame before. At most 200 listed. */
  repeats: number[];
  repeatCount: number;
  /** Frames the file's header promises that could not be decoded (a cut or damaged file). */
  missingTail: { from: number; to: number } | null;
}

/** True when the clip has real gaps, repeats or missing frames. */
export const timingIrregular = (t: ClipTiming | null | undefined): boolean => !!t && (t.gapCount > 0 || t.repeatCount > 0 || t.missingTail !== null);

const framesWord = (n: number) => `${n.toLocaleString("en")} frame${n === 1 ? "" : "s"}`;

/** The clip's timing irregularities in words, first `max` of each kind ("after frame 100: about 3 frames missing"). */
export function describeClipTiming(t: ClipTiming, max = 5): string[] {
  const out: string[] = [];
  for (const g of t.gaps.slice(0, max)) out.push(`After frame ${g.after.toLocaleString("en")}: about ${framesWord(g.missing)} missing`);
  const moreGaps = t.gapCount - Math.min(max, t.gaps.length);
  if (moreGaps > 0) out.push(`…and ${moreGaps.toLocaleString("en")} more gap${moreGaps === 1 ? "" : "s"}`);
  for (const f of t.repeats.slice(0, max)) out.push(`Frame ${f.toLocaleString("en")} repeats the time of frame ${(f - 1).toLocaleString("en")}`);
  const moreRepeats = t.repeatCount - Math.min(max, t.repeats.length);
  if (moreRepeats > 0) out.push(`…and ${moreRepeats.toLocaleString("en")} more repeated frame${moreRepeats === 1 ? "" : "s"}`);
  if (t.missingTail) out.push(`Frames ${t.missingTail.from.toLocaleString("en")}–${t.missingTail.to.toLocaleString("en")}, promised by the file's header, are missing (the file was cut or damaged)`);
  return out;
}

/**
 * True when the person must confirm the capture rate before speeds mean anything: whenever ingest
 * could not (a playback-looking stored rate, a tag that differs from it, an uneven clock).
 */
export const needsCaptureRateConfirmation = (c: { storedFps: number | null; captureFpsConfirmed: boolean }) => !c.captureFpsConfirmed;

/**
 * Capture-time seconds of each frame from the stored timestamps: a 3,200 fps capture stored at
 * 30 fps runs 30/3200 as fast in real time. Speeds use these, never the stored timeline.
 */
export function captureTimes(frameTimes: readonly number[], storedFps: number | null, captureFps: number): number[] {
  const t0 = frameTimes[0] ?? 0;
  const factor = storedFps && storedFps > 0 ? storedFps / captureFps : 1;
  return frameTimes.map((t) => (t - t0) * factor);
}

/**
 * The engine's frame clock for clip frames from..to (counted from 1): their capture times, or null
 * when those are simply frame ÷ capture rate (an even clock, where the engine's default is exact)
 * or unknown. Stored times are kept to 1 µs, hence the tolerance.
 */
export function shotFrameTimes(
  frameTimes: readonly number[] | null | undefined,
  storedFps: number | null,
  captureFps: number,
  from: number,
  to: number,
): { firstFrame: number; seconds: number[] } | null {
  if (!frameTimes || from < 1 || to > frameTimes.length || to <= from) return null;
  const seconds = captureTimes(frameTimes.slice(from - 1, to), storedFps, captureFps);
  const scale = storedFps && storedFps > 0 ? storedFps / captureFps : 1;
  const tolerance = 1.5e-6 * scale;
  const even = seconds.every((t, i) => Math.abs(t - i / captureFps) <= tolerance);
  return even ? null : { firstFrame: from, seconds };
}

/** Capture seconds from the clip's first frame to `frame` (counted from 1): its stored time, else frame ÷ rate. */
export function captureTimeOf(frameTimes: readonly number[] | null | undefined, storedFps: number | null, captureFps: number, frame: number): number {
  const t = frameTimes?.[frame - 1];
  if (t === undefined || frameTimes!.length === 0) return (frame - 1) / captureFps;
  return captureTimes([frameTimes![0], t], storedFps, captureFps)[1];
}

const isoDate = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, "Use a date like 2026-03-14");
const text = (max: number, field: string, multiline = false) => humanText({ field, max, multiline });

export const NewSessionSchema = z.object({
  date: isoDate,
  venue: text(TEXT_LIMITS.title, "Venue").default(""),
  drill: text(TEXT_LIMITS.title, "Drill").default(""),
});

const captureFps = z
  .number({ message: "Enter the capture frame rate in frames per second" })
  .positive("The capture frame rate must be above 0 fps")
  .max(MAX_CAPTURE_FPS, `The capture frame rate can be at most ${MAX_CAPTURE_FPS.toLocaleString("en")} fps`);
const exposureUs = z.number().positive("Exposure must be above 0 µs").max(10_000_000, "Exposure must be at most 10 s").nullable();

/** The form per file: sent as tus metadata `meta` (JSON) with the upload. */
export const ClipMetaSchema = z
  .object({
    title: text(TEXT_LIMITS.title, "Title").default(""),
    /** An existing session of the team, or a new one (date, venue, drill). */
    sessionId: z.uuid("Pick a session").optional(),
    newSession: NewSessionSchema.optional(),
    playerId: opaqueId("playerId", "Pick the player who shoots"),
    shotType: z.enum(shotTypes, { message: "Shot type must be slap, wrist, snap or backhand" }),
    stickId: z.uuid("Pick a stick from the list").nullable().optional(),
    cameraView: z.enum(cameraViews, { message: "Camera view must be side, front, overhead or other" }),
    /** Empty: decide once the file's stored rate is known. */
    captureFps: captureFps.optional(),
    /** The person says captureFps is what the camera captured at. */
    captureFpsConfirmed: z.boolean().default(false),
    exposureUs: exposureUs.optional(),
    notes: text(TEXT_LIMITS.notes, "Notes", true).default(""),
  })
  .strict()
  .superRefine((v, ctx) => {
    if (!v.sessionId && !v.newSession) ctx.addIssue({ code: "custom", path: ["sessionId"], message: "Pick a session or enter the date of a new one" });
    if (v.sessionId && v.newSession) ctx.addIssue({ code: "custom", path: ["newSession"], message: "Pick an existing session or a new one, not both" });
    if (v.captureFpsConfirmed && v.captureFps === undefined)
      ctx.addIssue({ code: "custom", path: ["captureFps"], message: "Enter the capture frame rate you are confirming" });
  });
export type ClipMetaInput = z.input<typeof ClipMetaSchema>;
export type ClipMeta = z.output<typeof ClipMetaSchema>;

/** PATCH /clips/:id — edit metadata, confirm the capture rate. */
export const ClipPatchSchema = z
  .object({
    title: text(TEXT_LIMITS.title, "Title"),
    sessionId: z.uuid("Pick a session"),
    newSession: NewSessionSchema,
    playerId: opaqueId("playerId", "Pick the player who shoots"),
    shotType: z.enum(shotTypes, { message: "Shot type must be slap, wrist, snap or backhand" }),
    stickId: z.uuid("Pick a stick from the list").nullable(),
    cameraView: z.enum(cameraViews, { message: "Camera view must be side, front, overhead or other" }),
    captureFps,
    captureFpsConfirmed: z.boolean(),
    exposureUs,
    notes: text(TEXT_LIMITS.notes, "Notes", true),
    /**
     * With a new player: true moves the clip's shots of its previous player to the new one (and
     * with them who may see them); false leaves them where they are. Required when there are any.
     */
    moveShots: z.boolean({ message: "Say whether the clip's shots move to the new player (true or false)" }),
  })
  .partial()
  .strict()
  .superRefine((v, ctx) => {
    if (v.sessionId && v.newSession) ctx.addIssue({ code: "custom", path: ["newSession"], message: "Pick an existing session or a new one, not both" });
  });
export type ClipPatch = z.infer<typeof ClipPatchSchema>;

export const clipSorts = ["created", "title", "player", "session", "shotType", "captureFps", "frames", "status"] as const;
export type ClipSort = (typeof clipSorts)[number];

/** Clips a page of the clips table holds, unless the request asks for another size. */
export const CLIP_PAGE_SIZE = 20;

export const ClipListQuerySchema = z.object({
  playerId: opaqueId("playerId").optional(),
  sessionId: z.uuid("Unknown session").optional(),
  shotType: z.enum(shotTypes).optional(),
  status: z.enum(clipStatuses).optional(),
  sort: z.enum(clipSorts).default("created"),
  dir: z.enum(["asc", "desc"]).default("desc"),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(CLIP_PAGE_SIZE),
});
export type ClipListQuery = z.input<typeof ClipListQuerySchema>;

export interface SessionRef { id: string; date: string; venue: string; drill: string }
export interface NamedRef { id: string; name: string }

export interface ClipSummary {
  id: string;
  title: string;
  status: ClipStatus;
  failureReason: string | null;
  framesDone: number;
  frameCount: number | null;
  /** 0–1. */
  progress: number;
  captureFps: number;
  captureFpsConfirmed: boolean;
  storedFps: number | null;
  needsCaptureRateConfirmation: boolean;
  shotType: ShotType;
  cameraView: CameraView;
  player: NamedRef | null;
  session: SessionRef | null;
  stick: { id: string; label: string } | null;
  width: number | null;
  height: number | null;
  durationS: number | null;
  rotationDeg: number;
  variableFrameRate: boolean;
  /** The frame clock ingest found (null for clips stored before it was kept). */
  timing: ClipTiming | null;
  codec: string | null;
  sizeBytes: number | null;
  originalName: string;
  uploadedBy: NamedRef | null;
  createdAt: string;
  /** Null until the first frames exist. */
  thumbnailUrl: string | null;
  stripUrl: string | null;
  /** Frame n lives at `${frameUrlBase}/${n}` (n from 1). */
  frameUrlBase: string;
}

export interface ClipDetail extends ClipSummary {
  exposureUs: number | null;
  notes: string;
  /** Stored presentation time of each frame in seconds, index 0 = frame 1 (null until extracted). */
  frameTimes: number[] | null;
  originalUrl: string;
  /** SHA-256 of the original as stored (hex). */
  sha256: string | null;
}

/** GET …/clips/:id/deletion — what deleting the clip removes with it. */
export interface ClipDeletionCounts { frames: number; shots: number; marks: number }

export interface ClipPage { items: ClipSummary[]; total: number; page: number; pageSize: number }

export interface ClipProgress { id: string; status: ClipStatus; framesDone: number; frameCount: number | null; progress: number; failureReason: string | null }

export interface ClipOptions {
  sessions: SessionRef[];
  players: NamedRef[];
  sticks: { id: string; label: string; ownerId: string | null }[];
}

/** The tus upload's finish response body (200). */
export interface UploadFinished { clip: ClipSummary }

/** Stable codes the upload endpoint answers with (problem+json bodies). */
export const uploadProblemCodes = [
  "too_large", "quota_exceeded", "duplicate_clip", "validation_failed", "empty_file", "not_media", "truncated_file", "audio_only",
  "no_video_stream", "image_not_video", "no_decodable_frames", "pixel_size_over_limit",
] as const satisfies readonly ProblemCode[];
