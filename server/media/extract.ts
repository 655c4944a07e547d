// Frame extraction: every decoded frame written once, as an image named by its index, plus a
// preview strip, in one ffmpeg run. Frames are announced as soon as their file is complete
// (ffmpeg writes each to a temp name and renames it), so marking can start before the end.
import { existsSync, watch, type FSWatcher } from "node:fs";
import { mkdir, readdir } from "node:fs/promises";
import path from "node:path";
import { buildFfmpegArgs, buildFfprobeArgs, type FfmpegSpec } from "./command";
import { FfmpegError } from "./errors";
import { runTool, type MediaConfig } from "./ffmpeg";
import type { ProbeResult } from "./probe";
import { percentOf } from "./progress";
import { analyseTiming } from "./timing";
import { frameTimesFromDecodedCsv, frameTimesFromPackets, parsePacketCsv, parseTimeBase } from "./timestamps";
import type { ClipTiming } from "../../shared/schemas/clips";

export type FrameFormat = "jpg" | "webp";

export interface StripOptions {
  /** Thumbnails in the strip. Default 20. */
  count?: number;
  /** Thumbnail height in pixels. Default 90. */
  height?: number;
}

export type ExtractProbe = Pick<ProbeResult, "frameCount" | "videoStreamIndex" | "pixelFormat" | "colorRange" | "timeBase"> &
  Partial<Pick<ProbeResult, "storedFps" | "expectedFrames" | "colorTransfer" | "colorSpace" | "interlaced" | "pixelAspect" | "storedHeight" | "bitsPerSample">>;

/**
 * 12-bit (or 10-, 14-bit) data in a 16-bit format, when the file says so: every sample scaled up to
 * the full 16 bits, so the 8-bit frames get its levels rather than only its dark high byte
 * (decision 138). Null for anything else.
 */
export function fullBitDepth(p: { pixelFormat?: string | null; bitsPerSample?: number | null }): string | null {
  const bits = p.bitsPerSample ?? 16;
  if (!/(16|48|64)(le|be)$/.test(p.pixelFormat ?? "") || bits <= 8 || bits >= 16) return null;
  const f = p.pixelFormat ?? "";
  // Pinned to a 16-bit format the lut takes as it is, else ffmpeg would hand it 8-bit samples.
  const wide = /^gray/.test(f) ? "gray16le" : /^(ya|rgba|bgra|yuva|gbrap)/.test(f) ? "rgba64le" : /^yuv/.test(f) ? "yuv444p16le" : "rgb48le";
  const up = `min(val*${2 ** (16 - bits)}\\,maxval)`;
  return `format=${wide},lut=c0=${up}:c1=${up}:c2=${up}:c3=${up}`;
}

export interface ExtractProgress {
  framesDone: number;
  totalFrames: number;
  percent: number;
}

export interface ExtractOptions {
  input: string;
  probe: ExtractProbe;
  /** Folder the caller owns (a job folder); frames go to <outDir>/frames, the strip to <outDir>/strip.jpg. */
  outDir: string;
  format?: FrameFormat;
  /** 1 (best) … 31 (smallest), ffmpeg's qscale as in FRAME_QUALITY. Default 3. */
  quality?: number;
  /** false: no strip. */
  strip?: StripOptions | false;
  /** Default 2 min + 100 ms per frame. */
  timeoutMs?: number;
  /** No progress for this long kills the run. Default 30 s. */
  stallTimeoutMs?: number;
  signal?: AbortSignal;
  onProgress?: (p: ExtractProgress) => void;
  /** Called in index order once frame `index` (1-based) is complete on disk; awaited before the next. */
  onFrameReady?: (index: number, file: string) => void | Promise<void>;
}

export interface ExtractResult {
  frameCount: number;
  /** Seconds from the first frame, index 0 = frame 1, on the frame grid where the clock allows. */
  frameTimes: number[];
  /** The frame clock of the frames written: gaps, repeats, frames the header promised that did not decode. */
  timing: ClipTiming;
  timestampSource: "packets" | "decoded-frames";
  framesDir: string;
  stripPath: string | null;
  format: FrameFormat;
  elapsedMs: number;
  /** From the call to frame 1 being ready. */
  firstFrameMs: number | null;
}

