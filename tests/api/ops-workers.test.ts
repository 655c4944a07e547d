// Scale-out on the queue: two worker processes (`node --import tsx server/worker.ts`) against one
// database share the extraction jobs — both take some, none is run twice, every clip ends with
// each frame exactly once. A worker told to stop (SIGTERM) mid-job finishes that job or hands it
// back to the queue (never loses it), takes no other and exits cleanly.
import { clipMeta, makeClip, tusUpload, uploadDir, waitFor } from "./clips-support";
import { spawn, type ChildProcess } from "node:child_process";
import { readdirSync } from "node:fs";
import path from "node:path";
import { createInterface } from "node:readline";
import { sql } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Client, EMAILS, seedWorld, startServer, type TestServer } from "./helpers";
import { startJobs, stopJobs } from "../../server/jobs/runtime";
import { db } from "../../server/db/client";

interface LogLine { msg: string; job?: string; jobId?: string; time: number }
interface Worker { name: string; proc: ChildProcess; lines: LogLine[]; exited: Promise<number | null> }

let srv: TestServer;
let world: Awaited<ReturnType<typeof seedWorld>>;
let coach: Client;
const workers: Worker[] = [];

function startWorker(name: string): Worker {
  const proc = spawn(process.execPath, ["--import", "tsx", "server/worker.ts"], {
    env: { ...process.env, LOG_LEVEL: "info", LF_PROCESS: name },
    stdio: ["ignore", "pipe", "inherit"],
  });
  const w: Worker = { name, proc, lines: [], exited: new Promise((r) => proc.once("exit", (code) => r(code))) };
  createInterface({ input: proc.stdout! }).on("line", (l) => {
    try {
      w.lines.push(JSON.parse(l));
    } catch {
      // not a log line
    }
  });
  workers.push(w);
  return w;
}
const extractStarts = (w: Worker) => w.lines.filter((l) => l.msg === "job started" && l.job === "clip.extract");

beforeAll(async () => {
  srv = await startServer();
  world = await seedWorld();
  await startJobs({ work: false }); // this process only queues; the two workers run the jobs
  coach = await new Client(srv.url).signIn(EMAILS.coach);
});
afterAll(async () => {
  for (const w of workers) if (w.proc.exitCode === null) w.proc.kill("SIGKILL");
  await stopJobs();
  await srv.close();
});

const team = () => `/api/teams/${world.teamId}`;
async function upload(name: string, frames: number, size = "160x90") {
  const file = makeClip(name, { frames, size });
  const r = await tusUpload(srv.url, coach, file, { teamId: world.teamId, filename: name, meta: JSON.stringify(clipMeta({ playerId: world.users[EMAILS.player] })) });
  expect(r.ok, JSON.stringify(r.body)).toBe(true);
  return r.body.clip.id as string;
}
const clip = async (id: string) => (await coach.get(`${team()}/clips/${id}`)).json;
async function untilReady(ids: string[], timeoutMs: number) {
  await waitFor("every clip ready", async () => {
    const all = await Promise.all(ids.map(clip));
    const failed = all.find((c) => c.status === "failed");
    if (failed) throw new Error(`clip failed: ${failed.failureReason}`);
    return all.every((c) => c.status === "ready");
  }, timeoutMs);
}
async function jobsDone(ids: string[]) {
  // The clip turns ready a moment before its job is marked completed (the mail goes in between).
  return waitFor("jobs completed", async () => {
    const jobs = await jobsOf(ids);
    return jobs.every((j) => j.state !== "active" && j.state !== "created" && j.state !== "retry") && jobs;
  }, 10_000);
}
async function jobsOf(ids: string[]) {
  const r = await db().execute<{ id: string; state: string; retry_count: number; clip_id: string }>(
    sql`select id, state, retry_count, data->>'clipId' as clip_id from pgboss.job where name = 'clip.extract'`,
  );
  return r.rows.filter((j) => ids.includes(j.clip_id));
}
function framesOf(id: string) {
  const names = readdirSync(path.join(uploadDir, "clips", id, "frames")).sort();
  return { names, indices: names.map((n) => Number(n.slice(0, 6))) };
}

