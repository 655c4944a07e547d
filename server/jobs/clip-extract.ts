// clip.extract: every frame of a stored original into storage, with live progress on the row.
// Deterministic failures end the clip as failed (no retry); anything else is thrown so pg-boss
// retries with backoff. Frames are keyed by index, so a retry overwrites, never duplicates.
import sharp from "sharp";
import type pino from "pino";
import { env } from "../env";
import type { ExtractProbe } from "../media/extract";
import { extractClipFrames } from "../media/ingest";
import { isRetryable } from "../media/errors";
import { clipKeys } from "../storage";
import { mediaConfig, storage } from "../clips/deps";
import { clipById, setProgress, updateClip, type ClipRow } from "../entities/clip/repository";
import { notifyClipDone } from "../clips/notify";

/** Written beside the frames; the clips table shows it. */
export const thumbnailKey = (clipId: string) => `${clipKeys.prefix(clipId)}thumb.jpg`;

class ClipGone extends Error {}

export interface ExtractRun {
  log: pino.Logger;
  /** This is the last attempt pg-boss will make: a retryable error now fails the clip. */
  lastAttempt: boolean;
  signal?: AbortSignal;
  /** Called once frame 1 is viewable (benchmarks). */
  onFirstFrame?: () => void;
  /** false: no mail to the uploader (seed). */
  notify?: boolean;
}

export type ExtractOutcome = "ready" | "failed" | "skipped";

export async function extractClip(clipId: string, run: ExtractRun): Promise<ExtractOutcome> {
  const row = await clipById(clipId);
  if (!row || row.status !== "extracting") {
    run.log.info({ clipId, status: row?.status ?? "deleted" }, "clip not waiting for extraction; skipped");
    return "skipped";
  }
  try {
    await extractInto(row, run);
    return (await finishReady(row, run.notify !== false)) ? "ready" : "skipped";
  } catch (err) {
    if (err instanceof ClipGone || !(await clipById(clipId))) {
      await storage().deletePrefix(clipKeys.prefix(clipId));
      run.log.info({ clipId }, "clip deleted during extraction; its files were removed");
      return "skipped";
    }
    if (isRetryable(err) && !run.lastAttempt) {
      await updateClip(clipId, { failureReason: null });
      throw err;
    }
    const reason = (err as Error).message || "Frame extraction failed";
    run.log.warn({ clipId, err }, "clip extraction failed");
    const failed = await updateClip(clipId, { status: "failed", failureReason: isRetryable(err) ? `${reason} (gave up after several attempts)` : reason });
    if (failed && run.notify !== false) await notifyClipDone(failed);
    return "failed";
  }
}

async function extractInto(row: ClipRow, run: ExtractRun) {
  const e = env();
  const st = storage();
  const format = e.FRAME_FORMAT;
  const probe = row.probe as ExtractProbe | null;
  if (!probe) throw Object.assign(new Error("The clip has no probe facts; upload it again."), { retryable: false });
  if (!(await updateClip(row.id, { framesDone: 0, frameFormat: format, failureReason: null }))) throw new ClipGone();

  const abort = new AbortController();
  const stop = () => abort.abort();
  run.signal?.addEventListener("abort", stop, { once: true });
  // Progress goes to the row in order; a row gone (clip deleted) stops the extraction. The
  // heartbeat moves the row while nothing else does (downloading the original), so the sweep
  // can tell a slow job from a dead worker.
  let framesDone = 0;
  let writes = Promise.resolve();
  const record = () => {
    const n = framesDone;
    writes = writes.then(async () => {
      if (!(await setProgress(row.id, n))) abort.abort();
    });
  };
  const beat = setInterval(record, 20_000);
  let thumbnail: Promise<void> | undefined;
  try {
    const result = await extractClipFrames(
      { media: mediaConfig(), storage: st },
      {
        clipId: row.id,
        probe,
        format,
        quality: e.FRAME_QUALITY,
        signal: abort.signal,
        onProgress: (p) => {
          framesDone = p.framesDone;
          if (framesDone >= 1 && !thumbnail) {
            run.onFirstFrame?.();
            thumbnail = makeThumbnail(row.id, format).catch((err) => run.log.warn({ err, clipId: row.id }, "no thumbnail"));
          }
          record();
        },
      },
    );
    await thumbnail;
    await writes;
    if (!(await updateClip(row.id, { frameCount: result.frameCount, framesDone: result.frameCount, frameTimes: result.frameTimes, timing: result.timing }))) throw new ClipGone();
  } catch (err) {
    await writes.catch(() => undefined);
    if (abort.signal.aborted && !run.signal?.aborted) throw new ClipGone();
    throw err;
  } finally {
    clearInterval(beat);
    run.signal?.removeEventListener("abort", stop);
  }
}

/** A small picture of frame 1 for the clips table. */
async function makeThumbnail(clipId: string, format: "jpg" | "webp") {
  const st = storage();
  const frame = await st.get(clipKeys.frame(clipId, 1, format));
  const small = frame.body.pipe(sharp().resize({ width: 240 }).jpeg({ quality: 80 }));
  await st.putStream(thumbnailKey(clipId), small, { contentType: "image/jpeg" });
}

async function finishReady(row: ClipRow, notify: boolean): Promise<boolean> {
  const ready = await updateClip(row.id, { status: "ready", failureReason: null });
  if (!ready) {
    await storage().deletePrefix(clipKeys.prefix(row.id));
    return false;
  }
  if (notify) await notifyClipDone(ready);
  return true;
}