/** 1 → "000001.jpg"; indexes past 999999 simply get more digits (as ffmpeg's %06d does). */
export const frameFileName = (index: number, ext: FrameFormat) => `${String(index).padStart(6, "0")}.${ext}`;

// mjpeg wants full-range YUV; letting swscale convert limited → full range costs more than the
// JPEG encoding itself. A lookup table does the same mapping (±1 level, see decision 040) cheaply.
const toFullRange =
  "lutyuv=y='clip(round((val-16)*255/219),0,255)':u='clip(round((val-128)*255/224+128),0,255)':v='clip(round((val-128)*255/224+128),0,255)',setparams=range=pc";
const lutFormats = new Set(["yuv420p", "yuv422p", "yuv444p"]);

// JPEG decoders read YCbCr with the BT.601 matrix; HD video uses BT.709's. Untagged video of
// 720 lines or more is taken as BT.709 (common practice, no source). The colorspace filter does
// matrix and range in one 8-bit pass (0.41 s user for 300 frames of 720p here, the table 0.50 s).
const bt709ToJpeg =
  "colorspace=ispace=bt709:iprimaries=bt709:itrc=bt709:irange=tv:space=bt470bg:primaries=bt709:trc=bt709:range=pc";
const isBt709 = (p: ExtractProbe) => p.colorSpace === "bt709" || ((!p.colorSpace || p.colorSpace === "unknown") && (p.storedHeight ?? 0) >= 720);

// HLG and PQ (BT.2100, phones' default video on many models) to BT.709 SDR: linear light with
// 100 cd/m² as 1.0, Möbius curve (linear up to 0.8, then a roll-off so highlights keep detail),
// back to BT.709 gamma in JPEG's full-range BT.601 YCbCr. Reference white comes out at 244/255
// for HLG and 239/255 for PQ with Debian's ffmpeg 5.1.9 (244 for both before it;
// tests/api/clips-pictures.test.ts); without this it was 130–161.
const hdrTransfers = new Set(["arib-std-b67", "smpte2084"]);
export const isHdr = (transfer: string | null | undefined) => hdrTransfers.has(transfer ?? "");
export const hdrToSdr =
  "zscale=t=linear:npl=100:p=709,format=gbrpf32le,tonemap=tonemap=mobius:param=0.8:desat=0,zscale=t=709:m=470bg:r=full,format=yuv420p";

// Both fields of every frame, each its own picture (bwdif, ffmpeg's motion-adaptive deinterlacer).
export const deinterlace = "bwdif=mode=send_field:parity=auto:deint=all";
// Non-square pixels widened to square (the frame's own sample aspect ratio, even width).
export const squarePixels = "scale='trunc(iw*sar/2+0.5)*2':ih,setsar=1";

/** libwebp quality 0–100 from the same 1–31 scale (3 → 96, 31 → 40). */
export const webpQuality = (q: number) => Math.round(100 - (Math.min(31, Math.max(1, q)) - 1) * 2);

export interface ExtractSpecInput {
  input: string;
  probe: ExtractProbe;
  framesDir: string;
  stripPath: string | null;
  format: FrameFormat;
  quality: number;
  strip: Required<StripOptions>;
}