describe("two worker processes on one database", () => {
  it("spread the jobs across both, none done twice", async () => {
    const a = startWorker("worker-a");
    const b = startWorker("worker-b");
    await waitFor("both workers ready", async () => [a, b].every((w) => w.lines.some((l) => l.msg === "worker ready")), 30_000);

    // Different lengths, so no two files share a checksum (a duplicate would be refused).
    const ids = await Promise.all(Array.from({ length: 6 }, (_, i) => upload(`spread-${i}.mp4`, 40 + i)));
    await untilReady(ids, 60_000);

    const jobs = await jobsDone(ids);
    expect(jobs).toHaveLength(ids.length); // one job per clip
    for (const j of jobs) expect([j.state, j.retry_count]).toEqual(["completed", 0]);
    const startedA = extractStarts(a).map((l) => l.jobId!);
    const startedB = extractStarts(b).map((l) => l.jobId!);
    const all = [...startedA, ...startedB];
    expect(new Set(all).size).toBe(all.length); // no job started twice, by either worker
    expect(all.sort()).toEqual(jobs.map((j) => j.id).sort());
    expect(startedA.length).toBeGreaterThan(0);
    expect(startedB.length).toBeGreaterThan(0);
    console.info(`jobs per worker: a=${startedA.length}, b=${startedB.length}`);

    for (const [i, id] of ids.entries()) {
      const { indices } = framesOf(id);
      expect(indices).toEqual(Array.from({ length: 40 + i }, (_, k) => k + 1));
    }
  });

  it("a worker stopped with SIGTERM mid-job finishes or hands back its job, takes no other, and exits 0", async () => {
    const [a, b] = workers;
    const frames = 900;
    const long = await upload("long-for-stop.mp4", frames, "640x360");
    await waitFor("extraction under way", async () => {
      const c = await clip(long);
      return c.framesDone > 5 && c.framesDone < frames * 0.7;
    }, 30_000);
    const [job] = await jobsOf([long]);
    const owner = [a, b].find((w) => extractStarts(w).some((l) => l.jobId === job.id))!;
    const other = owner === a ? b : a;
    const signalledAt = Date.now();
    owner.proc.kill("SIGTERM");
    // Queued while the stopping worker still drains its job: only the other one may take it.
    const second = await upload("queued-after-stop.mp4", 50);
    expect(await owner.exited).toBe(0);
    const stoppedMs = Date.now() - signalledAt;

    await untilReady([long, second], 60_000);
    const [longJob] = await jobsDone([long]);
    expect(longJob.state).toBe("completed");
    const doneByOwner = owner.lines.find((l) => l.msg === "job done" && l.jobId === longJob.id);
    if (doneByOwner) {
      // Finished in place: it was still running when told to stop, and was not tried again.
      expect(doneByOwner.time).toBeGreaterThanOrEqual(signalledAt);
      expect(longJob.retry_count).toBe(0);
    } else {
      // Handed back (its ffmpeg stopped with the worker): one retry, finished by the other worker.
      expect(longJob.retry_count).toBe(1);
      expect(other.lines.some((l) => l.msg === "job done" && l.jobId === longJob.id)).toBe(true);
    }
    console.info(`worker stopped ${stoppedMs} ms after SIGTERM; its job was ${doneByOwner ? "finished in place" : "handed back and finished by the other worker"}`);
    const [secondJob] = await jobsDone([second]);
    expect(extractStarts(owner).some((l) => l.jobId === secondJob.id)).toBe(false);
    expect(extractStarts(other).some((l) => l.jobId === secondJob.id)).toBe(true);
    expect(framesOf(long).indices).toEqual(Array.from({ length: frames }, (_, k) => k + 1));
    other.proc.kill("SIGTERM");
    expect(await other.exited).toBe(0);
  });
});
