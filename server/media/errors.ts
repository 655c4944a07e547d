// Two kinds of media failure, kept apart because the job queue treats them differently:
// MediaInputError is the uploaded file's fault (answer 422, never retry); FfmpegError is a run
// of ffmpeg/ffprobe that failed, and says itself whether trying again can help.

import { MEDIA_INPUT_CODES, type MediaInputCode } from "../../shared/schemas/problem-codes";

/** Stable codes for unusable uploads: part of the API's one list (shared/schemas/problem-codes.ts). */
export const mediaInputCodes = MEDIA_INPUT_CODES;
export type { MediaInputCode };

export class MediaInputError extends Error {
  readonly retryable = false;
  constructor(
    readonly code: MediaInputCode,
    message: string,
    readonly details: Record<string, unknown> = {},
  ) {
    super(message);
    this.name = "MediaInputError";
  }
}

/**
 * - invalid_data: ffmpeg read the input and found it unusable; the same input fails the same way.
 * - timeout / stalled: killed by the time limit or the progress watchdog.
 * - crashed: ended by a signal nobody here sent (segfault, out-of-memory killer).
 * - aborted: the caller's AbortSignal fired (clip deleted, job cancelled).
 * - disk_full: no space to write output.
 * - spawn_failed: the binary could not be started (path, permissions).
 * - failed: any other non-zero exit.
 */
export type FfmpegFailureKind =
  | "invalid_data"
  | "timeout"
  | "stalled"
  | "crashed"
  | "aborted"
  | "disk_full"
  | "spawn_failed"
  | "failed";

const notRetryable: ReadonlySet<FfmpegFailureKind> = new Set(["invalid_data", "aborted"]);

export class FfmpegError extends Error {
  readonly retryable: boolean;
  constructor(
    readonly kind: FfmpegFailureKind,
    message: string,
    readonly info: {
      command: string;
      exitCode?: number;
      signal?: string;
      stderrTail: string;
      durationMs: number;
    },
  ) {
    super(message);
    this.name = "FfmpegError";
    this.retryable = !notRetryable.has(kind);
  }
}

/** Whether a job that failed with `err` should be tried again (unknown errors: yes, attempts are bounded). */
export function isRetryable(err: unknown): boolean {
  if (err && typeof err === "object" && "retryable" in err && typeof err.retryable === "boolean") {
    return err.retryable;
  }
  return true;
}
