// The web process and two separate worker processes on S3-compatible storage (s3rver on
// loopback): a clip uploaded to the web process is extracted and its shot tracked by the workers,
// never by the web process; a worker killed mid-run (kill -9) leaves no proposals, and the sweep
// hands its job to the other worker, which finishes the run.
import { uploadDir, waitFor } from "./clips-support";
import { spawn, type ChildProcess } from "node:child_process";
import { createInterface } from "node:readline";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Client, EMAILS, seedWorld, startServer, type TestServer } from "./helpers";
import { newShot, renderedShot, runOf, seedsOf, untilFinished, uploadReadyClip } from "./tracking-support";
import { startFakeS3, fakeCredentials } from "../unit/storage/fake-s3";
import { setStorageForTests } from "../../server/clips/deps";
import { queue, startJobs, stopJobs } from "../../server/jobs/runtime";

interface LogLine { msg: string; job?: string; jobId?: string }
interface Worker { name: string; proc: ChildProcess; lines: LogLine[] }

let srv: TestServer;
let world: Awaited<ReturnType<typeof seedWorld>>;
let analyst: Client;
let s3: Awaited<ReturnType<typeof startFakeS3>>;
const workers: Worker[] = [];

function startWorker(name: string): Worker {
  const proc = spawn(process.execPath, ["--import", "tsx", "server/worker.ts"], {
    env: {
      ...process.env, LOG_LEVEL: "info", LF_PROCESS: name, STORAGE: "s3", S3_ENDPOINT: s3.endpoint, S3_BUCKET: s3.bucket,
      S3_ACCESS_KEY_ID: fakeCredentials.accessKeyId, S3_SECRET_ACCESS_KEY: fakeCredentials.secretAccessKey, UPLOAD_DIR: uploadDir, TRACK_STALE_SECONDS: "2",
    },
    stdio: ["ignore", "pipe", "inherit"],
  });
  const w: Worker = { name, proc, lines: [] };
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
const started = (w: Worker, job: string) => w.lines.filter((l) => l.msg === "job started" && l.job === job).map((l) => l.jobId!);

beforeAll(async () => {
  s3 = await startFakeS3("loadframe-tracking");
  setStorageForTests(s3.storage());
  srv = await startServer();
  world = await seedWorld();
  await startJobs({ work: false }); // the web process only queues: the two workers run every job
  analyst = await new Client(srv.url).signIn(EMAILS.analyst);
  const a = startWorker("worker-a");
  const b = startWorker("worker-b");
  await waitFor("both workers ready", async () => [a, b].every((w) => w.lines.some((l) => l.msg === "worker ready")), 60_000);
}, 120_000);
afterAll(async () => {
  for (const w of workers) if (w.proc.exitCode === null && w.proc.signalCode === null) w.proc.kill("SIGKILL");
  await stopJobs();
  await srv.close();
  setStorageForTests(undefined);
  await s3.stop();
});

describe("web process + two worker processes on S3-compatible storage", () => {
  it("a clip is extracted and its shot tracked by the workers, not the web process", async () => {
    const shot = await renderedShot(240);
    const clipId = await uploadReadyClip(srv.url, analyst, world.teamId, world.users[EMAILS.player], shot.file, 240);
    expect((await s3.storage().list(`clips/${clipId}/frames/`)).length).toBe(shot.truth.frameCount);
    const shotId = await newShot(analyst, world.teamId, clipId, shot.truth.frameCount);
    const r = await analyst.post(`/api/teams/${world.teamId}/shots/${shotId}/tracking`, { seedFrame: 1, seeds: seedsOf(shot.truth, 1) });
    expect(r.status).toBe(202);
    const run = await untilFinished(analyst, world.teamId, shotId);
    expect(run.status, run.failureReason).toBe("done");
    expect(Object.keys(run.proposals.tracks).sort()).toEqual(Object.keys(shot.truth.tracks).sort());
    const extractedBy = workers.filter((w) => started(w, "clip.extract").length);
    const trackedBy = workers.filter((w) => started(w, "shot.track").length);
    expect(extractedBy.length).toBeGreaterThan(0);
    expect(trackedBy).toHaveLength(1);
    console.info(`extracted by ${extractedBy.map((w) => w.name).join(", ")}; tracked by ${trackedBy[0].name}`);
  });

  it("a worker killed mid-run leaves no proposals; the sweep hands the job to the other worker, which finishes it", async () => {
    const shot = await renderedShot(3200);
    const clipId = await uploadReadyClip(srv.url, analyst, world.teamId, world.users[EMAILS.player], shot.file, 3200);
    const shotId = await newShot(analyst, world.teamId, clipId, shot.truth.frameCount);
    await analyst.post(`/api/teams/${world.teamId}/shots/${shotId}/tracking`, { seedFrame: 1, seeds: seedsOf(shot.truth, 1) });
    const mid = await waitFor("run under way", async () => {
      const run = await runOf(analyst, world.teamId, shotId);
      return run?.status === "running" && run.phase === "tracking" && run.done > 50 && run.done < run.total * 0.8 && run;
    }, 60_000);
    const [a, b] = workers.slice(0, 2);
    // The worker with a tracking job started and not done.
    const busy = (w: Worker) => started(w, "shot.track").some((id) => !w.lines.some((l) => l.msg === "job done" && l.jobId === id));
    const owner = [a, b].find(busy)!;
    expect(owner).toBeDefined();
    const other = owner === a ? b : a;
    owner.proc.kill("SIGKILL");
    expect(mid.proposals).toBeNull();

    await new Promise((res) => setTimeout(res, 2500)); // > TRACK_STALE_SECONDS without progress
    const killed = await runOf(analyst, world.teamId, shotId);
    expect(killed.status).toBe("running");
    expect(killed.proposals).toBeNull(); // nothing half-written
    await queue().send("clip.sweep", {});
    const run = await untilFinished(analyst, world.teamId, shotId, 120_000);
    expect(run.status, run.failureReason).toBe("done");
    expect(run.proposals.tracks.puck.marks.length).toBeGreaterThan(200);
    expect(started(other, "shot.track").length).toBeGreaterThan(0);
  }, 240_000); // its own waits add up to 180 s on a loaded machine
});
