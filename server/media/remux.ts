// The stored original must not say where a clip was filmed: a file whose tags carry a place is
// copied stream for stream (no re-encoding, same timestamps, rotation kept as stream side data)
// without any container or stream metadata.
import { rename, rm } from "node:fs/promises";
import { buildFfmpegArgs } from "./command";
import { runTool, type MediaConfig } from "./ffmpeg";
import { withoutPlaceTags, type FfprobeJson } from "./probe";

/** Whether the probe shows any tag that could say where the clip was filmed. */
export function hasPlaceTags(raw: FfprobeJson): boolean {
  return JSON.stringify(withoutPlaceTags(raw)) !== JSON.stringify(raw);
}

/** ffmpeg's muxer for a file ffprobe named `formatName` (QuickTime brand kept as mov, else mp4). */
function muxerFor(formatName: string, majorBrand: string | undefined): string {
  if (/\bmov\b|\bmp4\b/.test(formatName)) return majorBrand?.trim() === "qt" ? "mov" : "mp4";
  if (/matroska/.test(formatName)) return /webm/.test(formatName) && majorBrand === "webm" ? "webm" : "matroska";
  return formatName.split(",")[0];
}

/** Rewrite `file` in place without metadata. Every stream is kept; if a stream cannot be copied, video and audio only. */
export async function stripMetadata(config: MediaConfig, file: string, raw: FfprobeJson, o: { signal?: AbortSignal } = {}): Promise<void> {
  const out = `${file}.clean`;
  const f = muxerFor(raw.format?.format_name ?? "", raw.format?.tags?.major_brand);
  const run = (maps: string[]) =>
    runTool(config, {
      tool: "ffmpeg",
      args: buildFfmpegArgs({ inputs: [{ path: file }], outputs: [{ path: out, options: [...maps, "-c", "copy", "-map_metadata", "-1", "-map_chapters", "-1", "-fflags", "+bitexact", "-f", f] }] }),
      timeoutMs: 10 * 60_000,
      signal: o.signal,
    });
  try {
    await run(["-map", "0"]).catch(() => run(["-map", "0:v", "-map", "0:a?"]));
    await rename(out, file);
  } finally {
    await rm(out, { force: true });
  }
}
