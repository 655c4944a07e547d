// clip.extract: every frame of a stored original into storage, with live progress on the row.
// Deterministic failures end the clip as failed (no retry); anything else is thrown so pg-boss
// retries with backoff. Frames are keyed by index, so a retry overwrites, never duplicates.
import { createWriteStream } from "node:fs";
import { link, mkdir, rename, rm } from "node:fs/promises";
import path from "node:path";
import { pipeline } from "node:stream/promises";
import sharp from "sharp";
import type pino from "pino";
import { env } from "../env";
import { extractFrames, type ExtractProbe } from "../media/extract";
import { withJobDir } from "../media/ffmpeg";
import { isRetryable } from "../media/errors";
import { clipKeys, frameIndexOf } from "../storage";
import { mediaConfig, storage } from "../clips/deps";
import { clipById, setProgress, updateClip, type ClipRow } from "../clips/repository";
import { notifyClipDone } from "../clips/notify";

/** Written beside the frames; the clips table shows it. */
export const thumbnailKey = (clipId: string) => `${clipKeys.prefix(clipId)}thumb.jpg`;
const PROGRESS_EVERY_MS = 250;

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
  // A heartbeat on the row while nothing else moves it (downloading the original), so the
  // sweep can tell a slow job from a dead worker.
  let framesDone = 0;
  const beat = setInterval(() => void setProgress(row.id, framesDone).then((alive) => alive || abort.abort()), 20_000);
  await withJobDir(mediaConfig(), `clip-${row.id}`, async (dir) => {
    const originalKey = clipKeys.original(row.id);
    let input = st.localPath(originalKey);
    if (!input) {
      input = path.join(dir, "original");
      await pipeline((await st.get(originalKey)).body, createWriteStream(input));
    }
    let lastWrite = 0;
    const result = await extractFrames(mediaConfig(), {
      input,
      probe,
      outDir: dir,
      format,
      quality: e.FRAME_QUALITY,
      signal: abort.signal,
      onFrameReady: async (index, file) => {
        if (index === 1) await st.putStream(thumbnailKey(row.id), sharp(file).resize({ width: 240 }).jpeg({ quality: 80 }), { contentType: "image/jpeg" });
        await putFrame(clipKeys.frame(row.id, index, format), file, format);
        if (index === 1) run.onFirstFrame?.();
        framesDone = index;
        const now = Date.now();
        if (index === 1 || now - lastWrite >= PROGRESS_EVERY_MS) {
          lastWrite = now;
          if (!(await setProgress(row.id, index))) throw new ClipGone();
        }
      },
    });
    if (result.stripPath) await st.putFile(clipKeys.strip(row.id), result.stripPath, { move: true, contentType: "image/jpeg" });
    // An earlier attempt on other settings may have left more frames: keep exactly 1..frameCount.
    for (const o of await st.list(clipKeys.framesPrefix(row.id))) {
      const n = frameIndexOf(o.key);
      if (n === null || n > result.frameCount || !o.key.endsWith(`.${format}`)) await st.delete(o.key);
    }
    const done = await updateClip(row.id, { frameCount: result.frameCount, framesDone: result.frameCount, frameTimes: result.frameTimes });
    if (!done) throw new ClipGone();
  }).finally(() => {
    clearInterval(beat);
    run.signal?.removeEventListener("abort", stop);
  });
}

/**
 * The media wrapper counts the frames left in its folder at the end, so frames are linked (local
 * disk: no bytes copied) or copied into storage, never moved. A link to a temp name renamed over
 * the key keeps a frame either absent or complete, also when a retry rewrites it.
 */
async function putFrame(key: string, file: string, format: "jpg" | "webp") {
  const st = storage();
  const dest = st.localPath(key);
  if (!dest) {
    await st.putFile(key, file, { contentType: format === "jpg" ? "image/jpeg" : "image/webp" });
    return;
  }
  await mkdir(path.dirname(dest), { recursive: true });
  const tmp = `${dest}.${process.pid}.link`;
  await rm(tmp, { force: true });
  await link(file, tmp);
  await rename(tmp, dest);
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
