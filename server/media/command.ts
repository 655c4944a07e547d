// Pure command building for ffmpeg/ffprobe: every flag the wrapper promises (no stdin, quiet
// stderr, machine-readable progress, thread cap, niceness) is added here, so it can be checked
// without spawning anything.
import path from "node:path";
import type { FfmpegFailureKind } from "./errors";

export interface FfmpegInput {
  path: string;
  /** Options placed before this `-i`. */
  options?: string[];
}

export interface FfmpegOutput {
  path: string;
  /** Options placed before this output path. */
  options?: string[];
}

export interface FfmpegSpec {
  global?: string[];
  inputs: FfmpegInput[];
  filterComplex?: string;
  outputs: FfmpegOutput[];
}

export interface BuildOptions {
  /** Cap on decoder, encoder and filter threads. Omit to let ffmpeg pick (one per core). */
  threads?: number;
  /** Add `-progress pipe:1` so the caller can follow frames done on stdout. */
  progress?: boolean;
  /** How often ffmpeg reports progress, seconds. */
  statsPeriodS?: number;
  logLevel?: "quiet" | "error" | "warning" | "info";
}

// Absolute paths cannot be mistaken for an option ("-x.mp4") or a protocol ("http:..."); the
// standard output pipe (pipe:1), for raw frames read by the caller, is the one protocol let through.
const safePath = (p: string) => (p === "pipe:1" ? p : path.resolve(p));

function withThreads(options: string[], threads: number | undefined): string[] {
  if (threads === undefined || options.includes("-threads")) return options;
  return ["-threads", String(threads), ...options];
}

export function buildFfmpegArgs(spec: FfmpegSpec, opts: BuildOptions = {}): string[] {
  const args = ["-hide_banner", "-nostdin", "-nostats", "-loglevel", opts.logLevel ?? "error", "-y"];
  if (opts.progress) args.push("-progress", "pipe:1", "-stats_period", String(opts.statsPeriodS ?? 0.25));
  if (opts.threads !== undefined) {
    args.push("-filter_threads", String(opts.threads), "-filter_complex_threads", String(opts.threads));
  }
  args.push(...(spec.global ?? []));
  for (const input of spec.inputs) args.push(...withThreads(input.options ?? [], opts.threads), "-i", safePath(input.path));
  if (spec.filterComplex) args.push("-filter_complex", spec.filterComplex);
  for (const output of spec.outputs) args.push(...withThreads(output.options ?? [], opts.threads), safePath(output.path));
  return args;
}

/** ffprobe arguments: errors only on stderr, the file last. */
export function buildFfprobeArgs(file: string, options: string[]): string[] {
  return ["-hide_banner", "-loglevel", "error", ...options, safePath(file)];
}

/** Run `file args` under `nice -n N` (nice execs the tool, so the pid stays the tool's). */
export function withNice(
  file: string,
  args: string[],
  niceness: number | undefined,
  nicePath = "nice",
): { file: string; args: string[] } {
  if (!niceness) return { file, args };
  const n = Math.max(-20, Math.min(19, Math.round(niceness)));
  return { file: nicePath, args: ["-n", String(n), file, ...args] };
}

/** The command as one line a person can paste into a shell. */
export function formatCommand(file: string, args: string[]): string {
  const quote = (a: string) => (/^[\w/.,:=+%@-]+$/.test(a) ? a : `'${a.replace(/'/g, `'\\''`)}'`);
  return [file, ...args].map(quote).join(" ");
}

// Messages with which ffmpeg says the input itself is unusable; running again gives the same answer.
const invalidInputPatterns = [
  /Invalid data found when processing input/i,
  /moov atom not found/i,
  /could not find codec parameters/i,
  /does not contain any stream/i,
  /Error splitting the input into NAL units/i,
  /Invalid NAL unit size/i,
  /Decoder .* not found|Unknown decoder/i,
  /no frame!/i,
];
const diskFullPattern = /No space left on device|Disk quota exceeded/i;

export interface ExitFacts {
  exitCode?: number;
  signal?: string;
  stderr: string;
  /** Set when this wrapper killed the run on purpose. */
  killedFor?: "timeout" | "stalled" | "aborted";
  spawnErrorCode?: string;
}

export function classifyFailure(f: ExitFacts): FfmpegFailureKind {
  if (f.killedFor) return f.killedFor;
  if (f.spawnErrorCode) return "spawn_failed";
  if (f.signal) return "crashed";
  if (diskFullPattern.test(f.stderr)) return "disk_full";
  if (invalidInputPatterns.some((p) => p.test(f.stderr))) return "invalid_data";
  return "failed";
}