export function buildExtractSpec(s: ExtractSpecInput): FfmpegSpec {
  // Images are named by index, so their timestamps only need to rise: numbering them 0, 1, 2 … µs
  // (and encoding on a µs clock) keeps the encoder from refusing repeated times (Matroska at
  // > 1,000 fps, damaged files).
  const chain: string[] = ["settb=1/1000000", "setpts=N"];
  // One picture per field, before anything renumbers the frames (bwdif times the fields).
  if (s.probe.interlaced) chain.unshift(deinterlace);
  const levels = fullBitDepth(s.probe);
  if (levels) chain.push(levels);
  if (isHdr(s.probe.colorTransfer)) chain.push(hdrToSdr);
  else if (s.format === "jpg" && lutFormats.has(s.probe.pixelFormat ?? "") && s.probe.colorRange !== "pc")
    chain.push(isBt709(s.probe) ? bt709ToJpeg : toFullRange);
  if (s.probe.pixelAspect && Math.abs(s.probe.pixelAspect - 1) > 1e-6) chain.push(squarePixels);
  const encoder =
    s.format === "jpg"
      ? ["-c:v", "mjpeg", "-q:v", String(s.quality), ...(s.quality < 2 ? ["-qmin", "1"] : [])]
      : ["-c:v", "libwebp", "-quality", String(webpQuality(s.quality)), "-compression_level", "0"];
  // passthrough: one image per decoded frame; image2 otherwise duplicates/drops to a constant rate.
  const frameOut = ["-fps_mode", "passthrough", "-enc_time_base", "1/1000000", ...encoder, "-f", "image2", "-atomic_writing", "1", "-start_number", "1"];
  const src = `[0:${s.probe.videoStreamIndex}]`;
  const framesPattern = path.join(s.framesDir, `%06d.${s.format}`);
  const inputs = [{ path: s.input }];

  if (!s.stripPath) {
    const vf = ["-vf", chain.join(",")];
    return { inputs, outputs: [{ path: framesPattern, options: ["-map", `0:${s.probe.videoStreamIndex}`, ...vf, ...frameOut] }] };
  }
  const tiles = Math.max(1, Math.min(s.strip.count, s.probe.frameCount || s.strip.count));
  const every = Math.max(1, Math.floor((s.probe.frameCount || tiles) / tiles));
  const head = `${chain.join(",")},`;
  const filterComplex =
    `${src}${head}split=2[frames][thumbs];` +
    `[thumbs]select='not(mod(n,${every}))*lt(n,${every * tiles})',scale=-2:${s.strip.height},tile=${tiles}x1[strip]`;
  return {
    inputs,
    filterComplex,
    outputs: [
      { path: framesPattern, options: ["-map", "[frames]", ...frameOut] },
      { path: s.stripPath, options: ["-map", "[strip]", "-frames:v", "1", "-c:v", "mjpeg", "-q:v", "4", "-update", "1"] },
    ],
  };
}

/** Each frame's time, or for interlaced video each field's: the frame's and half a step later. */
export function fieldTimes(frames: number[], interlaced: boolean | undefined): number[] {
  if (!interlaced || frames.length === 0) return frames;
  const out: number[] = [];
  for (let i = 0; i < frames.length; i++) {
    const step = i + 1 < frames.length ? frames[i + 1] - frames[i] : i > 0 ? frames[i] - frames[i - 1] : 0;
    out.push(frames[i], Math.round((frames[i] + step / 2) * 1e6) / 1e6);
  }
  return out;
}

