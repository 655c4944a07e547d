import { isProblemCode, type ProblemCode } from "@shared/schemas/problem-codes";
import * as tus from "tus-js-client";
import { env } from "@/lib/env";
import type { FieldProblem } from "@/lib/api";
import type { ClipMeta, ClipSummary, UploadFinished } from "@shared/schemas/clips";

// One resumable upload (tus) of a clip file. tus-js-client remembers each upload's URL in
// localStorage under a fingerprint of the file (name, type, size, date), so choosing the same
// file after a page reload continues where it stopped; a dropped connection is retried with
// growing pauses and can be resumed by hand after that.

export const UPLOAD_ENDPOINT = `${env.apiBase}/uploads`;
const CHUNK_BYTES = 32 * 1024 * 1024;

export type UploadProblemKind = "network" | "too_large" | "quota" | "duplicate" | "invalid_file" | "invalid_details" | "signed_out" | "not_allowed" | "server";

export interface UploadProblem {
  kind: UploadProblemKind;
  code: string;
  message: string;
  fields: FieldProblem[];
  existingClipId?: string;
}

const invalidFileCodes = new Set(["empty_file", "not_media", "truncated_file", "audio_only", "no_video_stream", "image_not_video", "no_decodable_frames", "pixel_size_over_limit"]);

function parseBody(res: tus.HttpResponse | null | undefined): Record<string, unknown> | null {
  try {
    const body = res?.getBody();
    return body ? (JSON.parse(body) as Record<string, unknown>) : null;
  } catch {
    return null;
  }
}

/** A failure as a person needs it: lost connection, too large, over quota, duplicate, bad file … */
export function classifyUploadError(err: unknown): UploadProblem {
  const res = (err as tus.DetailedError | undefined)?.originalResponse;
  if (!res) {
    return {
      kind: "network", code: "network_aborted", fields: [],
      message: "Network aborted: the connection dropped and did not come back. What was sent is kept — press Resume to continue from there.",
    };
  }
  const status = res.getStatus();
  const body = parseBody(res);
  const code = typeof body?.code === "string" ? body.code : `http_${status}`;
  // Compared against the API's one list of codes, so a renamed code fails the type check here.
  const named: ProblemCode | null = isProblemCode(code) ? code : null;
  const message = typeof body?.detail === "string" ? body.detail : "";
  const fields = Array.isArray(body?.errors) ? (body.errors as FieldProblem[]) : [];
  const p = (kind: UploadProblemKind, fallback: string): UploadProblem => ({ kind, code, message: message || fallback, fields });
  if (named === "quota_exceeded") return p("quota", "The club's plan has no storage left for this file.");
  if (named === "read_only_unpaid") return p("not_allowed", "The club is read-only until its overdue payment is made.");
  if (named === "too_large" || status === 413) return { ...p("too_large", "The file is too large to upload."), code: "too_large" };
  if (named === "duplicate_clip") return { ...p("duplicate", "This file is already in the team."), existingClipId: body?.existingClipId as string | undefined };
  // An image sequence without its capture rate: shown at the rate field.
  if (named === "sequence_rate_missing" && fields.length) return p("invalid_details", "Type the capture rate of this sequence.");
  if (invalidFileCodes.has(code) || code.startsWith("sequence_")) return p("invalid_file", "This file cannot be used as a clip.");
  if (named === "validation_failed") return p("invalid_details", "Some of the clip's details are not valid.");
  if (status === 401) return p("signed_out", "Your session has ended. Sign in again, then choose the file again to continue.");
  if (status === 403 || status === 404) return p("not_allowed", "You cannot upload clips to this team.");
  return p("server", "The server could not take the upload. Try again in a moment.");
}

/** Retry what a retry can fix: no response at all, server errors, a lock still held after a cut. */
function shouldRetry(err: tus.DetailedError): boolean {
  const res = err.originalResponse;
  if (!res) return true;
  const status = res.getStatus();
  if (parseBody(res)?.code && status < 500) return false;
  return status >= 500 || status === 423 || status === 409;
}

export interface UploadCallbacks {
  onProgress: (sent: number, total: number) => void;
  /** The connection failed; the next attempt is on its way. */
  onRetrying: (attempt: number) => void;
  onSuccess: (clip: ClipSummary) => void;
  onError: (p: UploadProblem) => void;
}

