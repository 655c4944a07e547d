// Raw 8-bit grey frames straight from the decoder, for the tracking job: no image files, no JPEG
// round trip. Frames are numbered as the extraction numbers them (every decoded frame, in order,
// the first is 1, the same rotation), so frame n here is the picture the analyst marked as frame n.
import { buildFfmpegArgs, type FfmpegSpec } from "./command";
import { deinterlace, fullBitDepth, squarePixels } from "./extract";
import { FfmpegError } from "./errors";
import { runTool, type MediaConfig } from "./ffmpeg";

export interface GraySpecInput {
  input: string;
  videoStreamIndex: number;
  /** First and last frame wanted, 1-based and inclusive. */
  first: number;
  last: number;
  /** The clip's probed pixel format and colour range; unknown takes the general conversion. */
  pixelFormat?: string | null;
  colorRange?: string | null;
  /** As the extraction: an interlaced clip's fields are pictures of their own, non-square pixels are widened. */
  interlaced?: boolean;
  pixelAspect?: number | null;
  /** Bits the samples carry (12-bit data in 16-bit samples is scaled up, as the extraction does). */
  bitsPerSample?: number | null;
}

// 8-bit planar YUV: its luma plane already is the grey picture, so it is taken as it is
// (extractplanes) instead of through swscale's conversion to `gray`, which for 1280×720 costs a
// third as much CPU as decoding H.264. Limited-range luma (16–235) is stretched to 0–255 by a
// lookup table with the formula swscale uses: the same bytes as `-pix_fmt gray` for every level
// (tests/unit/media/gray.test.ts compares them). The rarer subsamplings too: 4:1:1 is NTSC DV's, a
// format of older lab camcorders, whose decode costs ~17 % less ffmpeg CPU this way (decision 149).
// Anything else (RGB, more than 8 bits, a JPEG decoder's 4:1:1 and 4:4:0, which no test file here
// can hold) keeps the general conversion.
const LIMITED_LUMA_TO_FULL = "lut=c0='clip(round((val-16)*255/219),0,255)'";
const PLANAR_YUV_8BIT = /^(yuvj?(420|422|444)p|yuv(411|410|440)p)$/;
// Packed and semi-planar 8-bit YUV (uncompressed captures: UYVY/YUY2 from capture cards, NV12) are
// first laid out as planes by swscale's exact reshuffle, 30–45 % less ffmpeg CPU than its conversion
// to grey (decision 149). The full-range target is a `yuvj` format, or the reshuffle would squeeze the
// levels. Only where the bytes are the same: ffmpeg turns packed frames grey before the deinterlacer
// or the widening, both of which interpolate, so those clips keep the conversion.
const PLANAR_LAYOUT_OF: Record<string, string> = { yuyv422: "422p", uyvy422: "422p", yvyu422: "422p", nv12: "420p", nv21: "420p" };

const widened = (s: Pick<GraySpecInput, "pixelAspect">) => !!s.pixelAspect && Math.abs(s.pixelAspect - 1) > 1e-6;

/** The filters that turn the decoded picture into 8-bit grey cheaply, or none (swscale converts). */
export function lumaFilters(s: Pick<GraySpecInput, "pixelFormat" | "colorRange" | "interlaced" | "pixelAspect">): string[] {
  const f = s.pixelFormat ?? "";
  const full = f.startsWith("yuvj") || s.colorRange === "pc";
  const plane = full ? ["extractplanes=y"] : ["extractplanes=y", LIMITED_LUMA_TO_FULL];
  if (PLANAR_YUV_8BIT.test(f)) return plane;
  const layout = PLANAR_LAYOUT_OF[f];
  if (!layout || s.interlaced || widened(s)) return [];
  return [`format=${full ? "yuvj" : "yuv"}${layout}`, ...plane];
}

