// A finished upload becomes a clip: checksum, probe, duplicate check, then (only then) the
// original is stored under the clip's id and the row is written. Every rejection leaves nothing
// behind: the caller discards the upload, and anything stored here is removed again.
import { randomUUID } from "node:crypto";
import { env } from "../env";
import { log } from "../log";
import { HttpError } from "../http/problem";
import type { ProblemCode } from "../../shared/schemas/problem-codes";
import { MediaInputError } from "../media/errors";
import { probe, withoutPlaceTags, type ProbeResult } from "../media/probe";
import { hasPlaceTags, stripMetadata } from "../media/remux";
import { clipKeys, displayFileName, sha256File } from "../storage";
import { PLAYBACK_RATE_MAX_FPS, type ClipMeta, type ClipTiming } from "../../shared/schemas/clips";
import { sendExtract } from "../jobs/clip-queue";
import { withJobDir } from "../media/ffmpeg";
import { looksLikeZip } from "./sequence/archive";
import { sequenceZipToVideo, type SequenceFacts } from "./sequence/to-video";
import { mediaConfig, storage } from "./deps";
import * as memberRepo from "../entities/member/repository";
import * as repo from "../entities/clip/repository";
import { stickInTeam } from "../entities/stick/repository";

/** A problem with extra members in its body (e.g. the existing clip of a duplicate). */
export class ClipProblem extends HttpError {
  constructor(status: number, code: ProblemCode, message: string, extra: Record<string, unknown> = {}) {
    super(status, code, message, undefined, extra);
  }
}

const fieldProblem = (path: string, message: string) => new HttpError(422, "validation_failed", `${path}: ${message}`, [{ path, message }]);

/** The form's references must be of this team; checked before any byte arrives and again at the end. */
export async function checkMetaRefs(teamId: string, m: Pick<ClipMeta, "playerId" | "sessionId" | "stickId">) {
  if (!(await memberRepo.isPlayerOf(teamId, m.playerId))) throw fieldProblem("playerId", "Pick a player of this team");
  if (m.sessionId && !(await repo.sessionInTeam(teamId, m.sessionId))) throw fieldProblem("sessionId", "That session is not in this team");
  if (m.stickId && !(await stickInTeam(teamId, m.stickId))) throw fieldProblem("stickId", "That stick is not in this team");
}

/** What the probe says about the file's rates. */
export interface RateFacts {
  storedFps: number;
  /** A capture rate the phone wrote into the file. */
  taggedCaptureFps?: number | null;
  /** "uneven": the stored rate is only the typical spacing of uneven times. */
  clock?: ClipTiming["clock"];
}

/**
 * The capture rate to keep: the person's, else the phone's tag, else the stored rate. A stored
 * rate above the playback range on a regular clock is believable as it stands; the typical rate
 * of an uneven clock, a rate below it, or a tag that differs from it waits for the person.
 */
export function decideCaptureRate(meta: { captureFps?: number; captureFpsConfirmed: boolean }, f: RateFacts) {
  const captureFps = meta.captureFps ?? f.taggedCaptureFps ?? (f.storedFps > 0 ? f.storedFps : 30);
  const believable = f.storedFps > PLAYBACK_RATE_MAX_FPS && f.clock !== "uneven" && Math.abs(captureFps - f.storedFps) < 0.01;
  return { captureFps, captureFpsConfirmed: meta.captureFps !== undefined && meta.captureFpsConfirmed ? true : believable };
}

/** Caps on an uploaded sequence's archive besides its unpacked size (2 × MAX_UPLOAD_BYTES). */
const SEQUENCE_LIMITS = { maxEntries: 100_000 };

const stripExtension = (name: string) => name.replace(/\.[A-Za-z0-9]{1,5}$/, "");

export interface IngestRequest {
  teamId: string;
  userId: string;
  /** The complete upload on local disk; moved into storage on success. */
  file: string;
  /** As the client named it: shown, never used as a key. */
  originalName: string;
  meta: ClipMeta;
  reqId?: string;
  /** false: queue no job (the seed extracts in-process). */
  enqueue?: boolean;
}

export async function probeUpload(file: string): Promise<ProbeResult> {
  try {
    return await probe(mediaConfig(), file, { maxPixels: env().MAX_PIXELS });
  } catch (err) {
    if (err instanceof MediaInputError) throw new ClipProblem(422, err.code, err.message, err.details);
    throw err;
  }
}

export async function ingestUpload(r: IngestRequest): Promise<repo.ClipRow> {
  await checkMetaRefs(r.teamId, r.meta);
  const { sha256 } = await sha256File(r.file);
  if (await looksLikeZip(r.file)) return ingestSequence(r, sha256);
  let facts = await probeUpload(r.file);
  await rejectDuplicate(r.teamId, sha256);
  // The original is served as stored: a place in its tags goes before it is stored. The checksum
  // stays the uploaded file's, so the same upload is still recognised as a duplicate.
  if (hasPlaceTags(facts.raw)) {
    await stripMetadata(mediaConfig(), r.file, facts.raw);
    facts = { ...(await probeUpload(r.file)), taggedCaptureFps: facts.taggedCaptureFps };
  }
  return storeClip(r, r.file, sha256, facts, {
    ...decideCaptureRate(r.meta, { storedFps: facts.storedFps, taggedCaptureFps: facts.taggedCaptureFps, clock: facts.timing.clock }),
    durationS: facts.durationS,
  });
}

