// Probe before store: read an uploaded file with ffprobe and either describe its video or say,
// in words a coach understands, why it cannot be used. Only cheap reads: the stream headers, a
// decode of the first packets, and (when the container has no frame count) a packet count.
import { open, stat } from "node:fs/promises";
import { buildFfprobeArgs } from "./command";
import { FfmpegError, MediaInputError } from "./errors";
import { runTool, type MediaConfig } from "./ffmpeg";
import { analyseTiming } from "./timing";
import { frameTimesFromPackets, parsePacketCsv, parseTimeBase } from "./timestamps";
import type { ClipTiming } from "../../shared/schemas/clips";

export interface ProbeOptions {
  /** Largest accepted frame, width × height (env MAX_PIXELS). Default DCI 4K, 4096 × 2160. */
  maxPixels?: number;
  timeoutMs?: number;
  signal?: AbortSignal;
  /** Packets decoded, when the first few dozen give no frame, to prove the stream is readable. Default 120. */
  samplePackets?: number;
}

/** Packets decoded first to prove frames come out. */
const QUICK_SAMPLE_PACKETS = 24;

export type Rotation = 0 | 90 | 180 | 270;

export interface ProbeResult {
  codec: string;
  /** Displayed size: after rotation, the size of the extracted frames. */
  width: number;
  height: number;
  /** Size as stored in the file, before rotation. */
  storedWidth: number;
  storedHeight: number;
  /** The rate of the file's frame grid (decision 131). Often a playback rate, not the capture rate. */
  storedFps: number;
  rFrameRate: string;
  avgFrameRate: string;
  /** Frames in the file: its video packets, which with -fps_mode passthrough are the frames written. */
  frameCount: number;
  /** Frames the header promises (its count, else duration × rate); more than frameCount for a cut file. */
  expectedFrames: number;
  /** The frame clock of the packets' times: even, snapped or uneven, with gaps and repeats. */
  timing: ClipTiming;
  /** Each packet's time on that clock, seconds from the first, in presentation order (one per frame, before fields are split). */
  packetTimes: number[];
  /** A capture rate the phone wrote into the file (Android's capture-fps tag and the like), else null. */
  taggedCaptureFps: number | null;
  durationS: number | null;
  /** Clockwise turn from stored to displayed picture. */
  rotationDeg: Rotation;
  variableFrameRate: boolean;
  hasAudio: boolean;
  pixelFormat: string | null;
  /** Bits that carry the picture in each sample when the decoder says (12 in a 16-bit format), else null. */
  bitsPerSample: number | null;
  colorRange: string | null;
  /** Colour facts the extraction honours: HDR transfer (tone-mapped), matrix (BT.709 vs 601). */
  colorTransfer: string | null;
  colorSpace: string | null;
  /** Interlaced: every frame holds two fields, extracted as two pictures (decision 132). */
  interlaced: boolean;
  /** Width ÷ height of one stored pixel (1 = square); frames are served square. */
  pixelAspect: number;
  /** Absolute index of the video stream used. */
  videoStreamIndex: number;
  timeBase: string;
  formatName: string;
  sizeBytes: number;
  /** ffprobe's -show_streams -show_format JSON, kept with the clip. */
  raw: FfprobeJson;
}

export interface FfprobeStream {
  index: number;
  codec_type?: string;
  codec_name?: string;
  width?: number;
  height?: number;
  r_frame_rate?: string;
  avg_frame_rate?: string;
  time_base?: string;
  nb_frames?: string;
  duration?: string;
  pix_fmt?: string;
  bits_per_raw_sample?: string;
  color_range?: string;
  color_transfer?: string;
  color_space?: string;
  field_order?: string;
  sample_aspect_ratio?: string;
  disposition?: Record<string, number>;
  tags?: Record<string, string>;
  side_data_list?: { side_data_type?: string; rotation?: number }[];
}
export interface FfprobeJson {
  streams?: FfprobeStream[];
  format?: { filename?: string; format_name?: string; duration?: string; size?: string; start_time?: string; tags?: Record<string, string> };
}

// Phones write where a clip was filmed into its metadata (QuickTime "location" / ©xyz, ISO 6709
// coordinates; Android "location-eng"; some cameras GPS* keys). Nothing here needs it, so it is
// dropped before the probe is stored with the clip (from memory: ffprobe's names for these tags).
const PLACE_TAG = /location|gps|\bxyz\b|geo|latitude|longitude|coordinates/i;
const withoutPlace = (tags?: Record<string, string>) => tags && Object.fromEntries(Object.entries(tags).filter(([k]) => !PLACE_TAG.test(k)));

