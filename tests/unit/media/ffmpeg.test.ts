// The wrapper's guarantees, checked with shell scripts standing in for ffmpeg (they sleep, hang,
// crash or complain on cue) plus one real ffmpeg run.
import { existsSync } from "node:fs";
import { execa } from "execa";
import { mkdir, readdir, readFile, utimes, writeFile } from "node:fs/promises";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { buildFfmpegArgs } from "../../../server/media/command";
import { FfmpegError, isRetryable, MediaInputError } from "../../../server/media/errors";
import { JOB_DIR_PREFIX, runTool, sweepStaleJobDirs, withJobDir } from "../../../server/media/ffmpeg";
import type { FfmpegProgress } from "../../../server/media/progress";
import { standIn, tempDir, testMedia } from "./helpers";

let dir: string;
let cleanup: () => Promise<void>;
beforeAll(async () => ({ dir, cleanup } = await tempDir("ffmpeg")));
afterAll(() => cleanup());

async function failure(p: Promise<unknown>): Promise<FfmpegError> {
  const err = await p.then(
    () => undefined,
    (e) => e,
  );
  expect(err).toBeInstanceOf(FfmpegError);
  return err as FfmpegError;
}

describe("runTool", () => {
  it("kills a run that passes its time limit and reports a retryable timeout", async () => {
    const sleeper = await standIn(dir, "sleeper.sh", "sleep 30");
    const media = testMedia({ ffmpegPath: sleeper, killGraceMs: 300 });
    const t0 = Date.now();
    const err = await failure(runTool(media, { tool: "ffmpeg", args: ["-i", "x"], timeoutMs: 400 }));
    expect(Date.now() - t0).toBeLessThan(5000);
    expect(err.kind).toBe("timeout");
    expect(err.retryable).toBe(true);
    expect(err.message).toMatch(/limit/);
  });

  it("sends SIGKILL after the grace when the tool ignores SIGTERM", async () => {
    const stubborn = await standIn(dir, "stubborn.sh", "trap '' TERM\nwhile :; do sleep 0.1; done");
    const media = testMedia({ ffmpegPath: stubborn, killGraceMs: 300 });
    const t0 = Date.now();
    const err = await failure(runTool(media, { tool: "ffmpeg", args: [], timeoutMs: 300 }));
    const took = Date.now() - t0;
    expect(err.kind).toBe("timeout");
    expect(err.info.signal).toBe("SIGKILL");
    expect(took).toBeGreaterThanOrEqual(550);
    expect(took).toBeLessThan(5000);
  });

  it("the watchdog kills a run whose progress stops", async () => {
    const stuck = await standIn(dir, "stuck.sh", 'printf "frame=1\\nprogress=continue\\n"\nsleep 30');
    const media = testMedia({ ffmpegPath: stuck, killGraceMs: 200 });
    const seen: FfmpegProgress[] = [];
    const err = await failure(
      runTool(media, { tool: "ffmpeg", args: [], timeoutMs: 20_000, stallTimeoutMs: 500, onProgress: (p) => seen.push(p) }),
    );
    expect(err.kind).toBe("stalled");
    expect(err.retryable).toBe(true);
    expect(seen.map((p) => p.frame)).toEqual([1]);
  });

  it("keeps a run alive while progress moves", async () => {
    const moving = await standIn(dir, "moving.sh", 'for i in 1 2 3 4 5 6; do printf "frame=$i\\nprogress=continue\\n"; sleep 0.15; done\nprintf "frame=6\\nprogress=end\\n"');
    const seen: number[] = [];
    await runTool(testMedia({ ffmpegPath: moving }), {
      tool: "ffmpeg", args: [], timeoutMs: 20_000, stallTimeoutMs: 400, onProgress: (p) => seen.push(p.frame),
    });
    expect(seen).toEqual([1, 2, 3, 4, 5, 6, 6]);
  });

  it("a heartbeat from the caller (frames appearing) keeps a run without progress output alive", async () => {
    const quiet = await standIn(dir, "quiet.sh", "sleep 1.2");
    let timer: NodeJS.Timeout | undefined;
    await runTool(testMedia({ ffmpegPath: quiet }), {
      tool: "ffmpeg", args: [], timeoutMs: 20_000, stallTimeoutMs: 400,
      heartbeat: (beat) => (timer = setInterval(beat, 100)),
    }).finally(() => clearInterval(timer));
  });

  it("an AbortSignal cancels the run, and a cancelled run is not retried", async () => {
    const sleeper = await standIn(dir, "sleeper2.sh", "sleep 30");
    const ac = new AbortController();
    setTimeout(() => ac.abort(), 200);
    const err = await failure(runTool(testMedia({ ffmpegPath: sleeper }), { tool: "ffmpeg", args: [], timeoutMs: 20_000, signal: ac.signal }));
    expect(err.kind).toBe("aborted");
    expect(isRetryable(err)).toBe(false);
  });

  it("a crash (signal nobody sent) is retryable; an invalid-input exit is not", async () => {
    const crasher = await standIn(dir, "crash.sh", "kill -SEGV $$");
    const crashed = await failure(runTool(testMedia({ ffmpegPath: crasher }), { tool: "ffmpeg", args: [], timeoutMs: 5000 }));
    expect(crashed.kind).toBe("crashed");
    expect(crashed.retryable).toBe(true);

    const picky = await standIn(dir, "picky.sh", 'echo "in.mp4: Invalid data found when processing input" >&2\nexit 1');
    const invalid = await failure(runTool(testMedia({ ffmpegPath: picky }), { tool: "ffmpeg", args: [], timeoutMs: 5000 }));
    expect(invalid.kind).toBe("invalid_data");
    expect(invalid.retryable).toBe(false);
    expect(invalid.message).toContain("Invalid data found");
  });

  it("logs the full command and the end of stderr on failure", async () => {
    const noisy = await standIn(dir, "noisy.sh", 'i=0; while [ $i -lt 3000 ]; do echo "line $i" >&2; i=$((i+1)); done\necho "the last word" >&2\nexit 3');
    const media = testMedia({ ffmpegPath: noisy, niceness: 5 });
    const err = await failure(runTool(media, { tool: "ffmpeg", args: ["-i", "/in put.mp4"], timeoutMs: 10_000, stderrTailChars: 200 }));
    expect(err.kind).toBe("failed");
    expect(err.info.exitCode).toBe(3);
    expect(err.info.stderrTail.length).toBeLessThanOrEqual(200);
    expect(err.info.stderrTail).toContain("the last word");
    const logged = media.logs.find((l) => l.level === "error");
    expect(logged?.obj.command).toBe(`nice -n 5 ${noisy} -i '/in put.mp4'`);
    expect(logged?.obj.stderrTail).toContain("the last word");
  });

  it("reports a binary that cannot be started", async () => {
    const err = await failure(runTool(testMedia({ ffmpegPath: path.join(dir, "no-such-ffmpeg"), niceness: 0 }), { tool: "ffmpeg", args: [], timeoutMs: 5000 }));
    expect(err.kind).toBe("spawn_failed");
  });

  it("passes -nostdin and progress to the real ffmpeg, which counts up to the frame total", async () => {
    const out = path.join(dir, "null-run");
    await mkdir(out, { recursive: true });
    const frames: number[] = [];
    let ended = false;
    const args = buildFfmpegArgs(
      { inputs: [{ path: "testsrc2=size=160x120:rate=30", options: ["-f", "lavfi"] }], outputs: [{ path: path.join(out, "x.nut"), options: ["-frames:v", "90"] }] },
      { threads: 1, progress: true },
    );
    // lavfi source names are not files: undo the absolute-path safety for this one input.
    args[args.indexOf("-i") + 1] = "testsrc2=size=160x120:rate=30";
    await runTool(testMedia(), { tool: "ffmpeg", args, timeoutMs: 20_000, onProgress: (p) => { frames.push(p.frame); ended ||= p.end; } });
    expect(ended).toBe(true);
    expect(frames.at(-1)).toBe(90);
    expect(frames).toEqual([...frames].sort((a, b) => a - b));
  });
});

