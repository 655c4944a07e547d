// ffmpeg hangs (a stand-in that sleeps, via FFMPEG_PATH): the progress watchdog of the media
// wrapper stops it and everything it started, and the clip shows failed with the reason; no
// frame, temp folder or live job is left behind. Runs through the real queue, with the
// extraction's retries turned off so one stalled attempt is the last.
import { clipMeta, makeClip, tusUpload, uploadDir, waitFor } from "../api/clips-support";
import { existsSync, mkdtempSync, readdirSync, readFileSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { sql } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Client, EMAILS, seedWorld, startServer, type TestServer } from "../api/helpers";
import { env } from "../../server/env";
import { jobPolicies } from "../../server/jobs/types";
import { startJobs, stopJobs } from "../../server/jobs/runtime";
import { db } from "../../server/db/client";

const pids = path.join(mkdtempSync(path.join(os.tmpdir(), "lf-hang-")), "pids");
let srv: TestServer;
let world: Awaited<ReturnType<typeof seedWorld>>;
let coach: Client;

beforeAll(async () => {
  srv = await startServer();
  world = await seedWorld();
  process.env.HANG_PIDS = pids;
  env().FFMPEG_PATH = path.resolve("tests/slow/fixtures/ffmpeg-hangs"); // ffprobe stays real: the upload is fine
  jobPolicies["clip.extract"].retryLimit = 0;
  await startJobs({ work: true });
  coach = await new Client(srv.url).signIn(EMAILS.coach);
});
afterAll(async () => {
  await stopJobs();
  await srv.close();
});

/** Running (a zombie waiting to be reaped counts as gone). */
const alive = (pid: number) => {
  try {
    return !/^\d+ \(.*\) Z/.test(readFileSync(`/proc/${pid}/stat`, "utf8"));
  } catch {
    return false;
  }
};

describe("ffmpeg hangs", () => {
  it("is stopped by the time limit and the clip shows failed with the reason", async () => {
    const file = makeClip("hang.mp4", { frames: 30, size: "160x90" });
    const r = await tusUpload(srv.url, coach, file, { teamId: world.teamId, filename: "hang.mp4", meta: JSON.stringify(clipMeta({ playerId: world.users[EMAILS.player] })) });
    expect(r.ok, JSON.stringify(r.body)).toBe(true);
    const id = r.body.clip.id as string;
    const t0 = Date.now();
    await waitFor("the stand-in started", async () => existsSync(pids), 20_000);
    const [shell, child] = readFileSync(pids, "utf8").trim().split(/\s+/).map(Number);
    expect(alive(child)).toBe(true);

    const failed = await waitFor("clip failed", async () => {
      const c = (await coach.get(`/api/teams/${world.teamId}/clips/${id}`)).json;
      return c.status === "failed" && c;
    }, 90_000);
    const seconds = (Date.now() - t0) / 1000;
    console.info(`hung ffmpeg stopped and clip failed after ${seconds.toFixed(1)} s: ${failed.failureReason}`);
    expect(failed.failureReason).toMatch(/ffmpeg made no progress for \d+ s and was stopped|ffmpeg ran longer than the \d+ s limit/);
    // The whole process group goes (SIGTERM, then SIGKILL after the wrapper's grace).
    await waitFor("stand-in and its child gone", async () => !alive(shell) && !alive(child), 5_000);
    expect(failed.framesDone).toBe(0);
    expect(existsSync(path.join(uploadDir, "clips", id, "frames")) ? readdirSync(path.join(uploadDir, "clips", id, "frames")) : []).toEqual([]);
    expect(existsSync(path.join(uploadDir, ".jobs")) ? readdirSync(path.join(uploadDir, ".jobs")) : []).toEqual([]);
    // The original stays, so "Try again" can work once ffmpeg is fixed.
    expect(existsSync(path.join(uploadDir, "clips", id, "original"))).toBe(true);
    // The job ends (completed: the failure is the clip's state, not an error to retry).
    await waitFor("job finished", async () => {
      const r = await db().execute<{ state: string }>(sql`select state from pgboss.job where name = 'clip.extract' and data->>'clipId' = ${id}`);
      return r.rows.length === 1 && r.rows[0].state === "completed";
    }, 10_000);
  });
});