export interface ClipUpload {
  /** Continue a previous upload of this file if one is remembered, else start fresh. */
  start: () => Promise<{ resumed: boolean }>;
  /** Stop sending; the part already sent stays on the server. */
  pause: () => Promise<void>;
  /** Stop and forget: the server throws the partial upload away. */
  cancel: () => Promise<void>;
}

export function createClipUpload(file: File, teamId: string, meta: ClipMeta, cb: UploadCallbacks): ClipUpload {
  const upload = new tus.Upload(file, {
    endpoint: UPLOAD_ENDPOINT,
    chunkSize: CHUNK_BYTES,
    retryDelays: [0, 1000, 3000, 5000, 10_000, 20_000, 30_000],
    removeFingerprintOnSuccess: true,
    metadata: { teamId, filename: file.name, filetype: file.type, meta: JSON.stringify(meta) },
    onProgress: cb.onProgress,
    onShouldRetry: (err, attempt) => {
      const retry = shouldRetry(err);
      if (retry) cb.onRetrying(attempt + 1);
      return retry;
    },
    onSuccess: ({ lastResponse }) => {
      const body = parseBody(lastResponse) as UploadFinished | null;
      if (body?.clip) cb.onSuccess(body.clip);
      else cb.onError({ kind: "server", code: "no_clip", message: "The upload finished but the server did not describe the clip. Reload the page to see it.", fields: [] });
    },
    onError: (err) => {
      const problem = classifyUploadError(err);
      // Only a lost connection or an ended session can be resumed; forget the rest, or the
      // "unfinished uploads" list would offer a file the server has already thrown away.
      if (problem.kind !== "network" && problem.kind !== "signed_out") void forget(upload);
      cb.onError(problem);
    },
  });
  return {
    start: async () => {
      const previous = (await upload.findPreviousUploads()).filter((p) => p.metadata?.teamId === teamId);
      if (previous[0]) upload.resumeFromPreviousUpload(previous[0]);
      upload.start();
      return { resumed: !!previous[0] };
    },
    pause: () => upload.abort(false),
    cancel: () => upload.abort(true),
  };
}

async function forget(upload: tus.Upload) {
  const storage = tus.defaultOptions.urlStorage;
  const fingerprint = await (upload.options.fingerprint ?? tus.defaultOptions.fingerprint)(upload.file as File, upload.options);
  for (const u of await storage.findUploadsByFingerprint(fingerprint)) await storage.removeUpload(u.urlStorageKey);
}

export interface UnfinishedUpload {
  key: string;
  fileName: string;
  size: number | null;
  startedAt: string;
  title: string;
  url: string | null;
}

/** Uploads this browser started in the team and did not finish (they survive a reload). */
export async function unfinishedUploads(teamId: string): Promise<UnfinishedUpload[]> {
  if (!tus.canStoreURLs) return [];
  const all = await tus.defaultOptions.urlStorage.findAllUploads();
  return all
    .filter((u) => u.metadata?.teamId === teamId)
    .map((u) => {
      let title = "";
      try {
        title = (JSON.parse(u.metadata.meta ?? "{}") as { title?: string }).title ?? "";
      } catch {
        // details unreadable: the file name is enough
      }
      return { key: u.urlStorageKey, fileName: u.metadata.filename ?? "clip", size: u.size, startedAt: u.creationTime, title, url: u.uploadUrl };
    });
}

/** The clip details a remembered upload of this file was started with, to resume without retyping. */
export async function rememberedMeta(file: File, teamId: string): Promise<ClipMeta | null> {
  const probe = new tus.Upload(file, { endpoint: UPLOAD_ENDPOINT });
  const [prev] = (await probe.findPreviousUploads()).filter((p) => p.metadata?.teamId === teamId);
  if (!prev?.metadata?.meta) return null;
  try {
    return JSON.parse(prev.metadata.meta) as ClipMeta;
  } catch {
    return null;
  }
}

export async function discardUnfinished(u: UnfinishedUpload) {
  if (u.url) await tus.Upload.terminate(u.url, { retryDelays: [] }).catch(() => undefined);
  await tus.defaultOptions.urlStorage.removeUpload(u.key);
}
