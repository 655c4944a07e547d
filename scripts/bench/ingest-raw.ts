// Frame-extraction benchmark pieces: generate a long 1280x720 clip, then time the raw
// `ffmpeg -i clip frames/%06d.jpg` and our extraction on the same clip in the same run,
// alternating the order so neither always gets the warmer machine. Besides wall time it reports
// CPU time (this process plus the tools it ran), which a busy shared machine disturbs far less.
// Prints figures; asserts nothing (performance goals of issue 3). Run alone:
//   node --import tsx scripts/bench/ingest-raw.ts [--frames 2400] [--rounds 3] [--threads 2]
import { execFileSync } from "node:child_process";
import { existsSync, readFileSync } from "node:fs";
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

// CPU time of this process and of the children it has waited for: proc(5), /proc/self/stat
// fields 14-17 (utime, stime, cutime, cstime) in clock ticks. Linux only; null elsewhere.
let ticksPerSecond: number | undefined;
function cpuMsNow(): number | null {
  try {
    ticksPerSecond ??= Number(execFileSync("getconf", ["CLK_TCK"]).toString().trim()) || 100;
    const fields = readFileSync("/proc/self/stat", "utf8").split(") ")[1].split(" ");
    const ticks = [11, 12, 13, 14].reduce((sum, i) => sum + Number(fields[i]), 0); // fields 14..17
    return (ticks / ticksPerSecond) * 1000;
  } catch {
    return null;
  }
}

export interface Timing {
  ms: number;
  /** CPU time used meanwhile by this process and the tools it ran; null when unknown. */
  cpuMs: number | null;
  frames: number;
  /** Ours only: from the call to frame 1 being ready (extract) or stored (ingest). */
  firstFrameMs?: number | null;
}

async function timed(fn: () => Promise<Omit<Timing, "ms" | "cpuMs">>): Promise<Timing> {
  const c0 = cpuMsNow();
  const t0 = performance.now();
  const r = await fn();
  const ms = performance.now() - t0;
  const c1 = cpuMsNow();
  return { ...r, ms, cpuMs: c0 === null || c1 === null ? null : c1 - c0 };
}

/** The baseline exactly as a person would type it: `ffmpeg -i clip frames/%06d.jpg`. */
export async function timeRawExtraction(media: MediaConfig, clip: string, outDir: string): Promise<Timing> {
  const framesDir = path.join(outDir, "frames");
  await mkdir(framesDir, { recursive: true });
  return timed(async () => {
    await runTool(media, {
      tool: "ffmpeg",
      args: ["-nostdin", "-loglevel", "error", "-i", clip, path.join(framesDir, "%06d.jpg")],
      timeoutMs: 600_000,
    });
    return { frames: (await readdir(framesDir)).length };
  });
}

/** extractFrames() alone: frames, timestamps and strip into a folder. */
export async function timeOurExtraction(media: MediaConfig, clip: string, p: ProbeResult, outDir: string): Promise<Timing> {
  return timed(async () => {
    const r = await extractFrames(media, { input: clip, probe: p, outDir });
    return { frames: r.frameCount, firstFrameMs: r.firstFrameMs };
  });
}

/** extractClipFrames() into local-disk storage: until every frame is stored and viewable. */
export async function timeOurIngest(media: MediaConfig, clip: string, p: ProbeResult, root: string): Promise<Timing> {
  const storage = new LocalDiskStorage({ root });
  const clipId = "bench";
  await storage.putFile(clipKeys.original(clipId), clip);
  return timed(async () => {
    const r = await extractClipFrames({ media, storage }, { clipId, probe: p });
    return { frames: r.frameCount, firstFrameMs: r.firstFrameMs };
  });
}

export type BenchKind = "raw" | "extract" | "ingest";

export interface IngestRawFigures {
  clip: string;
  frames: number;
  rounds: number;
  runs: Record<BenchKind, Timing[]>;
  /** Best-of-rounds wall time, ours / raw. */
  extractRatio: number;
  ingestRatio: number;
  /** Median CPU time, ours / raw (null without /proc). */
  extractCpuRatio: number | null;
  ingestCpuRatio: number | null;
  loadAverage: [number, number];
}

const best = (xs: number[]) => Math.min(...xs);
const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
const cpuMedian = (ts: Timing[]) => (ts.every((t) => t.cpuMs !== null) ? median(ts.map((t) => t.cpuMs as number)) : null);

