// Auto-digitise end to end (issue 17, decision 151), for bench:track: a generated 1280×720 slap
// shot at 3,200 fps, 480 frames, six landmarks seeded on frame 1. One web process (this one,
// queueing only) and one worker process on a throwaway database; the clip uploaded and extracted
// as any clip, then timed from the button (POST …/tracking) to all proposals stored (the run's row
// done). Raw baseline in the same run, rounds interleaved with the job's: the clip decoded with
// `ffmpeg -i clip -f rawvideo -pix_fmt gray -` (read and thrown away), plus the tracker's own
// matchTemplate calls (recorded from one tracking of the same frames, replayed alone). Prints
// figures; asserts nothing. Needs the private cluster (PG_ADMIN_URL, from scripts/with-db).
// Each round also prints the worker's own breakdown of its CPU (its "tracking run done" log line,
// decision 156), and the worker's CPU from its start to ready (its tracker's warm-up included,
// decision 157), which no round includes. To profile the worker: BENCH_WORKER_FLAGS="--cpu-prof --cpu-prof-dir=…" or
// "--trace-gc" (node flags for the worker process), BENCH_WORKER_LOG=file for its non-log output.
import { spawn, type ChildProcess } from "node:child_process";
import { appendFileSync, mkdtempSync, readFileSync, rmSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { createInterface } from "node:readline";
import { randomBytes } from "node:crypto";
import pg from "pg";
import { renderClip } from "../demo/render-scene";
import type { SceneOptions } from "../demo/shot-scene";
import { TRACK_LOOKS, TRACK_SHOTS, seedsAt, shotClip } from "../../tests/unit/tracking/support/shot-clips";
import { createCvMatcher, type Matcher, type Rect } from "../../shared/tracking/matcher";
import { loadOpenCv } from "../../shared/tracking/opencv";
import { trackShot } from "../../shared/tracking/shot-tracker";
import type { Landmark } from "../../shared/schemas/shot-document";
import type { Vec2 } from "../../shared/tracking/regions";
import type { GrayFrame } from "../../shared/tracking/types";
import type { RunCost } from "../../server/tracking/run-cost";

const fmt = (n: number, d = 0) => n.toLocaleString("en-GB", { maximumFractionDigits: d, minimumFractionDigits: d });
const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
const load = () => os.loadavg().map((l) => l.toFixed(2)).join(" ");
/** The 480-frame shot: ice strike on frame 200 so the puck is in the picture for most of it. */
export const JOB_SCENE = { ...TRACK_SHOTS[3200], frames: 480, iceStrikeFrame: 200 };

/** One round's worker CPU as the worker's own log of the run breaks it down. */
function describeCost(own: number, c: RunCost | undefined) {
  if (!c) return `worker ${fmt(own, 2)} CPU-s (no breakdown logged)`;
  const major = (c.gc.incremental?.count ?? 0) + (c.gc.major?.count ?? 0);
  const gcPause = Object.values(c.gc).reduce((s, g) => s + g.seconds, 0);
  const run = c.phases.find((p) => p.phase === "decode and track");
  return [
    `worker ${fmt(own, 2)} CPU-s`,
    c.threads ? ` (JavaScript thread ${fmt(c.threads.main, 2)}, other threads ${fmt(c.threads.other, 2)})` : "",
    run ? `, decode and track ${fmt(run.user, 2)} user + ${fmt(run.system, 2)} system` : "",
    `, full collections ${major}, young ${c.gc.minor?.count ?? 0}, pauses ${fmt(gcPause, 2)} s`,
    c.minorFaults !== null ? `, ${fmt(c.minorFaults)} page faults` : "",
  ].join("");
}

/** CPU seconds of a process itself and of its waited-for children (ffmpeg), from /proc. */
function cpuParts(pid: number) {
  const f = readFileSync(`/proc/${pid}/stat`, "utf8").split(") ")[1].split(" ");
  // fields 14–17 of stat (utime stime cutime cstime) are 12–15 here, after pid and comm
  return { own: (Number(f[11]) + Number(f[12])) / 100, children: (Number(f[13]) + Number(f[14])) / 100 };
}

async function decodeAlone(mp4: string, bytesExpected: number) {
  const t0 = performance.now();
  const p = spawn("ffmpeg", ["-nostdin", "-v", "error", "-i", mp4, "-f", "rawvideo", "-pix_fmt", "gray", "-"], { stdio: ["ignore", "pipe", "inherit"] });
  let bytes = 0;
  p.stdout.on("data", (b: Buffer) => (bytes += b.length));
  const code = await new Promise<number | null>((r) => p.on("close", r));
  if (code !== 0 || bytes !== bytesExpected) throw new Error(`ffmpeg gave ${bytes} of ${bytesExpected} bytes (exit ${code})`);
  return (performance.now() - t0) / 1000;
}

/** `scene`: a smaller shot to check the bench itself works (`--smoke`), not to measure. */
export async function benchTrackJob(rounds: number, scene: SceneOptions = JOB_SCENE) {
  const adminUrl = process.env.PG_ADMIN_URL!;
  const dbName = `loadframe_bench_track_${process.pid}`;
  const dbUrl = Object.assign(new URL(adminUrl), { pathname: `/${dbName}` }).toString();
  const admin = async (q: string) => {
    const c = new pg.Client({ connectionString: adminUrl });
    await c.connect();
    await c.query(q).finally(() => c.end());
  };
  const work = mkdtempSync(path.join(os.tmpdir(), "lf-bench-job-"));
  let worker: ChildProcess | undefined;
  let close: (() => Promise<void>) | undefined;
  let stopJobs: (() => Promise<void>) | undefined;
  const fps = scene.captureFps as 240 | 1000 | 3200;
  console.log(`\nAuto-digitise job end to end: 1280×720, ${scene.frames} frames at ${fps} fps, six landmarks seeded on frame 1, one worker process`);
  try {
    const rendered = await renderClip([scene], { look: TRACK_LOOKS[fps] });
    const truth = rendered.scenes[0];
    const seeds = seedsAt(truth, 1) as Partial<Record<Landmark, Vec2>>;
    const clip = path.join(work, "shot.mp4");
    // Private copies: the render cache is shared with every other run on the machine, which may clear it.
    const baselineClip = path.join(work, "baseline.mp4");
    await import("node:fs/promises").then(async (fs) => (await fs.copyFile(rendered.mp4, clip), await fs.copyFile(rendered.mp4, baselineClip)));

    // The raw baseline's matching: the calls one tracking of these frames makes, recorded.
    const { cv } = await loadOpenCv();
    const matcher = createCvMatcher(cv);
    const calls: { frame: GrayFrame; window: Rect; template: GrayFrame; mask?: GrayFrame | null }[] = [];
    const recorder: Matcher = {
      match: (frame, window, template, mask) => (calls.push({ frame, window, template, mask }), matcher.match(frame, window, template, mask)),
      turn: (...a) => matcher.turn(...a),
      dispose() {},
    };
    const frames = await shotClip(scene, TRACK_LOOKS[fps]);
    const inProcess = await trackShot({ frames: frames.source, first: 1, last: truth.frameCount, seedFrame: 1, seeds }, undefined, { matcher: recorder });
    const landmarkFrames = Object.values(inProcess.tracks).reduce((n, t) => n + t!.proposals.length, 0);
    const replay = () => {
      const t0 = performance.now();
      for (const c of calls) matcher.match(c.frame, c.window, c.template, c.mask);
      return (performance.now() - t0) / 1000;
    };

    // A throwaway database, this process as the web process (queueing only), one worker process.
    await admin(`create database ${dbName}`);
    Object.assign(process.env, {
      DATABASE_URL: dbUrl, NODE_ENV: "test", LOG_LEVEL: "silent", RATE_LIMIT: "false", EMBEDDED_WORKER: "false", UPLOAD_DIR: path.join(work, "uploads"),
      AUTH_SECRET: process.env.AUTH_SECRET ?? randomBytes(32).toString("hex"), PUBLIC_URL: "http://127.0.0.1:3000",
    });
    const { runMigrations } = await import("../../server/db/migrate");
    await runMigrations(dbUrl);
    const { Client, EMAILS, seedWorld, startServer } = await import("../../tests/api/helpers");
    const { clipMeta, tusUpload, uploadDir, mediaDir } = await import("../../tests/api/clips-support");
    for (const d of [uploadDir, mediaDir]) rmSync(d, { recursive: true, force: true }); // made on import; this run uses its own
    process.env.UPLOAD_DIR = path.join(work, "uploads");
    const jobs = await import("../../server/jobs/runtime");
    stopJobs = jobs.stopJobs;
    const srv = await startServer();
    close = srv.close;
    const world = await seedWorld();
    await jobs.startJobs({ work: false });
    worker = spawn(process.execPath, [...(process.env.BENCH_WORKER_FLAGS?.split(" ").filter(Boolean) ?? []), "--import", "tsx", "server/worker.ts"], { env: { ...process.env, LOG_LEVEL: "info", LF_PROCESS: "bench-worker" }, stdio: ["ignore", "pipe", "inherit"] });
    const costs: RunCost[] = [];
    let warmUp: { seconds?: number; landmarkFrames?: number } | undefined;
    let costSeen = () => {};
    const ready = new Promise<void>((resolve, reject) => {
      createInterface({ input: worker!.stdout! }).on("line", (l) => {
        if (l.includes('"tracker warmed up"')) warmUp = JSON.parse(l);
        if (l.includes('"worker ready"')) resolve();
        if (l.includes('"tracking run done"')) {
          costs.push(JSON.parse(l).cost);
          costSeen();
        }
        if (process.env.BENCH_WORKER_LOG && (!l.startsWith("{") || l.includes('"job started"'))) appendFileSync(process.env.BENCH_WORKER_LOG, `${l}\n`);
      });
      worker!.once("exit", (c) => reject(new Error(`the worker stopped (exit ${c})`)));
    });
    await ready;
    // Paid once when a worker starts, before any job (decision 157); the rounds below do not include it.
    const atReady = cpuParts(worker.pid!);
    console.log(`  worker start: ${fmt(atReady.own, 2)} CPU-s to ready, the tracker's warm-up taking ${warmUp ? `${fmt(warmUp.seconds ?? 0, 2)} s (${warmUp.landmarkFrames} landmark-frames)` : "not logged"}`);
    const analyst = await new Client(srv.url).signIn(EMAILS.analyst);
    const team = `/api/teams/${world.teamId}`;
    const up = await tusUpload(srv.url, analyst, clip, {
      teamId: world.teamId, filename: "shot.mp4",
      meta: JSON.stringify(clipMeta({ playerId: world.users[EMAILS.player], title: "Bench: auto-digitise", captureFps: fps, captureFpsConfirmed: true })),
    });
    if (!up.ok) throw new Error(`upload failed: ${JSON.stringify(up.body)}`);
    const clipId = up.body.clip.id as string;
    for (let t = Date.now(); ; ) {
      const c = (await analyst.get(`${team}/clips/${clipId}`)).json;
      if (c.status === "ready") break;
      if (c.status === "failed" || Date.now() - t > 300_000) throw new Error(`the clip did not become ready: ${c.failureReason ?? c.status}`);
      await new Promise((r) => setTimeout(r, 200));
    }
    const shot = await analyst.post(`${team}/clips/${clipId}/shots`, { frameStart: 1, frameEnd: truth.frameCount });
    const shotId = shot.json.id as string;

    const walls: number[] = [], cpus: number[] = [], owns: number[] = [], decodes: number[] = [], replays: number[] = [], ratios: number[] = [];
    let stored = 0;
    for (let r = 0; r < rounds; r++) {
      const decode = await decodeAlone(baselineClip, truth.width * truth.height * truth.frameCount);
      const matching = replay();
      const cpu0 = cpuParts(worker.pid!);
      const costAt = costs.length;
      const costArrived = new Promise<void>((res) => (costSeen = res));
      const t0 = performance.now();
      const started = await analyst.post(`${team}/shots/${shotId}/tracking`, { seedFrame: 1, seeds });
      if (started.status !== 202) throw new Error(`tracking not started: ${started.status} ${started.text}`);
      let run;
      for (;;) {
        run = (await analyst.get(`${team}/shots/${shotId}/tracking`)).json.run;
        if (run && !["queued", "running"].includes(run.status)) break;
        await new Promise((res) => setTimeout(res, 20));
      }
      const wall = (performance.now() - t0) / 1000;
      if (run.status !== "done") throw new Error(`the run ended ${run.status}: ${run.failureReason}`);
      stored = Object.values(run.proposals.tracks as Record<string, { marks: unknown[] }>).reduce((n, t) => n + t.marks.length, 0);
      walls.push(wall);
      const cpu1 = cpuParts(worker.pid!);
      await Promise.race([costArrived, new Promise((r) => setTimeout(r, 2000))]);
      console.log(`  round ${r + 1}: ${describeCost(cpu1.own - cpu0.own, costs[costAt])}; load ${load()}`);
      owns.push(cpu1.own - cpu0.own);
      cpus.push(cpu1.own - cpu0.own + cpu1.children - cpu0.children);
      decodes.push(decode);
      replays.push(matching);
      ratios.push(wall / (decode + matching));
    }
    matcher.dispose();
    const wall = median(walls);
    const base = median(decodes) + median(replays);
    console.log(`(${os.cpus().length} cores, load average ${load()}; median of ${rounds} round${rounds > 1 ? "s" : ""}, job and baseline interleaved)`);
    console.log(`  landmark-frames proposed and stored       ${fmt(stored)} (in-process tracking of the same frames: ${fmt(landmarkFrames)})`);
    console.log(`  raw baseline: ffmpeg to raw grey          ${fmt(median(decodes), 2)} s`);
    console.log(`              + the tracker's ${fmt(calls.length)} matchTemplate calls ${fmt(median(replays), 2)} s  = ${fmt(base, 2)} s  (${fmt(stored / base)} landmark-frames/s)`);
    console.log(`  the job, button to proposals stored       ${fmt(wall, 2)} s  (rounds: ${walls.map((w) => fmt(w, 2)).join(", ")})`);
    console.log(`  landmark-frames per second of wall time   ${fmt(stored / wall)}   (one job holds one worker core; ffmpeg decodes beside it)`);
    console.log(`  landmark-frames per worker CPU-second     ${fmt(stored / median(cpus))}   (the worker process and its ffmpeg: ${fmt(median(cpus), 2)} CPU-s)`);
    console.log(`    CPU-s per round, worker + its ffmpeg: ${cpus.map((c, i) => `${fmt(owns[i], 2)} + ${fmt(c - owns[i], 2)}`).join(", ")}`);
    console.log(`  job / raw baseline, median of paired rounds: ${fmt(median(ratios), 2)}`);
    console.log(`Goal: ≥ 600 landmark-frames/s per worker core end to end, within 2× the baseline.`);
  } finally {
    if (worker && worker.exitCode === null) {
      worker.kill("SIGTERM");
      await new Promise((r) => worker!.once("exit", r));
    }
    await stopJobs?.().catch(() => {});
    await close?.().catch(() => {});
    const { db } = await import("../../server/db/client").catch(() => ({ db: null }));
    await db?.().pool.end().catch(() => {});
    await admin(`drop database if exists ${dbName} with (force)`).catch(() => {});
    rmSync(work, { recursive: true, force: true });
  }
}
