// Frame-extraction benchmark pieces: generate a long 1280x720 clip, then time the raw
// `ffmpeg -i clip frames/%06d.jpg` and our extraction on the same clip in the same run,
// alternating the order so neither always gets the warmer machine. Prints figures; asserts
// nothing (see the performance goals in issue 3). Run alone:
//   node --import tsx scripts/bench/ingest-raw.ts [--frames 2400] [--rounds 2]
import { existsSync } from "node:fs";
import { mkdir, mkdtemp, readdir, rm } from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import { pathToFileURL } from "node:url";
import { buildFfmpegArgs } from "../../server/media/command";
import { extractFrames } from "../../server/media/extract";
import { runTool, type MediaConfig } from "../../server/media/ffmpeg";
import { extractClipFrames } from "../../server/media/ingest";
import { probe, type ProbeResult } from "../../server/media/probe";
import { clipKeys, LocalDiskStorage } from "../../server/storage";

export interface BenchClipOptions {
  dir: string;
  frames?: number;
  width?: number;
  height?: number;
  rate?: number;
}

/** An H.264 test-pattern clip (default 2,400 frames, 1280x720, stored at 240 fps); reused if present. */
export async function generateBenchClip(media: MediaConfig, o: BenchClipOptions): Promise<string> {
  const frames = o.frames ?? 2400;
  const size = `${o.width ?? 1280}x${o.height ?? 720}`;
  const file = path.join(o.dir, `bench-${size}-${frames}f.mp4`);
  if (existsSync(file)) return file;
  await mkdir(o.dir, { recursive: true });
  const spec = {
    inputs: [{ path: `testsrc2=size=${size}:rate=${o.rate ?? 240}`, options: ["-f", "lavfi"] }],
    outputs: [{ path: file, options: ["-frames:v", String(frames), "-c:v", "libx264", "-preset", "veryfast", "-pix_fmt", "yuv420p"] }],
  };
  const args = buildFfmpegArgs(spec);
  args[args.indexOf("-i") + 1] = spec.inputs[0].path; // a lavfi source, not a file
  await runTool(media, { tool: "ffmpeg", args, timeoutMs: 600_000 });
  return file;
}

/** The baseline exactly as a person would type it: `ffmpeg -i clip frames/%06d.jpg`. */
export async function timeRawExtraction(media: MediaConfig, clip: string, outDir: string): Promise<{ ms: number; frames: number }> {
  const framesDir = path.join(outDir, "frames");
  await mkdir(framesDir, { recursive: true });
  const t0 = performance.now();
  await runTool(media, {
    tool: "ffmpeg",
    args: ["-nostdin", "-loglevel", "error", "-i", clip, path.join(framesDir, "%06d.jpg")],
    timeoutMs: 600_000,
  });
  const ms = performance.now() - t0;
  return { ms, frames: (await readdir(framesDir)).length };
}

export interface OurTiming {
  ms: number;
  frames: number;
  firstFrameMs: number | null;
  /** For the storage run: when extraction itself had finished. */
  extractMs?: number;
}

/** extractFrames() alone: frames, timestamps and strip into a folder. */
export async function timeOurExtraction(media: MediaConfig, clip: string, p: ProbeResult, outDir: string): Promise<OurTiming> {
  const t0 = performance.now();
  const r = await extractFrames(media, { input: clip, probe: p, outDir });
  return { ms: performance.now() - t0, frames: r.frameCount, firstFrameMs: r.firstFrameMs };
}

/** extractClipFrames() into local-disk storage: until every frame is stored and viewable. */
export async function timeOurIngest(media: MediaConfig, clip: string, p: ProbeResult, root: string): Promise<OurTiming> {
  const storage = new LocalDiskStorage({ root });
  const clipId = "bench";
  await storage.putFile(clipKeys.original(clipId), clip);
  const t0 = performance.now();
  const r = await extractClipFrames({ media, storage }, { clipId, probe: p });
  return { ms: performance.now() - t0, frames: r.frameCount, firstFrameMs: r.firstFrameMs, extractMs: r.extractMs };
}

export interface IngestRawFigures {
  clip: string;
  frames: number;
  rounds: number;
  rawMs: number[];
  extractMs: number[];
  ingestMs: number[];
  firstFrameMs: number[];
  /** Best-of-rounds ratios, ours / raw. */
  extractRatio: number;
  ingestRatio: number;
  loadAverage: [number, number];
}

const best = (xs: number[]) => Math.min(...xs);

