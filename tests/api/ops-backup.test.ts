// scripts/backup then scripts/restore into a fresh, throwaway PostgreSQL cluster: every clip,
// shot (with its marks), result, stick and member comes back identical, and so does every clip
// file byte for byte. A damaged backup and a restore over existing data are refused.
import { clipMeta, makeClip, tusUpload, uploadDir } from "./clips-support";
import { execFile } from "node:child_process";
import { createHash } from "node:crypto";
import { appendFileSync, mkdtempSync, readdirSync, readFileSync, rmSync, statSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { promisify } from "node:util";
import pg from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Client, EMAILS, seedWorld, startServer, type TestServer } from "./helpers";
import { startJobs, stopJobs } from "../../server/jobs/runtime";
import { extractClip } from "../../server/jobs/clip-extract";
import { db } from "../../server/db/client";
import { shot, shotResult, stick } from "../../server/db/schema";
import { recordAudit } from "../../server/entities/audit/repository";
import { log } from "../../server/log";
import { startCluster, type Cluster } from "../slow/lib/pg-cluster";

const run = promisify(execFile);
let srv: TestServer;
let world: Awaited<ReturnType<typeof seedWorld>>;
let cluster: Cluster;
const backupRoot = mkdtempSync(path.join(os.tmpdir(), "lf-backups-"));
const restoredUploads = mkdtempSync(path.join(os.tmpdir(), "lf-restored-"));
let backup = "";

const TABLES = ["clip", "shot", "shot_result", "stick", "member", '"user"', "organization", "training_session", "audit_log"];

beforeAll(async () => {
  [srv, cluster] = await Promise.all([startServer(), startCluster("restore")]);
  world = await seedWorld();
  await startJobs({ work: false });
  const coach = await new Client(srv.url).signIn(EMAILS.coach);
  for (const [i, frames] of [24, 31].entries()) {
    const r = await tusUpload(srv.url, coach, makeClip(`backup-${i}.mp4`, { frames, size: "160x90" }), {
      teamId: world.teamId, filename: `backup-${i}.mp4`, meta: JSON.stringify(clipMeta({ playerId: world.users[EMAILS.player], captureFps: 3200, captureFpsConfirmed: true })),
    });
    expect(r.ok, JSON.stringify(r.body)).toBe(true);
    expect(await extractClip(r.body.clip.id, { log, lastAttempt: true })).toBe("ready");
    const [s] = await db().insert(shot).values({
      teamId: world.teamId, clipId: r.body.clip.id, playerId: world.users[EMAILS.player], label: `Shot ${i + 1}`, frameStart: 2, frameEnd: frames - 1,
      marks: { puck: [[3, 101.5, 44.25], [4, 118.75, 43.5]], bladeHeel: [[3, 60, 70]] }, events: { puckStrike: 3, release: 9 }, version: 4,
    }).returning();
    await db().insert(shotResult).values({ shotId: s.id, teamId: world.teamId, engineVersion: "test-1", shotVersion: 4, results: { puckExitSpeed: { valueMps: 38.4 + i, uncertaintyMps: 0.7 } } });
  }
  await db().insert(stick).values({ teamId: world.teamId, label: "Backup stick", ratedFlex: 85 });
  await recordAudit({ teamId: world.teamId, actorId: null, action: "stick.deleted", targetType: "stick", detail: { label: "gone" } });
}, 120_000);
afterAll(async () => {
  await stopJobs();
  await srv.close();
  cluster?.destroy();
  for (const d of [backupRoot, restoredUploads]) rmSync(d, { recursive: true, force: true });
});

