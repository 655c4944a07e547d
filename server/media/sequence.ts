// Numbered frames (a lab camera's export) into one video file the rest of the pipeline reads
// like any clip: every frame decoded once to prove it reads and to compare sizes, then copied
// without re-encoding (each image stays as the camera wrote it, 16-bit TIFF included) into
// Matroska on a 1,000 fps grid — the container's own millisecond clock, so the times are exact
// and the typed capture rate scales them like any slow-motion clip's (decision 134).
import { buildFfmpegArgs, buildFfprobeArgs } from "./command";
import { FfmpegError } from "./errors";
import { runTool, type MediaConfig } from "./ffmpeg";

/** The grid a sequence is stored on: one frame per millisecond tick of Matroska's clock. */
export const SEQUENCE_STORED_FPS = 1000;

export type SequenceFault =
  | { kind: "unreadable"; index: number }
  | { kind: "size"; index: number; width: number; height: number; firstWidth: number; firstHeight: number };

export interface SequenceCheck {
  width: number;
  height: number;
  fault: SequenceFault | null;
}

interface FramesJson {
  frames?: { best_effort_timestamp?: number; width?: number; height?: number }[];
}

const image2Input = (start = 0) => ["-f", "image2", "-framerate", "1", "-start_number", String(start)];

/**
 * Decode every frame of `pattern` (%08d from 0): the first frame that does not decode, or whose
 * size differs from the first's. `maxPixels` stops a decoder from allocating a huge frame.
 */
export async function checkSequenceFrames(
  config: MediaConfig,
  pattern: string,
  count: number,
  o: { maxPixels: number; timeoutMs?: number; signal?: AbortSignal },
): Promise<SequenceCheck> {
  let json: FramesJson = {};
  try {
    const { stdout } = await runTool(config, {
      tool: "ffprobe",
      args: buildFfprobeArgs(pattern, [
        ...image2Input(),
        "-max_pixels", String(o.maxPixels),
        "-threads", String(config.threads ?? 2),
        "-show_entries", "frame=best_effort_timestamp,width,height",
        "-print_format", "json",
      ]),
      timeoutMs: o.timeoutMs ?? 60_000 + count * 200,
      signal: o.signal,
      captureStdout: true,
      maxStdoutBytes: 256 + count * 200,
      failureLogLevel: "warn",
    });
    json = JSON.parse(stdout) as FramesJson;
  } catch (err) {
    // Nothing could be read at all (the first image is not what its name says): frame 0 is at fault.
    if (!(err instanceof FfmpegError) || (err.kind !== "invalid_data" && err.kind !== "failed")) throw err;
  }
  const frames = json.frames ?? [];
  const byIndex = new Map(frames.map((f) => [Math.round(f.best_effort_timestamp ?? -1), f]));
  const first = byIndex.get(0);
  if (!first?.width || !first.height) return { width: 0, height: 0, fault: { kind: "unreadable", index: 0 } };
  for (let i = 1; i < count; i++) {
    const f = byIndex.get(i);
    if (!f?.width || !f.height) return { width: first.width, height: first.height, fault: { kind: "unreadable", index: i } };
    if (f.width !== first.width || f.height !== first.height)
      return {
        width: first.width,
        height: first.height,
        fault: { kind: "size", index: i, width: f.width, height: f.height, firstWidth: first.width, firstHeight: first.height },
      };
  }
  return { width: first.width, height: first.height, fault: null };
}

/** Copy the frames of `pattern` (%08d from 0), unchanged, into a Matroska file at `out`. */
export async function sequenceToVideo(config: MediaConfig, pattern: string, out: string, o: { count: number; signal?: AbortSignal }) {
  await runTool(config, {
    tool: "ffmpeg",
    args: buildFfmpegArgs({
      inputs: [{ path: pattern, options: ["-f", "image2", "-framerate", String(SEQUENCE_STORED_FPS), "-start_number", "0"] }],
      outputs: [{ path: out, options: ["-map", "0:v:0", "-c", "copy", "-map_metadata", "-1", "-f", "matroska"] }],
    }),
    timeoutMs: 60_000 + o.count * 20,
    signal: o.signal,
  });
}
