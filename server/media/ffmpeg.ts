// The one place that spawns ffmpeg/ffprobe. Every run is niced, has a hard time limit (SIGTERM,
// then SIGKILL after a grace), optionally a progress watchdog, can be cancelled by an
// AbortSignal, keeps the end of stderr, and logs the full command when it fails.
import { mkdir, mkdtemp, readdir, rm, stat } from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import { execa } from "execa";
import { classifyFailure, formatCommand, withNice } from "./command";
import { FfmpegError } from "./errors";
import { ProgressParser, type FfmpegProgress } from "./progress";
import { readStdoutInto, type SinkReading, type StdoutSink } from "./stdout-socket";

/** pino's call shape, so the server's logger can be passed straight in. */
export interface MediaLogger {
  warn(obj: object, msg?: string): void;
  error(obj: object, msg?: string): void;
}

export interface MediaConfig {
  /** Paths to the binaries (env FFMPEG_PATH / FFPROBE_PATH, read by the caller). */
  ffmpegPath: string;
  ffprobePath: string;
  /** `nice -n` value for every run; 0 turns nice off. Default 10. */
  niceness?: number;
  /** Thread cap for decoders, encoders and filters. Default 2. */
  threads?: number;
  nicePath?: string;
  /** Where per-job temp folders go. Default the OS temp folder. */
  tmpRoot?: string;
  /** Time between SIGTERM and SIGKILL when a run is stopped. Default 2000 ms. */
  killGraceMs?: number;
  logger?: MediaLogger;
}

export interface RunOptions {
  tool: "ffmpeg" | "ffprobe";
  args: string[];
  /** Hard limit for the whole run. */
  timeoutMs: number;
  /** Kill when neither the progress output changes nor a heartbeat comes for this long. */
  stallTimeoutMs?: number;
  /**
   * Receives a function that counts as progress for the watchdog. ffmpeg 5.1 prints no progress
   * until every output has started, so a caller watching output files uses this instead.
   */
  heartbeat?: (beat: () => void) => void;
  signal?: AbortSignal;
  cwd?: string;
  /** Parse stdout as `-progress` blocks. */
  onProgress?: (p: FfmpegProgress) => void;
  /** Keep stdout (ffprobe JSON / CSV), up to maxStdoutBytes. */
  captureStdout?: boolean;
  /**
   * Binary stdout (raw frames) read straight into memory the sink names, through a local socket
   * (stdout-socket.ts, decision 148) instead of a pipe read in 64 KB chunks. Each read counts as
   * progress for the watchdog; a held read pauses the tool, a failed one stops the run and is what
   * runTool throws.
   */
  stdoutInto?: StdoutSink;
  maxStdoutBytes?: number;
  stderrTailChars?: number;
  /** Log level for a failed run; "warn" where failure is an expected answer (probing uploads). */
  failureLogLevel?: "error" | "warn";
}

export interface RunResult {
  stdout: string;
  stderrTail: string;
  durationMs: number;
  command: string;
}

const consoleLogger: MediaLogger = {
  warn: (obj, msg) => console.warn(JSON.stringify({ level: "warn", msg, ...obj })),
  error: (obj, msg) => console.error(JSON.stringify({ level: "error", msg, ...obj })),
};

// Children run in their own process group so a kill also reaches anything they started; that
// means a dying Node no longer takes them along, so this does it: on exit, and on the usual
// stop signals (re-raised afterwards when nobody else handles them, so Node still stops).
const liveGroups = new Set<number>();
let exitHookInstalled = false;
const killAll = () => {
  for (const g of liveGroups) killGroup(g, "SIGKILL");
};
function trackGroup(pid: number) {
  if (!exitHookInstalled) {
    exitHookInstalled = true;
    process.once("exit", killAll);
    for (const sig of ["SIGINT", "SIGTERM", "SIGHUP"] as const) {
      const onSignal = () => {
        killAll();
        process.removeListener(sig, onSignal);
        if (process.listenerCount(sig) === 0) process.kill(process.pid, sig);
      };
      process.on(sig, onSignal);
    }
  }
  liveGroups.add(pid);
}
function killGroup(pid: number, sig: NodeJS.Signals) {
  try {
    process.kill(-pid, sig);
  } catch {
    // already gone
  }
}

