// What the frame-extraction job calls: extract a stored clip's frames in a job folder and move
// each one into storage as soon as it is complete, so the first frames can be opened while
// ffmpeg is still working. Frames are keyed by index, so a retry overwrites instead of adding.
import { createWriteStream } from "node:fs";
import path from "node:path";
import { pipeline } from "node:stream/promises";
import { clipKeys, frameIndexOf, LocalDiskStorage, StorageError, type Storage } from "../storage";
import { FfmpegError } from "./errors";
import { extractFrames, type ExtractOptions, type ExtractProgress, type FrameFormat } from "./extract";
import { withJobDir, type MediaConfig } from "./ffmpeg";
import type { ClipTiming } from "../../shared/schemas/clips";

export interface ExtractClipOptions
  extends Pick<ExtractOptions, "probe" | "format" | "quality" | "strip" | "timeoutMs" | "stallTimeoutMs" | "signal"> {
  clipId: string;
  /** Frames stored without a gap from frame 1 (frames 1..framesDone can be served). */
  onProgress?: (p: ExtractProgress) => void;
  /** Least time between two onProgress calls; the last one always comes. Default 250 ms. */
  progressIntervalMs?: number;
  /** Frames put to storage at the same time. Default 4 on local disk (renames), 8 otherwise. */
  uploadConcurrency?: number;
}

export interface ExtractClipResult {
  frameCount: number;
  frameTimes: number[];
  timing: ClipTiming;
  timestampSource: "packets" | "decoded-frames";
  format: FrameFormat;
  stripKey: string | null;
  /** Frame keys left by an earlier attempt beyond this frame count, now deleted. */
  staleFramesRemoved: number;
  /** From the call to frame 1 being in storage (viewable). */
  firstFrameMs: number | null;
  /** Until ffmpeg and the timestamp listing were done. */
  extractMs: number;
  /** Until every frame and the strip were stored. */
  elapsedMs: number;
}

const contentTypes: Record<FrameFormat, string> = { jpg: "image/jpeg", webp: "image/webp" };

/**
 * Where extraction jobs put their temp folders: the configured tmpRoot, else, on local disk, a
 * folder inside the storage root, so each frame moves into place by a rename instead of a copy
 * across file systems. Sweep stale job folders (sweepStaleJobDirs) in this same place.
 */
export function jobTmpRoot(media: MediaConfig, storage: Storage): string | undefined {
  if (media.tmpRoot) return media.tmpRoot;
  return storage instanceof LocalDiskStorage ? path.join(storage.root, ".jobs") : undefined;
}

export async function extractClipFrames(
  deps: { media: MediaConfig; storage: Storage },
  o: ExtractClipOptions,
): Promise<ExtractClipResult> {
  const { storage } = deps;
  const started = Date.now();
  const format = o.format ?? "jpg";
  const originalKey = clipKeys.original(o.clipId);
  if (!(await storage.exists(originalKey))) {
    throw new StorageError("not_found", `Clip ${o.clipId} has no stored original`, { key: originalKey });
  }

  return withJobDir({ tmpRoot: jobTmpRoot(deps.media, storage) }, `extract-${o.clipId}`, async (dir) => {
    let input = storage.localPath(originalKey);
    if (!input) {
      input = path.join(dir, "original");
      await pipeline((await storage.get(originalKey)).body, createWriteStream(input));
    }

    const interval = o.progressIntervalMs ?? 250;
    let lastEmit = 0;
    const emit = (p: ExtractProgress, force = false) => {
      const now = Date.now();
      if (!o.onProgress || (!force && now - lastEmit < interval)) return;
      lastEmit = now;
      o.onProgress(p);
    };

    // Puts run a few at a time; progress counts only frames stored without a gap from frame 1.
    const concurrency = o.uploadConcurrency ?? (storage.kind === "local" ? 4 : 8);
    const inflight = new Set<Promise<void>>();
    const stored = new Set<number>();
    let contiguous = 0;
    let firstFrameMs: number | null = null;
    let putError: unknown;
    const drain = () => Promise.allSettled([...inflight]);
    // Stop storing as soon as the job is cancelled (clip deleted), also when ffmpeg has finished.
    const checkAbort = () => {
      if (o.signal?.aborted) {
        throw new FfmpegError("aborted", "frame extraction was cancelled", { command: "", stderrTail: "", durationMs: Date.now() - started });
      }
    };

    try {
      const result = await extractFrames(deps.media, {
        input,
        probe: o.probe,
        outDir: path.join(dir, "out"),
        format,
        quality: o.quality,
        strip: o.strip,
        timeoutMs: o.timeoutMs,
        stallTimeoutMs: o.stallTimeoutMs,
        signal: o.signal,
        onFrameReady: async (index, file) => {
          while (inflight.size >= concurrency) await Promise.race(inflight);
          if (putError) throw putError;
          checkAbort();
          const put = storage
            .putFile(clipKeys.frame(o.clipId, index, format), file, { move: true, contentType: contentTypes[format] })
            .then(() => {
              stored.add(index);
              while (stored.delete(contiguous + 1)) contiguous++;
              if (contiguous > 0) firstFrameMs ??= Date.now() - started;
              emit({ framesDone: contiguous, totalFrames: Math.max(o.probe.frameCount, contiguous), percent: Math.min(99, Math.floor((contiguous / Math.max(1, o.probe.frameCount)) * 100)) });
            })
            .catch((err) => {
              putError ??= err;
            })
            .finally(() => inflight.delete(put));
          inflight.add(put);
        },
      });
      await drain();
      if (putError) throw putError;
      checkAbort();

      let stripKey: string | null = null;
      if (result.stripPath) {
        stripKey = clipKeys.strip(o.clipId);
        await storage.putFile(stripKey, result.stripPath, { move: true, contentType: "image/jpeg" });
      }

      const stale = (await storage.list(clipKeys.framesPrefix(o.clipId))).filter((obj) => {
        const i = frameIndexOf(obj.key);
        return i === null || i > result.frameCount || !obj.key.endsWith(`.${format}`);
      });
      for (const obj of stale) await storage.delete(obj.key);

      emit({ framesDone: result.frameCount, totalFrames: result.frameCount, percent: 100 }, true);
      return {
        frameCount: result.frameCount,
        frameTimes: result.frameTimes,
        timing: result.timing,
        timestampSource: result.timestampSource,
        format,
        stripKey,
        staleFramesRemoved: stale.length,
        firstFrameMs,
        extractMs: result.elapsedMs,
        elapsedMs: Date.now() - started,
      };
    } catch (err) {
      // Let in-flight puts land before reporting, so a delete that follows leaves no orphans.
      await drain();
      throw err;
    }
  });
}
