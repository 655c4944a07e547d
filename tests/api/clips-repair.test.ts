// What goes wrong after a clip is stored: extraction fails (reason, mail, retry), a clip is
// deleted mid-extraction, frames vanish, files lose their row, an upload is abandoned.
import { clipMeta, makeClip, storedClipDirs, tusLeftovers, tusUpload, uploadDir, waitFor } from "./clips-support";
import { existsSync, mkdirSync, readdirSync, readFileSync, rmSync, utimesSync, writeFileSync } from "node:fs";
import path from "node:path";
import { randomUUID } from "node:crypto";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Client, EMAILS, mailsTo, seedWorld, startServer, waitForMail, type TestServer } from "./helpers";
import { startJobs, stopJobs } from "../../server/jobs/runtime";
import { extractClip } from "../../server/jobs/clip-extract";
import { sweepClips } from "../../server/jobs/clip-sweep";
import { sweepStaleUploads } from "../../server/clips/uploads";
import { log } from "../../server/log";

let srv: TestServer;
let world: Awaited<ReturnType<typeof seedWorld>>;
let coach: Client;

beforeAll(async () => {
  srv = await startServer();
  world = await seedWorld();
  await startJobs({ work: false }); // jobs are queued; this file runs them itself, step by step
  coach = await new Client(srv.url).signIn(EMAILS.coach);
});
afterAll(async () => {
  await stopJobs();
  await srv.close();
});

const team = () => `/api/teams/${world.teamId}`;
const run = (id: string) => extractClip(id, { log, lastAttempt: false });
const get = async (id: string) => (await coach.get(`${team()}/clips/${id}`)).json;

let made = 0;
/** Each clip a different length, so no two are the same file (the duplicate check). */
async function upload(who: Client, name: string, o: Parameters<typeof makeClip>[1] = {}) {
  const file = makeClip(name, { frames: 20 + made++, size: "160x90", ...o });
  const r = await tusUpload(srv.url, who, file, { teamId: world.teamId, filename: name, meta: JSON.stringify(clipMeta({ playerId: world.users[EMAILS.player], title: name })) });
  expect(r.ok, JSON.stringify(r.body)).toBe(true);
  return r.body.clip.id as string;
}

describe("failed extraction", () => {
  it("ends failed with ffmpeg's reason (not retried), mails the uploader, and retries on request", async () => {
    const id = await upload(coach, "spoilt.mp4");
    const original = path.join(uploadDir, "clips", id, "original");
    const good = readFileSync(original);
    writeFileSync(original, Buffer.from("this is no longer a video".repeat(100))); // spoilt after the probe
    expect(await run(id)).toBe("failed"); // deterministic: no throw, so pg-boss would not retry
    const failed = await get(id);
    expect(failed.status).toBe("failed");
    expect(failed.failureReason).toMatch(/could not read the input|Invalid data/i);
    const mail = await waitForMail(EMAILS.coach, /could not be processed: spoilt\.mp4/);
    expect(mail.text).toContain("Reason:");

    writeFileSync(original, good);
    const retried = await coach.post(`${team()}/clips/${id}/retry`);
    expect(retried.status).toBe(200);
    expect(retried.json).toMatchObject({ status: "extracting", failureReason: null });
    expect(await run(id)).toBe("ready");
    expect((await get(id)).frameCount).toBe(20); // the first upload of this file
  });

  it("sends no mail when the uploader turned it off", async () => {
    const analyst = await new Client(srv.url).signIn(EMAILS.analyst);
    expect((await analyst.patch("/api/me/prefs", { notifyClipReady: false })).status).toBe(200);
    const id = await upload(analyst, "quiet.mp4");
    expect(await run(id)).toBe("ready");
    await new Promise((r) => setTimeout(r, 500));
    expect((await mailsTo(EMAILS.analyst)).filter((m) => /quiet\.mp4/.test(m.subject))).toEqual([]);
  });
});

describe("deleting while frames are being extracted", () => {
  it("stops the job and leaves no file behind", async () => {
    const id = await upload(coach, "long.mp4", { frames: 900, size: "640x360" });
    const job = run(id);
    await waitFor("frames under way", async () => (await get(id)).framesDone > 20, 30_000);
    expect((await coach.del(`${team()}/clips/${id}`)).status).toBe(204);
    expect(await job).toBe("skipped");
    expect(storedClipDirs()).not.toContain(id);
    expect((await coach.get(`${team()}/clips/${id}`)).status).toBe(404);
  });
});

describe("the repair sweep", () => {
  it("re-extracts a ready clip whose frames went missing", async () => {
    const id = await upload(coach, "lost-frames.mp4");
    expect(await run(id)).toBe("ready");
    const { frameCount } = await get(id);
    rmSync(path.join(uploadDir, "clips", id, "frames", `${String(frameCount).padStart(6, "0")}.jpg`));
    const report = await sweepClips(log);
    expect(report.reextract).toContain(id);
    expect((await get(id)).status).toBe("extracting");
    expect(await run(id)).toBe("ready");
    expect(readdirSync(path.join(uploadDir, "clips", id, "frames"))).toHaveLength(frameCount);
  });

  it("queues an extracting clip that has no job", async () => {
    const id = await upload(coach, "no-job.mp4");
    const { sql } = await import("drizzle-orm");
    const { db } = await import("../../server/db/client");
    await db().execute(sql`delete from pgboss.job where data->>'clipId' = ${id}`);
    await db().execute(sql`update clip set updated_at = now() - interval '1 hour' where id = ${id}`);
    const report = await sweepClips(log);
    expect(report.requeued).toContain(id);
    const jobs = await db().execute(sql`select state from pgboss.job where name = 'clip.extract' and data->>'clipId' = ${id}`);
    expect(jobs.rows).toEqual([{ state: "created" }]);
  });

  it("removes files that no clip row owns, once they are old enough", async () => {
    const orphan = randomUUID();
    const dir = path.join(uploadDir, "clips", orphan, "frames");
    mkdirSync(dir, { recursive: true });
    writeFileSync(path.join(dir, "000001.jpg"), "x");
    expect((await sweepClips(log)).orphansRemoved).not.toContain(orphan); // fresh: an ingest may be storing it
    const old = new Date(Date.now() - 3600_000);
    utimesSync(path.join(dir, "000001.jpg"), old, old);
    expect((await sweepClips(log)).orphansRemoved).toContain(orphan);
    expect(existsSync(path.join(uploadDir, "clips", orphan))).toBe(false);
  });

  it("removes an abandoned upload after a day without a byte", async () => {
    const r = await fetch(`${srv.url}/api/uploads`, {
      method: "POST",
      headers: {
        "tus-resumable": "1.0.0", "upload-length": "5000", origin: "http://127.0.0.1:3000",
        cookie: [...(coach as unknown as { cookies: Map<string, string> }).cookies].map(([k, v]) => `${k}=${v}`).join("; "),
        "upload-metadata": `teamId ${Buffer.from(world.teamId).toString("base64")},meta ${Buffer.from(JSON.stringify(clipMeta({ playerId: world.users[EMAILS.player] }))).toString("base64")}`,
      },
    });
    expect(r.status).toBe(201);
    expect(tusLeftovers()).toHaveLength(2); // the data file and its info
    expect(await sweepStaleUploads()).toBe(0);
    const old = new Date(Date.now() - 25 * 3600_000);
    for (const n of tusLeftovers()) utimesSync(path.join(uploadDir, ".tus", n), old, old);
    expect(await sweepStaleUploads()).toBe(1);
    expect(tusLeftovers()).toEqual([]);
  });
});