const lastLine = (s: string) =>
  s
    .trim()
    .split("\n")
    .map((l) => l.trim())
    .filter(Boolean)
    .pop() ?? "";

function describe(kind: string, tool: string, o: RunOptions, exitCode: number | undefined, signal: string | undefined, stderr: string) {
  const detail = lastLine(stderr);
  switch (kind) {
    case "timeout":
      return `${tool} ran longer than the ${Math.round(o.timeoutMs / 1000)} s limit and was stopped`;
    case "stalled":
      return `${tool} made no progress for ${Math.round((o.stallTimeoutMs ?? 0) / 1000)} s and was stopped`;
    case "aborted":
      return `${tool} was cancelled`;
    case "crashed":
      return `${tool} ended abnormally (signal ${signal})`;
    case "disk_full":
      return `${tool} ran out of disk space`;
    case "spawn_failed":
      return `${tool} could not be started: ${detail}`;
    case "invalid_data":
      return `${tool} could not read the input: ${detail}`;
    default:
      return `${tool} failed (exit code ${exitCode})${detail ? `: ${detail}` : ""}`;
  }
}

export async function runTool(config: MediaConfig, o: RunOptions): Promise<RunResult> {
  const toolPath = o.tool === "ffmpeg" ? config.ffmpegPath : config.ffprobePath;
  const { file, args } = withNice(toolPath, o.args, config.niceness ?? 10, config.nicePath);
  const command = formatCommand(file, args);
  const logger = config.logger ?? consoleLogger;
  const grace = config.killGraceMs ?? 2000;
  const tailChars = o.stderrTailChars ?? 16_384;
  const maxStdout = o.maxStdoutBytes ?? 256 * 1024 * 1024;
  const started = Date.now();

  // The socket is read before the tool starts; its hooks reach the watchdog and the kill once it runs.
  // A sink's failure before then (its first memory) stops the run here.
  let consumerError: unknown;
  const onRead = { progress: () => {}, stop: () => {} };
  let sink: SinkReading | undefined;
  if (o.stdoutInto && !o.signal?.aborted) {
    sink = await readStdoutInto(o.stdoutInto, {
      progress: () => onRead.progress(),
      failed: (err) => {
        consumerError ??= err;
        onRead.stop();
      },
    });
  }
  if (o.signal?.aborted || consumerError) {
    sink?.childEnd.destroy();
    sink?.destroy();
    if (consumerError) throw consumerError;
    throw new FfmpegError("aborted", `${o.tool} was cancelled`, { command, stderrTail: "", durationMs: 0 });
  }

  const sub = execa(file, args, {
    cwd: o.cwd,
    stdin: "ignore",
    stdout: sink?.childEnd ?? "pipe",
    buffer: false,
    reject: false,
    detached: true,
    cleanup: false,
    forceKillAfterDelay: false,
  });
  const pid = sub.pid;
  if (pid !== undefined) trackGroup(pid);

  let killedFor: "timeout" | "stalled" | "aborted" | undefined;
  let escalation: NodeJS.Timeout | undefined;
  const stop = (reason: "timeout" | "stalled" | "aborted") => {
    if (killedFor || pid === undefined) return;
    killedFor = reason;
    killGroup(pid, "SIGTERM");
    escalation = setTimeout(() => killGroup(pid, "SIGKILL"), grace);
  };

  const timer = setTimeout(() => stop("timeout"), o.timeoutMs);
  let stallTimer: NodeJS.Timeout | undefined;
  // Re-armed on every read of raw frames (thousands a run): refresh() keeps the one timer.
  const armStall = () => {
    if (!o.stallTimeoutMs) return;
    if (stallTimer) stallTimer.refresh();
    else stallTimer = setTimeout(() => stop("stalled"), o.stallTimeoutMs);
  };
  armStall();
  o.heartbeat?.(armStall);
  onRead.progress = armStall;
  onRead.stop = () => stop("aborted");
  const onAbort = () => stop("aborted");
  o.signal?.addEventListener("abort", onAbort, { once: true });

  let stdout = "";
  let stdoutOverflow = false;
  let stderrTail = "";
  const parser = o.onProgress ? new ProgressParser() : undefined;
  let lastKey = "";
  sub.stdout?.setEncoding("utf8");
  sub.stderr?.setEncoding("utf8");
  sub.stdout?.on("data", (chunk: string) => {
    if (o.captureStdout && !stdoutOverflow) {
      stdout += chunk;
      if (stdout.length > maxStdout) stdoutOverflow = true;
    }
    if (!parser) return;
    for (const p of parser.push(chunk)) {
      const key = `${p.frame}|${p.outTimeUs}|${p.totalSize}`;
      if (key !== lastKey) {
        lastKey = key;
        armStall();
      }
      try {
        o.onProgress!(p);
      } catch (err) {
        logger.warn({ err: String(err), command }, "progress callback threw");
      }
    }
  });
  sub.stderr?.on("data", (chunk: string) => {
    stderrTail = (stderrTail + chunk).slice(-tailChars);
  });
  // A grandchild that inherited the pipes would keep them open after the tool exits. A held raw
  // stdout still has the last frames to read: it ends once nothing more comes while nothing is held.
  sub.on("exit", () => {
    setTimeout(() => {
      sub.stdout?.destroy();
      sub.stderr?.destroy();
    }, 1000).unref();
    sink?.endWhenQuiet(1000);
  });

  const result = await sub;
  // Our copy of the child's end of the socket stays open until the child is gone (execa watches it
  // until then); closed, the reader sees the end once it has read the last frames.
  sink?.childEnd.destroy();
  await sink?.done();
  sink?.destroy();
  clearTimeout(timer);
  clearTimeout(stallTimer);
  clearTimeout(escalation);
  o.signal?.removeEventListener("abort", onAbort);
  if (pid !== undefined) liveGroups.delete(pid);
  const durationMs = Date.now() - started;

  if (consumerError) throw consumerError;
  if (!result.failed && !stdoutOverflow) return { stdout, stderrTail, durationMs, command };

  const spawnErrorCode = result.exitCode === undefined && !result.signal ? String(result.code ?? "ERROR") : undefined;
  if (spawnErrorCode) stderrTail ||= result.message ?? spawnErrorCode;
  const kind = stdoutOverflow
    ? "failed"
    : classifyFailure({ exitCode: result.exitCode, signal: result.signal, stderr: stderrTail, killedFor, spawnErrorCode });
  const message = stdoutOverflow
    ? `${o.tool} wrote more than ${maxStdout} bytes of output`
    : describe(kind, o.tool, o, result.exitCode, result.signal, stderrTail);
  const err = new FfmpegError(kind, message, {
    command,
    exitCode: result.exitCode,
    signal: result.signal,
    stderrTail,
    durationMs,
  });
  const log = { kind, command, exitCode: result.exitCode, signal: result.signal, durationMs, stderrTail };
  if (kind === "aborted" || o.failureLogLevel === "warn") logger.warn(log, message);
  else logger.error(log, message);
  throw err;
}