describe("a worker stopped by SIGTERM", () => {
  it("takes its ffmpeg children (and theirs) along", async () => {
    const pidFile = path.join(dir, "child.pid");
    const tool = await standIn(dir, "long.sh", `sleep 60 &\necho $! > ${pidFile}\nwait`);
    const worker = path.join(dir, "worker.mts");
    const wrapper = path.resolve("server/media/ffmpeg.ts");
    await writeFile(
      worker,
      `import { runTool } from ${JSON.stringify(wrapper)};\n` +
        `await runTool({ ffmpegPath: ${JSON.stringify(tool)}, ffprobePath: "ffprobe", niceness: 0 }, { tool: "ffmpeg", args: [], timeoutMs: 60000 });\n`,
    );
    const sub = execa("node", ["--import", "tsx", worker], { reject: false });
    for (let i = 0; i < 100 && !existsSync(pidFile); i++) await new Promise((r) => setTimeout(r, 100));
    const grandchild = Number((await readFile(pidFile, "utf8")).trim());
    sub.kill("SIGTERM");
    const r = await sub;
    expect(r.signal).toBe("SIGTERM"); // Node still stops the usual way
    // Gone, or a zombie waiting for init to reap it (state Z in /proc/<pid>/stat, proc(5)). The
    // signal's delivery takes a moment, longer on a loaded machine: asked for up to 5 s, not once.
    const goneOrZombie = async () => {
      const stat = await readFile(`/proc/${grandchild}/stat`, "utf8").catch(() => "");
      return stat === "" || stat.split(") ")[1]?.startsWith("Z") === true;
    };
    let gone = false;
    for (let i = 0; i < 50 && !(gone = await goneOrZombie()); i++) await new Promise((res) => setTimeout(res, 100));
    expect(gone).toBe(true);
  }, 20_000);
});