const env = (over: Record<string, string>) => ({ ...process.env, UPLOAD_DIR: uploadDir, ...over });
async function tableRows(url: string) {
  const c = new pg.Client({ connectionString: url });
  await c.connect();
  try {
    const out: Record<string, unknown[]> = {};
    for (const t of TABLES) out[t] = (await c.query(`select * from ${t} order by 1`)).rows;
    return out;
  } finally {
    await c.end();
  }
}
function fileHashes(root: string) {
  const out: Record<string, string> = {};
  const walk = (rel: string) => {
    for (const name of readdirSync(path.join(root, rel))) {
      const r = path.join(rel, name);
      if (statSync(path.join(root, r)).isDirectory()) walk(r);
      else out[r] = createHash("sha256").update(readFileSync(path.join(root, r))).digest("hex");
    }
  };
  walk("clips");
  return out;
}

describe("backup and restore", () => {
  it("backs up the database and every clip file into one timestamped folder", async () => {
    const { stdout } = await run("scripts/backup", ["--out", backupRoot], { env: env({}) });
    expect(stdout).toMatch(/2 clips, 2 shots, 2 shot results, \d+ clip files/);
    const [name] = readdirSync(backupRoot);
    expect(name).toMatch(/^loadframe-\d{8}-\d{6}Z$/);
    backup = path.join(backupRoot, name);
    expect(readdirSync(backup).sort()).toEqual(["SHA256SUMS", "database.dump", "manifest.json", "media.tar"]);
    // pg_dump's custom format starts with the magic "PGDMP" (PostgreSQL docs, pg_dump -Fc).
    expect(readFileSync(path.join(backup, "database.dump")).subarray(0, 5).toString()).toBe("PGDMP");
    const manifest = JSON.parse(readFileSync(path.join(backup, "manifest.json"), "utf8"));
    expect(manifest.counts).toMatchObject({ clips: 2, shots: 2, shotResults: 2, sticks: 1 });
    expect(manifest.counts.mediaFiles).toBe(Object.keys(fileHashes(uploadDir)).length);
  }, 60_000);

  it("restores into a fresh cluster with every clip, mark, result and file identical", async () => {
    const { stdout } = await run("scripts/restore", [backup, "--database", "loadframe_restored", "--upload-dir", restoredUploads], {
      env: env({ DATABASE_URL: cluster.url("postgres") }),
    });
    expect(stdout).toMatch(/Restored 2 clips, 2 shots, 2 results and \d+ clip files into loadframe_restored/);
    const [before, after] = await Promise.all([tableRows(process.env.DATABASE_URL!), tableRows(cluster.url("loadframe_restored"))]);
    for (const t of TABLES) expect(after[t], t).toEqual(before[t]);
    expect(after.clip).toHaveLength(2);
    expect((after.shot as { marks: unknown }[]).map((s) => s.marks)).toEqual([
      { puck: [[3, 101.5, 44.25], [4, 118.75, 43.5]], bladeHeel: [[3, 60, 70]] },
      { puck: [[3, 101.5, 44.25], [4, 118.75, 43.5]], bladeHeel: [[3, 60, 70]] },
    ]);
    const src = fileHashes(uploadDir);
    expect(Object.keys(src).filter((k) => k.includes(`${path.sep}frames${path.sep}`))).toHaveLength(24 + 31);
    expect(fileHashes(restoredUploads)).toEqual(src);
  }, 60_000);

  it("refuses to restore over a database that holds data, or a damaged backup", async () => {
    const again = run("scripts/restore", [backup, "--database", "loadframe_restored", "--upload-dir", `${restoredUploads}-r2`], {
      env: env({ DATABASE_URL: cluster.url("postgres") }),
    });
    await expect(again).rejects.toMatchObject({ stderr: expect.stringMatching(/already holds data.*--force/) });
    appendFileSync(path.join(backup, "media.tar"), "x");
    const damaged = run("scripts/restore", [backup, "--database", "loadframe_other", "--upload-dir", `${restoredUploads}-r3`], {
      env: env({ DATABASE_URL: cluster.url("postgres") }),
    });
    await expect(damaged).rejects.toMatchObject({ stderr: expect.stringMatching(/damaged/) });
  }, 60_000);
});