export async function extractFrames(config: MediaConfig, o: ExtractOptions): Promise<ExtractResult> {
  const started = Date.now();
  const format = o.format ?? "jpg";
  const framesDir = path.join(o.outDir, "frames");
  const stripPath = o.strip === false ? null : path.join(o.outDir, "strip.jpg");
  await mkdir(framesDir, { recursive: true });
  const expected = o.probe.frameCount;
  const timeoutMs = o.timeoutMs ?? 120_000 + 100 * expected;

  // Our own abort, so a failing frame callback also stops ffmpeg.
  const inner = new AbortController();
  const onOuterAbort = () => inner.abort();
  if (o.signal?.aborted) inner.abort();
  o.signal?.addEventListener("abort", onOuterAbort, { once: true });
  let callbackError: unknown;

  let next = 1;
  let beat = () => {};
  let firstFrameMs: number | null = null;
  let scanning = false;
  let rescan = false;
  let delivery = Promise.resolve();
  const scan = async () => {
    if (scanning) {
      rescan = true;
      return;
    }
    scanning = true;
    try {
      do {
        rescan = false;
        // existsSync: a failed async access() builds an Error per call, which costs more here.
        while (existsSync(path.join(framesDir, frameFileName(next, format)))) {
          const index = next++;
          beat();
          firstFrameMs ??= Date.now() - started;
          const file = path.join(framesDir, frameFileName(index, format));
          delivery = delivery.then(async () => {
            if (callbackError) return;
            try {
              await o.onFrameReady?.(index, file);
            } catch (err) {
              callbackError = err;
              inner.abort();
            }
          });
          o.onProgress?.({ framesDone: index, totalFrames: Math.max(expected, index), percent: percentOf(index, expected, false) });
        }
      } while (rescan);
    } finally {
      scanning = false;
    }
  };

  // File events announce frames at once; the poll covers file systems without them. ffmpeg's
  // own progress cannot: with the strip as a second output it reports nothing until the end.
  let watcher: FSWatcher | undefined;
  try {
    // Only finished files: ffmpeg writes each frame as <name>.tmp and renames it when complete.
    watcher = watch(framesDir, (event, name) => {
      if (event === "rename" && !String(name ?? "").endsWith(".tmp")) void scan();
    });
  } catch {
    // polling only
  }
  const poll = setInterval(() => void scan(), 250);

  const spec = buildExtractSpec({
    input: o.input,
    probe: o.probe,
    framesDir,
    stripPath,
    format,
    quality: o.quality ?? 3,
    strip: { count: 20, height: 90, ...(o.strip || {}) },
  });
  const listEntries = (entries: string, signal?: AbortSignal) =>
    runTool(config, {
      tool: "ffprobe",
      args: buildFfprobeArgs(o.input, ["-select_streams", String(o.probe.videoStreamIndex), "-show_entries", entries, "-of", "csv=p=0"]),
      timeoutMs,
      signal,
      captureStdout: true,
    });
  const times = listEntries("packet=pts,dts,flags", inner.signal);
  times.catch(() => undefined); // awaited below; avoid an unhandled rejection while ffmpeg runs

  try {
    await runTool(config, {
      tool: "ffmpeg",
      args: buildFfmpegArgs(spec, { threads: config.threads ?? 2, progress: true }),
      timeoutMs,
      stallTimeoutMs: o.stallTimeoutMs ?? 30_000,
      heartbeat: (b) => (beat = b),
      signal: inner.signal,
      onProgress: () => void scan(),
    });
    watcher?.close();
    clearInterval(poll);
    while (scanning) await new Promise((r) => setTimeout(r, 5));
    await scan();
    await delivery;
    if (callbackError) throw callbackError;
  } catch (err) {
    watcher?.close();
    clearInterval(poll);
    inner.abort();
    await delivery;
    throw callbackError ?? err;
  } finally {
    o.signal?.removeEventListener("abort", onOuterAbort);
  }

  const frameCount = next - 1;
  const fail = (msg: string) =>
    new FfmpegError("invalid_data", msg, { command: "", stderrTail: "", durationMs: Date.now() - started });
  if (frameCount === 0) throw fail("ffmpeg wrote no frames: the video stream could not be decoded");
  // Frames up to frameCount may already have been moved away by onFrameReady; none may lie beyond.
  const beyond = (await readdir(framesDir)).filter((n) => Number.parseInt(n, 10) > frameCount);
  if (beyond.length) throw fail(`frame files are not numbered 1..${frameCount} without gaps (found ${beyond[0]})`);

  let frameTimes = fieldTimes(frameTimesFromPackets(parsePacketCsv((await times).stdout), o.probe.timeBase), o.probe.interlaced);
  let timestampSource: ExtractResult["timestampSource"] = "packets";
  if (frameTimes.length !== frameCount) {
    const decoded = await listEntries("frame=best_effort_timestamp_time", o.signal);
    frameTimes = fieldTimes(frameTimesFromDecodedCsv(decoded.stdout), o.probe.interlaced);
    timestampSource = "decoded-frames";
    if (frameTimes.length !== frameCount) {
      throw fail(`${frameTimes.length} frame timestamps were found for ${frameCount} frames written`);
    }
  }

  const snapped = analyseTiming(frameTimes, parseTimeBase(o.probe.timeBase), [o.probe.storedFps]);
  const timing = snapped.timing;
  const promised = Math.max(o.probe.expectedFrames ?? 0, o.probe.frameCount);
  // Frames the header promised beyond the last one decoded (gaps inside are listed as gaps).
  const reached = Math.round((snapped.times[frameCount - 1] ?? 0) * timing.nominalFps) + 1;
  if (promised - reached > Math.max(1, 0.01 * promised)) timing.missingTail = { from: reached + 1, to: promised };
  o.onProgress?.({ framesDone: frameCount, totalFrames: frameCount, percent: 100 });
  return {
    frameCount,
    frameTimes: snapped.times,
    timing,
    timestampSource,
    framesDir,
    stripPath: stripPath && existsSync(stripPath) ? stripPath : null,
    format,
    elapsedMs: Date.now() - started,
    firstFrameMs,
  };
}