/** Prefix of every per-job temp folder, so a sweep can find the ones a killed worker left. */
export const JOB_DIR_PREFIX = "loadframe-job-";

/** Run `fn` with a fresh temp folder that is removed afterwards, whatever happens. */
export async function withJobDir<T>(
  config: Pick<MediaConfig, "tmpRoot">,
  label: string,
  fn: (dir: string) => Promise<T>,
): Promise<T> {
  const root = config.tmpRoot ?? os.tmpdir();
  await mkdir(root, { recursive: true });
  const safe = label.replace(/[^\w-]/g, "_").slice(0, 40);
  const dir = await mkdtemp(path.join(root, `${JOB_DIR_PREFIX}${safe}-`));
  try {
    return await fn(dir);
  } finally {
    await rm(dir, { recursive: true, force: true, maxRetries: 3 });
  }
}

/** Remove job folders older than maxAgeMs (left by a worker that was killed). Returns their paths. */
export async function sweepStaleJobDirs(config: Pick<MediaConfig, "tmpRoot">, maxAgeMs: number): Promise<string[]> {
  const root = config.tmpRoot ?? os.tmpdir();
  let names: string[];
  try {
    names = await readdir(root);
  } catch {
    return [];
  }
  const removed: string[] = [];
  for (const name of names) {
    if (!name.startsWith(JOB_DIR_PREFIX)) continue;
    const p = path.join(root, name);
    try {
      const s = await stat(p);
      if (s.isDirectory() && Date.now() - s.mtimeMs > maxAgeMs) {
        await rm(p, { recursive: true, force: true });
        removed.push(p);
      }
    } catch {
      // raced with its owner
    }
  }
  return removed;
}