// Raw output read straight into the caller's memory through a local socket (decision 148). The
// stand-ins write a known byte pattern: byte i is i mod 251, so a lost, doubled or shifted read shows.
describe("runTool with stdoutInto", () => {
  const pattern = (n: number) => Uint8Array.from({ length: n }, (_, i) => i % 251);
  // The pattern written in writes of 1 byte to 70 KB, so reads end anywhere inside a piece.
  const patternScript = (size: number) => `node -e 'const b=Buffer.alloc(${size});for(let i=0;i<${size};i++)b[i]=i%251;let at=0;const w=()=>{while(at<b.length){const n=Math.min(b.length-at,1+(at%70000));if(!process.stdout.write(b.subarray(at,at+n))){at+=n;return process.stdout.once("drain",w)}at+=n}};w()'`;
  /** A sink of fixed-size pieces, like frames; `hold` delays some reads. */
  const pieces = (size: number, hold?: (piece: number) => Promise<void> | undefined) => {
    const got: Uint8Array[] = [];
    let piece: Uint8Array | null = null;
    let filled = 0;
    let reads = 0;
    return {
      got,
      reads: () => reads,
      sink: {
        next: () => (piece ??= new Uint8Array(size)).subarray(filled),
        read: (n: number) => {
          reads++;
          filled += n;
          if (filled < size) return;
          got.push(piece!);
          piece = null;
          filled = 0;
          return hold?.(got.length);
        },
      },
    };
  };

  it("the tool's stdout is a socket, and every byte lands in the sink's memory in order", async () => {
    const size = 300_000, count = 7;
    const tool = await standIn(dir, "writer.sh", `readlink /proc/$$/fd/1 >&2
${patternScript(size * count)}`);
    const p = pieces(size);
    const r = await runTool(testMedia({ ffmpegPath: tool }), { tool: "ffmpeg", args: [], timeoutMs: 20_000, stdoutInto: p.sink });
    expect(r.stderrTail).toMatch(/^socket:/);
    expect(p.got).toHaveLength(count);
    expect(Buffer.concat(p.got).equals(Buffer.from(pattern(size * count)))).toBe(true);
    // Reads fill the pieces' memory as it comes: at most one read per write, never 64 KB copies.
    expect(p.reads()).toBeGreaterThanOrEqual(count);
  });

  it("a held read pauses the tool and loses nothing", async () => {
    const size = 200_000, count = 6;
    const tool = await standIn(dir, "writer-held.sh", patternScript(size * count));
    const p = pieces(size, (n) => (n % 2 ? new Promise((r) => setTimeout(r, 150)) : undefined));
    await runTool(testMedia({ ffmpegPath: tool }), { tool: "ffmpeg", args: [], timeoutMs: 20_000, stallTimeoutMs: 10_000, stdoutInto: p.sink });
    expect(Buffer.concat(p.got).equals(Buffer.from(pattern(size * count)))).toBe(true);
  });

  it("a sink that throws, or rejects, stops the tool, and runTool throws its error", async () => {
    const tool = await standIn(dir, "writer-endless.sh", "cat /dev/zero");
    const throwing = pieces(100_000, (n) => {
      if (n === 3) throw new Error("the third piece is refused");
      return undefined;
    });
    await expect(runTool(testMedia({ ffmpegPath: tool, killGraceMs: 300 }), { tool: "ffmpeg", args: [], timeoutMs: 20_000, stdoutInto: throwing.sink })).rejects.toThrow(
      "the third piece is refused",
    );
    expect(throwing.got).toHaveLength(3);
    const rejecting = pieces(100_000, (n) => (n === 2 ? Promise.reject(new Error("no room for the second piece")) : undefined));
    await expect(runTool(testMedia({ ffmpegPath: tool, killGraceMs: 300 }), { tool: "ffmpeg", args: [], timeoutMs: 20_000, stdoutInto: rejecting.sink })).rejects.toThrow(
      "no room for the second piece",
    );
    const empty = { next: () => new Uint8Array(0), read: () => {} };
    await expect(runTool(testMedia({ ffmpegPath: tool }), { tool: "ffmpeg", args: [], timeoutMs: 20_000, stdoutInto: empty })).rejects.toThrow(/no memory to read into/);
  });

  it("ends when the tool exits even if a grandchild keeps its stdout open", async () => {
    const pidFile = path.join(dir, "holder.pid");
    const tool = await standIn(dir, "writer-grandchild.sh", `${patternScript(50_000)}\nsleep 30 &\necho $! > ${pidFile}`);
    const p = pieces(50_000);
    await runTool(testMedia({ ffmpegPath: tool }), { tool: "ffmpeg", args: [], timeoutMs: 20_000, stdoutInto: p.sink });
    expect(p.got).toHaveLength(1);
    // Still alive: the run did not wait for its time limit, which kills the whole group.
    const holder = Number((await readFile(pidFile, "utf8")).trim());
    const stat = await readFile(`/proc/${holder}/stat`, "utf8").catch(() => "");
    expect(stat.split(") ")[1]?.[0], "the holder's state in /proc/<pid>/stat (proc(5)): running or sleeping, not gone or a zombie").toMatch(/[RS]/);
    process.kill(holder, "SIGKILL");
  });
});