/** The probe JSON with every tag that could say where the clip was filmed taken out. */
export function withoutPlaceTags(raw: FfprobeJson): FfprobeJson {
  return {
    ...raw,
    streams: raw.streams?.map((s) => (s.tags ? { ...s, tags: withoutPlace(s.tags) } : s)),
    format: raw.format && (raw.format.tags ? { ...raw.format, tags: withoutPlace(raw.format.tags) } : raw.format),
  };
}

/** A stored rate of 60 fps or less is usually a playback rate: ask for the capture rate. */
export const looksLikePlaybackRate = (storedFps: number): boolean => storedFps <= 60;

/** "30000/1001" → 29.97; "0/0", "N/A" → null. */
export function parseRate(rate: string | undefined): number | null {
  if (!rate) return null;
  const [n, d = "1"] = rate.split("/");
  const v = Number(n) / Number(d);
  return Number.isFinite(v) && v > 0 ? v : null;
}

/** Clockwise display rotation from the display matrix (counter-clockwise in ffprobe) or the old rotate tag. */
export function rotationOf(stream: FfprobeStream): Rotation {
  const matrix = stream.side_data_list?.find((s) => typeof s.rotation === "number");
  const cw = matrix ? -(matrix.rotation as number) : Number(stream.tags?.rotate ?? 0);
  const r = ((Math.round(cw / 90) * 90) % 360 + 360) % 360;
  return r as Rotation;
}

// Phones that store slow motion at a playback rate write the capture rate as a tag: Android's
// "com.android.capture.fps" (ffprobe shows mdta keys as format tags); other writers use similar
// keys with "capture" and "fps" or "frame rate" (from memory, unverified per maker).
const CAPTURE_RATE_TAG = /capture[._-]?(fps|frame[._-]?rate)/i;

/** "4:3" → 1.333; missing, "0:1", "1:1" → 1. */
export function parseAspect(sar: string | undefined): number {
  const [n, d] = (sar ?? "").split(":").map(Number);
  const v = n / d;
  return Number.isFinite(v) && v > 0 ? v : 1;
}

/** The width square pixels need, even (the encoders want even sizes). */
export const squareWidthOf = (width: number, pixelAspect: number) => Math.max(2, 2 * Math.round((width * pixelAspect) / 2));

/** The capture rate a file's tags state, or null. */
export function taggedCaptureRate(raw: FfprobeJson): number | null {
  const tagSets = [raw.format?.tags, ...(raw.streams ?? []).map((s) => s.tags)];
  for (const tags of tagSets)
    for (const [k, v] of Object.entries(tags ?? {})) {
      const fps = Number.parseFloat(v);
      if (CAPTURE_RATE_TAG.test(k) && Number.isFinite(fps) && fps > 0 && fps <= 1_000_000) return fps;
    }
  return null;
}

const imageCodecs = new Set([
  "png", "mjpeg", "jpegls", "jpeg2000", "bmp", "tiff", "webp", "gif", "ppm", "pgm", "pgmyuv", "pbm",
  "pam", "targa", "sgi", "dpx", "exr", "qoi", "jpegxl", "pcx", "xbm", "xwd", "sunrast", "hdr", "psd",
  "svg", "photocd", "avif",
]);

/** Image demuxers (image2, png_pipe, …), or a lone frame of an image codec in any container. */
export function isStillImage(formatName: string, codec: string, frameCount: number | null): boolean {
  const formats = formatName.split(",");
  if (formats.some((f) => f === "image2" || f.endsWith("_pipe"))) return true;
  return imageCodecs.has(codec) && (frameCount === null || frameCount <= 1);
}

// An ISO-BMFF file (MP4, MOV) starts with a box whose type is at bytes 4..8.
const isoBoxTypes = new Set(["ftyp", "moov", "mdat", "free", "skip", "wide", "pnot"]);
async function looksLikeIsoBmff(file: string): Promise<boolean> {
  const fh = await open(file, "r");
  try {
    const buf = Buffer.alloc(8);
    const { bytesRead } = await fh.read(buf, 0, 8, 0);
    return bytesRead === 8 && isoBoxTypes.has(buf.subarray(4, 8).toString("latin1"));
  } finally {
    await fh.close();
  }
}

/**
 * Whether a top-level ISO-BMFF box claims more bytes than the file has: an MP4/MOV cut off after
 * its index (moov first) still probes fine, but its last frames are missing. Box header per
 * ISO/IEC 14496-12 §4.2: 32-bit size (1 = 64-bit size follows, 0 = to the end), 4-char type.
 */
