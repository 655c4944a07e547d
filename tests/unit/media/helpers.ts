// Clips for the media tests, generated with the system ffmpeg in a temp folder (nothing binary
// is committed). Each helper returns the file path.
import { execa } from "execa";
import { chmod, mkdtemp, readFile, rm, writeFile } from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import type { MediaConfig, MediaLogger } from "../../../server/media";

export interface LogEntry {
  level: "warn" | "error";
  obj: Record<string, unknown>;
  msg?: string;
}

/** Media config with the real binaries and a logger that remembers instead of printing. */
export function testMedia(overrides: Partial<MediaConfig> = {}): MediaConfig & { logs: LogEntry[] } {
  const logs: LogEntry[] = [];
  const logger: MediaLogger = {
    warn: (obj, msg) => logs.push({ level: "warn", obj: obj as Record<string, unknown>, msg }),
    error: (obj, msg) => logs.push({ level: "error", obj: obj as Record<string, unknown>, msg }),
  };
  return { ffmpegPath: "ffmpeg", ffprobePath: "ffprobe", threads: 2, logger, logs, ...overrides };
}

export async function tempDir(label: string): Promise<{ dir: string; cleanup: () => Promise<void> }> {
  const dir = await mkdtemp(path.join(os.tmpdir(), `lf-test-${label}-`));
  return { dir, cleanup: () => rm(dir, { recursive: true, force: true }) };
}

export async function ffmpeg(args: string[]): Promise<void> {
  await execa("ffmpeg", ["-hide_banner", "-loglevel", "error", "-nostdin", "-y", ...args]);
}

export interface ClipSpec {
  frames: number;
  size?: string;
  rate?: number;
  /** Extra output options, e.g. ["-bf", "0"]. */
  extra?: string[];
  /** lavfi source; default testsrc2. */
  source?: string;
}

/** An H.264 MP4 of `frames` frames from a lavfi test source. */
export async function makeClip(dir: string, name: string, spec: ClipSpec): Promise<string> {
  const file = path.join(dir, name);
  const source = spec.source ?? `testsrc2=size=${spec.size ?? "320x240"}:rate=${spec.rate ?? 30}`;
  await ffmpeg([
    "-f", "lavfi", "-i", source, "-frames:v", String(spec.frames),
    "-c:v", "libx264", "-preset", "ultrafast", "-pix_fmt", "yuv420p", ...(spec.extra ?? []), file,
  ]);
  return file;
}

/**
 * A clip whose top-left corner holds a red square on blue, stored with a rotation in its
 * display matrix (set by stream-copying with a rotate tag, as ffmpeg 5.1 does it).
 */
export async function makeRotatedClip(dir: string, name: string, rotateTag: number, frames = 10): Promise<string> {
  const plain = path.join(dir, `plain-${name}`);
  await ffmpeg([
    "-f", "lavfi", "-i", "color=c=blue:size=320x240:rate=30,drawbox=x=0:y=0:w=60:h=60:color=red:t=fill",
    "-frames:v", String(frames), "-c:v", "libx264", "-preset", "ultrafast", "-pix_fmt", "yuv420p", plain,
  ]);
  const file = path.join(dir, name);
  await ffmpeg(["-i", plain, "-c", "copy", "-metadata:s:v:0", `rotate=${rotateTag}`, file]);
  return file;
}

/** 30 frames at 1/30 s, then 60 frames at 1/120 s (a phone ramping into slow motion). */
export async function makeVfrClip(dir: string, name: string): Promise<string> {
  const file = path.join(dir, name);
  await ffmpeg([
    "-f", "lavfi", "-i", "testsrc2=size=320x240:rate=120", "-frames:v", "90",
    // Whole ticks of the source's 1/120 s time base (a float expression would be truncated).
    "-vf", "setpts='if(lt(N,30),N*4,90+N)'", "-fps_mode", "passthrough",
    "-c:v", "libx264", "-preset", "ultrafast", "-bf", "0", "-pix_fmt", "yuv420p", "-video_track_timescale", "1200", file,
  ]);
  return file;
}

/** A shell script standing in for ffmpeg/ffprobe. */
export async function standIn(dir: string, name: string, body: string): Promise<string> {
  const file = path.join(dir, name);
  await writeFile(file, `#!/bin/sh\n${body}\n`);
  await chmod(file, 0o755);
  return file;
}

/** A copy of an MP4 with the media payload zeroed: headers intact, no frame decodable. */
export async function blankMdat(src: string, dest: string): Promise<string> {
  const bytes = Buffer.from(await readFile(src));
  // Walk the top-level ISO-BMFF boxes (ISO/IEC 14496-12: 32-bit size, 4-char type) and blank mdat.
  for (let i = 0; i + 8 <= bytes.length; ) {
    const size = bytes.readUInt32BE(i);
    if (size < 8) break;
    if (bytes.toString("latin1", i + 4, i + 8) === "mdat") bytes.fill(0, i + 8, i + size);
    i += size;
  }
  await writeFile(dest, bytes);
  return dest;
}