/** A sequence's capture rate, which the person must type (checked at the start of the upload too). */
export function requireSequenceRate(meta: Pick<ClipMeta, "captureFps">): number {
  if (meta.captureFps !== undefined) return meta.captureFps;
  const message = "Type the rate the camera recorded at: numbered frames carry no rate of their own.";
  throw new ClipProblem(422, "sequence_rate_missing", `This is a ZIP of frames (an image sequence). ${message}`, { errors: [{ path: "captureFps", message }] });
}

/**
 * A ZIP of numbered frames (decision 134): the typed capture rate is required (images carry
 * none); the frames are checked and copied into one video file, which is stored as the clip's
 * original. Any refusal names the file at fault, and nothing is stored.
 */
async function ingestSequence(r: IngestRequest, sha256: string): Promise<repo.ClipRow> {
  const captureFps = requireSequenceRate(r.meta);
  await rejectDuplicate(r.teamId, sha256);
  const media = mediaConfig();
  const e = env();
  return withJobDir({ tmpRoot: media.tmpRoot }, "sequence", async (dir) => {
    let video: Awaited<ReturnType<typeof sequenceZipToVideo>>;
    try {
      video = await sequenceZipToVideo(media, r.file, dir, { ...SEQUENCE_LIMITS, maxUnpackedBytes: 2 * e.MAX_UPLOAD_BYTES, maxPixels: e.MAX_PIXELS });
    } catch (err) {
      if (err instanceof MediaInputError) throw new ClipProblem(422, err.code, err.message, err.details);
      throw err;
    }
    const facts = await probeUpload(video.file);
    if (facts.frameCount !== video.facts.frames) throw new Error(`sequence of ${video.facts.frames} frames became a video of ${facts.frameCount}`);
    // A PNG's sBIT tells 12-bit data in 16-bit samples where the decoder does not (decision 138).
    const bitsPerSample = video.facts.significantBits ?? facts.bitsPerSample;
    return storeClip(r, video.file, sha256, { ...facts, bitsPerSample, sequence: video.facts }, { captureFps, captureFpsConfirmed: true, durationS: facts.frameCount / captureFps });
  });
}

/** The probe facts kept with the clip: no place tags, and not the packet times (the frames' own times are stored apart). */
function probeToKeep({ packetTimes: _times, ...facts }: ProbeResult & { sequence?: SequenceFacts }) {
  return { ...facts, raw: withoutPlaceTags(facts.raw) };
}

/** Store the checked file as the clip's original and write the row (the file is moved). */
async function storeClip(
  r: IngestRequest,
  file: string,
  sha256: string,
  facts: ProbeResult & { sequence?: SequenceFacts },
  rate: { captureFps: number; captureFpsConfirmed: boolean; durationS: number | null },
): Promise<repo.ClipRow> {
  const sessionId = r.meta.sessionId ?? (r.meta.newSession ? await repo.findOrCreateSession(r.teamId, r.meta.newSession) : null);
  const name = displayFileName(r.originalName);
  const id = randomUUID();
  const st = storage();
  await st.putFile(clipKeys.original(id), file, { move: true });
  let row: repo.ClipRow | null;
  try {
    row = await repo.insertClip({
      id,
      teamId: r.teamId,
      sessionId,
      playerId: r.meta.playerId,
      stickId: r.meta.stickId ?? null,
      uploadedBy: r.userId,
      title: r.meta.title || stripExtension(name),
      shotType: r.meta.shotType,
      cameraView: r.meta.cameraView,
      captureFps: rate.captureFps,
      captureFpsConfirmed: rate.captureFpsConfirmed,
      storedFps: facts.storedFps || null,
      exposureUs: r.meta.exposureUs ?? null,
      notes: r.meta.notes,
      status: "extracting",
      frameCount: facts.frameCount,
      width: facts.width,
      height: facts.height,
      durationS: rate.durationS,
      rotationDeg: facts.rotationDeg,
      variableFrameRate: facts.variableFrameRate,
      timing: facts.timing,
      codec: facts.codec,
      probe: probeToKeep(facts),
      frameFormat: env().FRAME_FORMAT,
      sha256,
      sizeBytes: facts.sizeBytes,
      originalName: name,
    });
  } catch (err) {
    await st.deletePrefix(clipKeys.prefix(id));
    throw err;
  }
  if (!row) {
    // Same file finished at the same moment in another upload: the unique index kept one.
    await st.deletePrefix(clipKeys.prefix(id));
    await rejectDuplicate(r.teamId, sha256);
    throw new ClipProblem(409, "duplicate_clip", "This file was just uploaded to this team by another upload.");
  }
  if (r.enqueue !== false) {
    // The row says "extracting" either way; if the queue is down the sweep queues it later.
    const clipId = row.id;
    await sendExtract(clipId, r.reqId).catch((err) => log.error({ err, clipId }, "could not queue frame extraction"));
  }
  return row;
}

async function rejectDuplicate(teamId: string, sha256: string) {
  const dup = await repo.clipBySha(teamId, sha256);
  if (!dup) return;
  const label = dup.title || dup.originalName;
  throw new ClipProblem(
    409,
    "duplicate_clip",
    `This file is already in the team as "${label}" (uploaded ${dup.createdAt.toISOString().slice(0, 10)}). Nothing new was stored.`,
    { existingClipId: dup.id, existingClipTitle: label },
  );
}