describe("job folders", () => {
  it("are removed after the job, also when it throws", async () => {
    const media = testMedia({ tmpRoot: path.join(dir, "jobs") });
    let seen = "";
    await withJobDir(media, "ok", async (d) => {
      seen = d;
      expect(existsSync(d)).toBe(true);
    });
    expect(existsSync(seen)).toBe(false);
    await expect(
      withJobDir(media, "../bad/label", async (d) => {
        seen = d;
        throw new MediaInputError("not_media", "x");
      }),
    ).rejects.toThrow("x");
    expect(existsSync(seen)).toBe(false);
    expect(path.dirname(seen)).toBe(path.join(dir, "jobs"));
  });

  it("a sweep removes only stale job folders", async () => {
    const root = path.join(dir, "sweep");
    await mkdir(path.join(root, `${JOB_DIR_PREFIX}old-1`), { recursive: true });
    await mkdir(path.join(root, `${JOB_DIR_PREFIX}new-1`), { recursive: true });
    await mkdir(path.join(root, "someone-else"), { recursive: true });
    const hourAgo = new Date(Date.now() - 3600_000);
    await utimes(path.join(root, `${JOB_DIR_PREFIX}old-1`), hourAgo, hourAgo);
    await utimes(path.join(root, "someone-else"), hourAgo, hourAgo);
    const removed = await sweepStaleJobDirs({ tmpRoot: root }, 60_000);
    expect(removed.map((p) => path.basename(p))).toEqual([`${JOB_DIR_PREFIX}old-1`]);
    expect((await readdir(root)).sort()).toEqual([`${JOB_DIR_PREFIX}new-1`, "someone-else"]);
  });
});