/** Alternates raw, extract and ingest runs `rounds` times on one clip and returns the figures. */
export async function runIngestRawBench(
  media: MediaConfig,
  o: { workDir?: string; frames?: number; rounds?: number; log?: (line: string) => void } = {},
): Promise<IngestRawFigures> {
  const log = o.log ?? (() => undefined);
  const workDir = o.workDir ?? (await mkdtemp(path.join(os.tmpdir(), "loadframe-bench-")));
  const rounds = o.rounds ?? 3;
  const clip = await generateBenchClip(media, { dir: path.join(workDir, "clips"), frames: o.frames });
  const p = await probe(media, clip);
  log(`clip: ${p.frameCount} frames, ${p.width}x${p.height}, ${p.codec}, ${(p.sizeBytes / 1e6).toFixed(1)} MB`);
  const load0 = os.loadavg()[0];

  // Warm the page cache so the first timed run does not pay for reading the clip.
  await runTool(media, { tool: "ffmpeg", args: ["-nostdin", "-loglevel", "error", "-i", clip, "-f", "null", "-"], timeoutMs: 600_000 });

  const runs: Record<BenchKind, Timing[]> = { raw: [], extract: [], ingest: [] };
  const s = (ms: number | null | undefined) => (ms === null || ms === undefined ? "?" : `${(ms / 1000).toFixed(2)} s`);
  for (let i = 0; i < rounds; i++) {
    const order: BenchKind[] = i % 2 === 0 ? ["raw", "extract", "ingest"] : ["ingest", "extract", "raw"];
    for (const kind of order) {
      const d = path.join(workDir, "runs", `${kind}-${i}`);
      await rm(d, { recursive: true, force: true });
      await mkdir(d, { recursive: true });
      const t =
        kind === "raw" ? await timeRawExtraction(media, clip, d) : kind === "extract" ? await timeOurExtraction(media, clip, p, d) : await timeOurIngest(media, clip, p, d);
      runs[kind].push(t);
      const first = t.firstFrameMs === undefined ? "" : `, first frame ${t.firstFrameMs} ms`;
      log(`round ${i + 1} ${kind.padEnd(8)} wall ${s(t.ms)}, cpu ${s(t.cpuMs)}, ${t.frames} frames${first}, load ${os.loadavg()[0].toFixed(1)}`);
      await rm(d, { recursive: true, force: true });
    }
  }
  const raw = runs.raw;
  const rawCpu = cpuMedian(raw);
  const cpuRatio = (ts: Timing[]) => {
    const c = cpuMedian(ts);
    return c === null || rawCpu === null ? null : c / rawCpu;
  };
  return {
    clip,
    frames: p.frameCount,
    rounds,
    runs,
    extractRatio: best(runs.extract.map((t) => t.ms)) / best(raw.map((t) => t.ms)),
    ingestRatio: best(runs.ingest.map((t) => t.ms)) / best(raw.map((t) => t.ms)),
    extractCpuRatio: cpuRatio(runs.extract),
    ingestCpuRatio: cpuRatio(runs.ingest),
    loadAverage: [load0, os.loadavg()[0]],
  };
}

export function formatFigures(f: IngestRawFigures): string {
  const s = (ms: number | null) => (ms === null ? "?" : `${(ms / 1000).toFixed(2)} s`);
  const r = (x: number | null) => (x === null ? "?" : x.toFixed(2));
  const wall = (k: BenchKind) => best(f.runs[k].map((t) => t.ms));
  const firsts = f.runs.ingest.map((t) => t.firstFrameMs).filter((v): v is number => typeof v === "number");
  return [
    `${f.frames} frames 1280x720; ${f.rounds} rounds; wall = best of rounds, cpu = median`,
    `raw ffmpeg -i clip frames/%06d.jpg       wall ${s(wall("raw"))}, cpu ${s(cpuMedian(f.runs.raw))}`,
    `extractFrames (+ timestamps, strip)      wall ${s(wall("extract"))} ratio ${r(f.extractRatio)}, cpu ${s(cpuMedian(f.runs.extract))} ratio ${r(f.extractCpuRatio)}  (goal <= 1.2)`,
    `extractClipFrames (+ stored, viewable)   wall ${s(wall("ingest"))} ratio ${r(f.ingestRatio)}, cpu ${s(cpuMedian(f.runs.ingest))} ratio ${r(f.ingestCpuRatio)}  (goal <= 1.2)`,
    `time to first viewable frame: best ${firsts.length ? Math.min(...firsts) : "?"} ms, median ${firsts.length ? median(firsts) : "?"} ms (goal <= 1500 ms)`,
    `load average (1 min) before / after: ${f.loadAverage.map((l) => l.toFixed(2)).join(" / ")} on ${os.cpus().length} cores`,
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