/** Alternates raw, extract and ingest runs `rounds` times on one clip and returns the figures. */
export async function runIngestRawBench(
  media: MediaConfig,
  o: { workDir?: string; frames?: number; rounds?: number; log?: (line: string) => void } = {},
): Promise<IngestRawFigures> {
  const log = o.log ?? (() => undefined);
  const workDir = o.workDir ?? (await mkdtemp(path.join(os.tmpdir(), "loadframe-bench-")));
  const rounds = o.rounds ?? 2;
  const clip = await generateBenchClip(media, { dir: path.join(workDir, "clips"), frames: o.frames });
  const p = await probe(media, clip);
  log(`clip: ${p.frameCount} frames, ${p.width}x${p.height}, ${p.codec}, ${(p.sizeBytes / 1e6).toFixed(1)} MB`);
  const load0 = os.loadavg()[0];

  // Warm the page cache so the first timed run does not pay for reading the clip.
  await runTool(media, { tool: "ffmpeg", args: ["-nostdin", "-loglevel", "error", "-i", clip, "-f", "null", "-"], timeoutMs: 600_000 });

  const rawMs: number[] = [];
  const extractMs: number[] = [];
  const ingestMs: number[] = [];
  const firstFrameMs: number[] = [];
  const fresh = async (name: string) => {
    const d = path.join(workDir, "runs", name);
    await rm(d, { recursive: true, force: true });
    await mkdir(d, { recursive: true });
    return d;
  };
  for (let i = 0; i < rounds; i++) {
    const order = i % 2 === 0 ? ["raw", "extract", "ingest"] : ["ingest", "extract", "raw"];
    for (const kind of order) {
      const d = await fresh(`${kind}-${i}`);
      if (kind === "raw") {
        const r = await timeRawExtraction(media, clip, d);
        rawMs.push(r.ms);
        log(`round ${i + 1} raw ffmpeg:         ${(r.ms / 1000).toFixed(2)} s, ${r.frames} frames`);
      } else if (kind === "extract") {
        const r = await timeOurExtraction(media, clip, p, d);
        extractMs.push(r.ms);
        log(`round ${i + 1} extractFrames:      ${(r.ms / 1000).toFixed(2)} s, ${r.frames} frames, first frame ${r.firstFrameMs} ms`);
      } else {
        const r = await timeOurIngest(media, clip, p, d);
        ingestMs.push(r.ms);
        if (r.firstFrameMs !== null) firstFrameMs.push(r.firstFrameMs);
        log(`round ${i + 1} extractClipFrames:  ${(r.ms / 1000).toFixed(2)} s, ${r.frames} frames, first viewable ${r.firstFrameMs} ms, extraction done at ${((r.extractMs ?? 0) / 1000).toFixed(2)} s`);
      }
      await rm(d, { recursive: true, force: true });
    }
  }
  return {
    clip,
    frames: p.frameCount,
    rounds,
    rawMs,
    extractMs,
    ingestMs,
    firstFrameMs,
    extractRatio: best(extractMs) / best(rawMs),
    ingestRatio: best(ingestMs) / best(rawMs),
    loadAverage: [load0, os.loadavg()[0]],
  };
}

export function formatFigures(f: IngestRawFigures): string {
  const s = (ms: number) => `${(ms / 1000).toFixed(2)} s`;
  return [
    `frames: ${f.frames} (1280x720), rounds: ${f.rounds}, best of rounds`,
    `raw ffmpeg -i clip frames/%06d.jpg: ${s(best(f.rawMs))}`,
    `extractFrames (frames + timestamps + strip): ${s(best(f.extractMs))}  ratio ${f.extractRatio.toFixed(2)} (goal <= 1.2)`,
    `extractClipFrames (… + stored, viewable): ${s(best(f.ingestMs))}  ratio ${f.ingestRatio.toFixed(2)} (goal <= 1.2)`,
    `time to first viewable frame: ${best(f.firstFrameMs)} ms (goal <= 1500 ms)`,
    `load average (1 min) before/after: ${f.loadAverage.map((l) => l.toFixed(2)).join(" / ")}`,
  ].join("\n");
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? "").href) {
  const arg = (name: string) => {
    const i = process.argv.indexOf(`--${name}`);
    return i > 0 ? Number(process.argv[i + 1]) : undefined;
  };
  // Same niceness for both sides, so a busy machine does not favour the baseline.
  const media: MediaConfig = {
    ffmpegPath: process.env.FFMPEG_PATH ?? "ffmpeg",
    ffprobePath: process.env.FFPROBE_PATH ?? "ffprobe",
    niceness: 0,
    threads: arg("threads"),
  };
  const workDir = path.join(os.tmpdir(), "loadframe-bench-ingest");
  const figures = await runIngestRawBench(media, { workDir, frames: arg("frames"), rounds: arg("rounds"), log: console.log });
  console.log(`\n${formatFigures(figures)}`);
}
