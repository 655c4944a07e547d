// A worker killed mid-extraction (kill -9, as a crash or the OOM killer would): the sweep hands
// its job back to the queue, another worker retries it, and the clip ends ready with every frame
// exactly once.
import { clipMeta, makeClip, tusUpload, uploadDir, waitFor } from "./clips-support";
import { spawn, execFileSync, type ChildProcess } from "node:child_process";
import { readdirSync } from "node:fs";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Client, EMAILS, seedWorld, startServer, type TestServer } from "./helpers";
import { queue, startJobs, stopJobs } from "../../server/jobs/runtime";

let srv: TestServer;
let world: Awaited<ReturnType<typeof seedWorld>>;
let coach: Client;
const workers: ChildProcess[] = [];

function startWorker() {
  const w = spawn(process.execPath, ["--import", "tsx", "server/worker.ts"], {
    env: { ...process.env, CLIP_STALE_SECONDS: "2", LOG_LEVEL: "warn", LF_PROCESS: "worker" },
    stdio: ["ignore", "ignore", "inherit"],
  });
  workers.push(w);
  return w;
}
/** The worker and the ffmpeg it started, as a machine crash would end them. */
function crash(w: ChildProcess) {
  const children = execFileSync("ps", ["-o", "pid=", "--ppid", String(w.pid)], { encoding: "utf8" }).trim().split(/\s+/).filter(Boolean).map(Number);
  w.kill("SIGKILL");
  for (const pid of children) {
    try {
      process.kill(pid, "SIGKILL");
    } catch {
      // already gone
    }
  }
}

beforeAll(async () => {
  srv = await startServer();
  world = await seedWorld();
  await startJobs({ work: false }); // this process only sends; the child workers run the jobs
  coach = await new Client(srv.url).signIn(EMAILS.coach);
});
afterAll(async () => {
  const running = workers.filter((w) => w.exitCode === null && w.signalCode === null);
  await Promise.all(running.map((w) => new Promise((r) => w.once("exit", r).kill("SIGTERM"))));
  await stopJobs();
  await srv.close();
});

describe("a worker killed mid-extraction", () => {
  it("is retried by another worker; the clip ends ready with no duplicate frames", async () => {
    const file = makeClip("long.mp4", { frames: 900, size: "640x360", fps: 30 });
    const team = `/api/teams/${world.teamId}`;
    const r = await tusUpload(srv.url, coach, file, {
      teamId: world.teamId, filename: "long.mp4", meta: JSON.stringify(clipMeta({ playerId: world.users[EMAILS.player] })),
    });
    expect(r.ok, JSON.stringify(r.body)).toBe(true);
    const id = r.body.clip.id;

    const first = startWorker();
    const atKill = await waitFor("frames under way", async () => {
      const c = (await coach.get(`${team}/clips/${id}`)).json;
      return c.framesDone > 20 && c.framesDone < 900 && c;
    }, 30_000);
    crash(first);
    expect(atKill.status).toBe("extracting");

    const second = startWorker();
    await new Promise((res) => setTimeout(res, 2500)); // > CLIP_STALE_SECONDS without progress
    await queue().send("clip.sweep", {}); // as the schedule or a start-up would
    const ready = await waitFor("ready after retry", async () => {
      const c = (await coach.get(`${team}/clips/${id}`)).json;
      if (c.status === "failed") throw new Error(c.failureReason);
      return c.status === "ready" && c;
    }, 45_000);
    expect(second.exitCode).toBeNull(); // the retry ran in the second worker, which is still up
    expect(ready.frameCount).toBe(900);
    expect(ready.frameTimes).toHaveLength(900);
    const names = readdirSync(path.join(uploadDir, "clips", id, "frames")).sort();
    expect(names).toHaveLength(900);
    expect(names[0]).toBe("000001.jpg");
    expect(names[899]).toBe("000900.jpg");
    expect(new Set(names).size).toBe(900);
  });
});
