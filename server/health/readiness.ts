// The readiness checks of the dependencies a request or a job needs besides the database: the
// queue (pg-boss tables in PostgreSQL), the storage (can we write and delete an object?) and
// ffmpeg/ffprobe (can they be started?). Each answers a short detail for the operator.
import { randomUUID } from "node:crypto";
import { Readable } from "node:stream";
import { liveJobCounts, queueNames } from "../db/queue-tables";
import { env } from "../env";
import { runTool } from "../media/ffmpeg";
import { storage } from "../clips/deps";
import { StorageError } from "../storage";
import { jobPolicies } from "../jobs/types";

/** Waiting and running jobs; fails when pg-boss has not installed its schema or our queues. */
export async function checkQueue(): Promise<string> {
  const names = Object.keys(jobPolicies);
  const have = await queueNames().catch((err) => {
    throw new Error(`the job queue tables are missing (${(err as Error).message}); start the app or a worker once to create them`);
  });
  const missing = names.filter((n) => !have.has(n));
  if (missing.length) throw new Error(`queues not created yet: ${missing.join(", ")}`);
  const { waiting, running } = await liveJobCounts();
  return `${waiting} waiting, ${running} running`;
}

/** Writes, reads back and deletes a tiny object, so a read-only or full disk shows here first. */
export async function checkStorage(): Promise<string> {
  const st = storage();
  const key = `health/probe-${randomUUID()}`;
  const body = Buffer.from("ok");
  await st.putStream(key, Readable.from([body]), { contentType: "text/plain" }).catch((err) => {
    // A read-only disk surfaces from mkdir -p as ENOENT ("not found"), which would mislead here.
    if (err instanceof StorageError && err.code === "not_found") throw new Error(`cannot write to the storage (${st.kind === "local" ? "its folder is read-only, missing or not permitted" : "bucket refused the write"})`);
    throw err;
  });
  try {
    if (!(await st.exists(key))) throw new Error("an object just written cannot be found");
  } finally {
    await st.delete(key);
  }
  const free = await st.freeBytes();
  return st.kind === "local" && free !== null ? `local disk, ${(free / 1024 ** 3).toFixed(1)} GiB free` : st.kind;
}

// ffmpeg does not change while the process runs; a good answer is kept for a minute so a
// readiness probe every few seconds does not spawn a process each time.
let ffmpegOkUntil = 0;
let ffmpegDetail = "";
export async function checkFfmpeg(): Promise<string> {
  if (Date.now() < ffmpegOkUntil) return ffmpegDetail;
  const e = env();
  const config = { ffmpegPath: e.FFMPEG_PATH, ffprobePath: e.FFPROBE_PATH, niceness: 0 };
  const versions: string[] = [];
  for (const tool of ["ffmpeg", "ffprobe"] as const) {
    const r = await runTool(config, { tool, args: ["-hide_banner", "-version"], timeoutMs: 2500, captureStdout: true, failureLogLevel: "warn" });
    versions.push(r.stdout.split("\n")[0]?.replace(/ Copyright.*$/, "").trim() ?? tool);
  }
  ffmpegDetail = versions.join("; ");
  ffmpegOkUntil = Date.now() + 60_000;
  return ffmpegDetail;
}

/** Only for tests that swap FFMPEG_PATH. */
export function forgetFfmpegCheck() {
  ffmpegOkUntil = 0;
}