export async function isoBoxesOverrun(file: string, fileSize: number): Promise<boolean> {
  const fh = await open(file, "r");
  try {
    const head = Buffer.alloc(16);
    let pos = 0;
    for (let i = 0; i < 10_000 && pos + 8 <= fileSize; i++) {
      const { bytesRead } = await fh.read(head, 0, 16, pos);
      if (bytesRead < 8) return true;
      let size = head.readUInt32BE(0);
      if (size === 1) {
        if (bytesRead < 16) return true;
        size = Number(head.readBigUInt64BE(8));
      } else if (size === 0) {
        return false;
      }
      if (size < 8) return false; // not a box structure we can follow; leave it to ffmpeg
      pos += size;
    }
    return pos > fileSize;
  } finally {
    await fh.close();
  }
}

const mp = (px: number) => `${(px / 1e6).toFixed(1)} MP`;
const isInputFailure = (err: unknown) =>
  err instanceof FfmpegError && (err.kind === "invalid_data" || err.kind === "failed");

async function ffprobeJson<T>(config: MediaConfig, file: string, options: string[], o: ProbeOptions): Promise<T> {
  const { stdout } = await runTool(config, {
    tool: "ffprobe",
    args: buildFfprobeArgs(file, ["-print_format", "json", ...options]),
    timeoutMs: o.timeoutMs ?? 60_000,
    signal: o.signal,
    captureStdout: true,
    failureLogLevel: "warn",
  });
  return JSON.parse(stdout) as T;
}