/** ffmpeg -i clip -map 0:v -vf trim[,luma] -fps_mode passthrough -f rawvideo -pix_fmt gray pipe:1 */
export function buildGraySpec(s: GraySpecInput): FfmpegSpec {
  // trim ends the stream after `last`, so ffmpeg stops decoding there instead of at the clip's end.
  // A rotated clip is turned before these filters (ffmpeg puts its autorotation first).
  // The extraction's geometry and levels (extract.ts), so frame n is its frame n: fields split
  // before trim counts them, 12-bit samples in 16 bits scaled up rather than read as their dark high byte.
  const levels = fullBitDepth(s);
  const chain = [
    ...(s.interlaced ? [deinterlace] : []),
    `trim=start_frame=${s.first - 1}:end_frame=${s.last}`,
    ...(levels ? [levels] : []),
    ...lumaFilters(s),
    ...(widened(s) ? [squarePixels] : []),
  ];
  // ffmpeg's own options were measured one by one and left out (decision 149): none makes the decode
  // cheaper with the same pixels, and `-fflags +nobuffer` drops the frames read while probing.
  return {
    inputs: [{ path: s.input }],
    outputs: [
      {
        path: "pipe:1",
        // -pix_fmt gray stays: a no-op after extractplanes, the conversion where there is none.
        options: ["-map", `0:${s.videoStreamIndex}`, "-vf", chain.join(","), "-fps_mode", "passthrough", "-f", "rawvideo", "-pix_fmt", "gray"],
      },
    ],
  };
}

export interface GrayDecodeOptions extends GraySpecInput {
  /** Displayed frame size (after rotation), as the clip row holds it. */
  width: number;
  height: number;
  signal?: AbortSignal;
  /** Default 60 s + 20 ms per frame. */
  timeoutMs?: number;
  /**
   * Called once per frame, in order, with the frame's bytes, which are the callee's to keep. A
   * returned promise holds the decoder back (not counted as a stalled decoder).
   */
  onFrame: (frame: number, data: Uint8Array) => void | Promise<void>;
}

// Frame threads cost CPU (each decoding thread keeps its own context, and they wait on each other);
// the job already runs two ways at once, the tracker on one core and ffmpeg beside it. One thread
// decodes a 1280×720 H.264 frame in about 4 ms here, about the tracker's pace for six landmarks, and
// saves ~0.15 CPU-s on the 480-frame bench shot (decision 147). Larger frames keep the cap, so a 4K
// clip is not decoded at a quarter of the tracker's pace.
const ONE_THREAD_MAX_PIXELS = 1280 * 720;

/** ffmpeg's arguments for a grey decode: one decoder thread up to 1280×720, else the configured cap. */
export function grayFfmpegArgs(config: Pick<MediaConfig, "threads">, o: GraySpecInput & { width: number; height: number }): string[] {
  const threads = o.width * o.height <= ONE_THREAD_MAX_PIXELS ? 1 : (config.threads ?? 2);
  return buildFfmpegArgs(buildGraySpec(o), { threads });
}

/** While a consumer holds the decoder back, the stall watchdog is told it is not stuck this often. */
const HELD_BEAT_MS = 5_000;

/** Decode frames first…last to grey; resolves with the number of frames delivered. */
export async function decodeGrayFrames(config: MediaConfig, o: GrayDecodeOptions): Promise<number> {
  const bytes = o.width * o.height;
  if (!(bytes > 0) || o.first < 1 || o.last < o.first) throw new RangeError(`bad grey decode request: ${o.width}×${o.height}, frames ${o.first}–${o.last}`);
  const args = grayFfmpegArgs(config, o);
  let frame: Uint8Array | null = null;
  let beat = () => {};
  let filled = 0;
  let next = o.first;
  // ffmpeg's bytes land straight in the frame being filled (decision 148); a full frame is handed over.
  await runTool(config, {
    tool: "ffmpeg",
    args,
    timeoutMs: o.timeoutMs ?? 60_000 + 20 * (o.last - o.first + 1),
    stallTimeoutMs: 30_000,
    signal: o.signal,
    heartbeat: (b) => (beat = b),
    stdoutInto: {
      next: () => (frame ??= new Uint8Array(bytes)).subarray(filled),
      read: (n) => {
        filled += n;
        if (filled < bytes) return;
        const done = frame!;
        frame = null;
        filled = 0;
        if (next > o.last) throw new FfmpegError("failed", `ffmpeg gave more frames than the ${o.last - o.first + 1} asked for`, { command: "", stderrTail: "", durationMs: 0 });
        const held = o.onFrame(next++, done);
        if (!held) return;
        const beating = setInterval(beat, HELD_BEAT_MS);
        return Promise.resolve(held).finally(() => clearInterval(beating));
      },
    },
  });
  if (filled !== 0) throw new FfmpegError("failed", `ffmpeg ended inside frame ${next} (${filled} of ${bytes} bytes): the frame size is not ${o.width}×${o.height}`, { command: "", stderrTail: "", durationMs: 0 });
  return next - o.first;
}