export async function probe(config: MediaConfig, file: string, o: ProbeOptions = {}): Promise<ProbeResult> {
  const maxPixels = o.maxPixels ?? 4096 * 2160;
  const { size } = await stat(file);
  if (size === 0) {
    throw new MediaInputError("empty_file", "The file is empty (0 bytes). Nothing was stored; please upload the clip again.");
  }

  let raw: FfprobeJson;
  try {
    raw = await ffprobeJson<FfprobeJson>(config, file, ["-show_streams", "-show_format"], o);
  } catch (err) {
    if (!isInputFailure(err)) throw err;
    const tail = (err as FfmpegError).info.stderrTail;
    if (/moov atom not found/i.test(tail) && (await looksLikeIsoBmff(file))) {
      throw new MediaInputError(
        "truncated_file",
        "This MP4/MOV file is incomplete: its index (the 'moov' box) is missing, which usually means the copy or upload was cut off. Copy the clip from the camera again and upload the whole file.",
      );
    }
    throw new MediaInputError(
      "not_media",
      "This file is not a video that can be read: no audio or video format was recognised. Check that you picked the clip itself.",
    );
  }

  if (/\bmov\b|\bmp4\b/.test(raw.format?.format_name ?? "") && (await isoBoxesOverrun(file, size))) {
    throw new MediaInputError(
      "truncated_file",
      "This MP4/MOV file is incomplete: it ends before the end of its video data, which usually means the copy or upload was cut off. Copy the clip from the camera again and upload the whole file.",
    );
  }
  // The server's temp path of the upload is no business of the clip's record.
  if (raw.format) delete raw.format.filename;
  const streams = raw.streams ?? [];
  const formatName = raw.format?.format_name ?? "";
  const hasAudio = streams.some((s) => s.codec_type === "audio");
  // Cover art inside audio files shows up as a video stream marked attached_pic.
  const video = streams.find((s) => s.codec_type === "video" && !s.disposition?.attached_pic);
  if (!video) {
    if (hasAudio) {
      const codec = streams.find((s) => s.codec_type === "audio")?.codec_name ?? "unknown";
      throw new MediaInputError("audio_only", `This file holds only audio (${codec}) and no video.`, { codec });
    }
    throw new MediaInputError("no_video_stream", "This file holds no video stream.", { formatName });
  }

  const codec = video.codec_name ?? "unknown";
  const nbFrames = Number(video.nb_frames);
  const headerFrames = Number.isInteger(nbFrames) && nbFrames > 0 ? nbFrames : null;
  // Every packet's time (demux only, no decoding): the frame count, the frame clock and the rate.
  const packets = await packetTimes(config, file, video, o);
  if (isStillImage(formatName, codec, packets.length || headerFrames)) {
    throw new MediaInputError("image_not_video", `This is an image (${codec}), not a video. Upload the video clip itself.`, {
      codec,
      formatName,
    });
  }

  const storedWidth = video.width ?? 0;
  const storedHeight = video.height ?? 0;
  const pixels = storedWidth * storedHeight;
  if (pixels > maxPixels) {
    throw new MediaInputError(
      "pixel_size_over_limit",
      `The frames are ${storedWidth} × ${storedHeight} pixels (${mp(pixels)}); this server accepts at most ${mp(maxPixels)} per frame. Export the clip at a smaller size.`,
      { width: storedWidth, height: storedHeight, maxPixels },
    );
  }

  // Decode the first packets: proves frames come out. A few dozen packets do for a sound file and
  // cost a quarter of 120 (the time to the first viewable frame waits on this); only when none of
  // them decodes (a damaged start, a long open GOP) is the longer sample read before refusing.
  const decodedIn = async (packets: number) => {
    const sel = ["-select_streams", String(video.index), "-read_intervals", `%+#${packets}`];
    try {
      const sample = await ffprobeJson<{ streams?: { nb_read_frames?: string }[] }>(config, file, [...sel, "-count_frames", "-show_entries", "stream=nb_read_frames"], o);
      return Number(sample.streams?.[0]?.nb_read_frames ?? 0) || 0;
    } catch (err) {
      if (!isInputFailure(err)) throw err;
      return 0;
    }
  };
  const full = o.samplePackets ?? 120;
  const decoded = (await decodedIn(Math.min(QUICK_SAMPLE_PACKETS, full))) || (full > QUICK_SAMPLE_PACKETS ? await decodedIn(full) : 0);
  if (decoded === 0) {
    throw new MediaInputError(
      "no_decodable_frames",
      `The video stream (${codec}) has no frame that can be decoded: the file is damaged, or its format cannot be read by this server.`,
      { codec },
    );
  }

  const timeBase = video.time_base ?? "1/1000";
  const { timing, times } = analyseTiming(packets, parseTimeBase(timeBase), [parseRate(video.r_frame_rate), parseRate(video.avg_frame_rate)]);
  // Interlaced video is one picture per field: twice the frames, twice the rate.
  const interlaced = ["tt", "bb", "tb", "bt"].includes(video.field_order ?? "");
  const perFrame = interlaced ? 2 : 1;
  if (interlaced) {
    timing.nominalFps *= 2;
    timing.gaps = timing.gaps.map((g) => ({ after: g.after * 2, missing: g.missing * 2 }));
    timing.repeats = timing.repeats.map((f) => f * 2 - 1);
  }
  const frameCount = (packets.length || headerFrames || decoded) * perFrame;
  const duration = Number(video.duration ?? raw.format?.duration);
  const durationS = Number.isFinite(duration) && duration > 0 ? duration : null;
  // What the header promises: its own count, else its duration on the frame grid.
  const expectedFrames = Math.max(frameCount, headerFrames ? headerFrames * perFrame : durationS ? Math.round(durationS * timing.nominalFps) : frameCount);
  // A cut file promises more than it holds; one frame and 1 % are rounding of a duration.
  if (expectedFrames - frameCount > Math.max(1, 0.01 * expectedFrames)) timing.missingTail = { from: frameCount + 1, to: expectedFrames };
  const rotationDeg = rotationOf(video);
  const quarter = rotationDeg === 90 || rotationDeg === 270;
  // Non-square pixels (1440 × 1080 at 4:3) are widened to square ones, so a scale bar measures
  // the same in every direction.
  const pixelAspect = parseAspect(video.sample_aspect_ratio);
  const squareWidth = pixelAspect === 1 ? storedWidth : squareWidthOf(storedWidth, pixelAspect);

  return {
    codec,
    width: quarter ? storedHeight : squareWidth,
    height: quarter ? squareWidth : storedHeight,
    storedWidth,
    storedHeight,
    storedFps: timing.nominalFps,
    rFrameRate: video.r_frame_rate ?? "0/0",
    avgFrameRate: video.avg_frame_rate ?? "0/0",
    frameCount,
    expectedFrames,
    timing,
    packetTimes: times,
    taggedCaptureFps: taggedCaptureRate(raw),
    durationS,
    rotationDeg,
    variableFrameRate: timing.clock === "uneven" || timing.gapCount > 0 || timing.repeatCount > 0,
    hasAudio,
    pixelFormat: video.pix_fmt ?? null,
    bitsPerSample: Number(video.bits_per_raw_sample) > 0 ? Number(video.bits_per_raw_sample) : null,
    colorTransfer: video.color_transfer ?? null,
    colorSpace: video.color_space ?? null,
    interlaced,
    pixelAspect,
    colorRange: video.color_range ?? null,
    videoStreamIndex: video.index,
    timeBase,
    formatName,
    sizeBytes: size,
    raw,
  };
}

/** Seconds from the first frame of every video packet, in presentation order (no decoding). */
async function packetTimes(config: MediaConfig, file: string, video: FfprobeStream, o: ProbeOptions): Promise<number[]> {
  try {
    const { stdout } = await runTool(config, {
      tool: "ffprobe",
      args: buildFfprobeArgs(file, ["-select_streams", String(video.index), "-show_entries", "packet=pts,dts,flags", "-of", "csv=p=0"]),
      timeoutMs: o.timeoutMs ?? 60_000,
      signal: o.signal,
      captureStdout: true,
      failureLogLevel: "warn",
    });
    return frameTimesFromPackets(parsePacketCsv(stdout), video.time_base ?? "1/1000");
  } catch (err) {
    if (!isInputFailure(err)) throw err;
    return [];
  }
}
