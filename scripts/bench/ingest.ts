// Clip ingest benchmark (issue 3). Prints figures, asserts nothing. From one run:
//  - our wall time from upload complete (last byte sent) to all frames ready, through the real
//    server: tus upload → checksum → probe → store → pg-boss job → frames in storage;
//  - the raw `ffmpeg -i clip frames/%06d.jpg` on the same clip, same niceness, same machine;
//  - their ratio (goal <= 1.2) and the time to the first viewable frame (goal <= 1.5 s);
//  - the server's peak RSS growth while a 2 GB file streams in over tus (goal < 64 MB); the
//    file is random bytes, so the probe then refuses it (and nothing is kept).
// The server runs as its own process (node --import tsx server/index.ts) on a scratch database,
// so the client's memory is not counted. Needs the private PostgreSQL cluster:
//   npm run bench:ingest            (re-runs itself under scripts/with-db when needed)
//   … -- --frames 2400 --rounds 2 --big-gb 2
import { spawn, spawnSync, type ChildProcess } from "node:child_process";
import { createReadStream, createWriteStream, existsSync, readFileSync, statSync } from "node:fs";
import { mkdir, mkdtemp, readdir, rm } from "node:fs/promises";
import net from "node:net";
import os from "node:os";
import path from "node:path";
import { randomBytes } from "node:crypto";
import * as tus from "tus-js-client";
import { filterCosts } from "./ingest-filters";

const arg = (name: string, fallback: number) => {
  const i = process.argv.indexOf(`--${name}`);
  return i > 0 ? Number(process.argv[i + 1]) : fallback;
};
const FRAMES = arg("frames", 2400);
const ROUNDS = arg("rounds", 2);
const BIG_BYTES = Math.round(arg("big-gb", 2) * 1024 ** 3);

if (!process.env.PG_ADMIN_URL) {
  // The database helpers live in the shell scripts; run again inside them.
  const r = spawnSync("scripts/with-db", [process.execPath, "--import", "tsx", ...process.argv.slice(1)], { stdio: "inherit" });
  process.exit(r.status ?? 1);
}

const work = await mkdtemp(path.join(os.tmpdir(), "loadframe-bench-ingest-"));
const uploadDir = path.join(work, "uploads");
const dbName = `loadframe_bench_ingest_${process.pid}`;
const dbUrl = (() => {
  const u = new URL(process.env.PG_ADMIN_URL!);
  u.pathname = `/${dbName}`;
  return u.toString();
})();
const port = await new Promise<number>((resolve) => {
  const s = net.createServer().listen(0, "127.0.0.1", () => {
    const p = (s.address() as net.AddressInfo).port;
    s.close(() => resolve(p));
  });
});
const base = `http://127.0.0.1:${port}`;
Object.assign(process.env, {
  DATABASE_URL: dbUrl, UPLOAD_DIR: uploadDir, PORT: String(port), PUBLIC_URL: base, LOG_LEVEL: "warn", RATE_LIMIT: "false",
  AUTH_SECRET: process.env.AUTH_SECRET ?? randomBytes(32).toString("hex"), NODE_ENV: "production", EMBEDDED_WORKER: "true",
});

const pg = (await import("pg")).default;
const admin = new pg.Client({ connectionString: process.env.PG_ADMIN_URL });
await admin.connect();
await admin.query(`drop database if exists ${dbName} with (force)`);
await admin.query(`create database ${dbName}`);

let server: ChildProcess | undefined;
const cleanup = async () => {
  if (server && server.exitCode === null && server.signalCode === null) {
    await new Promise((r) => server!.once("exit", r).kill("SIGTERM"));
  }
  const { db } = await import("../../server/db/client");
  await db().pool.end().catch(() => undefined);
  await admin.query(`drop database if exists ${dbName} with (force)`).catch(() => undefined);
  await admin.end();
  await rm(work, { recursive: true, force: true });
};

try {
  const { runMigrations } = await import("../../server/db/migrate");
  await runMigrations(dbUrl);
  const { seedPeople, DEMO_PASSWORD } = await import("../../server/seed/demo-people");
  const ids = await seedPeople();
  const { mediaConfig } = await import("../../server/clips/deps");
  const { generateBenchClip, timeRawExtraction } = await import("./ingest-raw");
  const media = mediaConfig();

  const clip = await generateBenchClip(media, { dir: path.join(os.tmpdir(), "loadframe-bench-clips"), frames: FRAMES });
  console.log(`clip: ${FRAMES} frames, 1280x720 H.264, ${(statSync(clip).size / 1e6).toFixed(1)} MB (${clip})`);

  server = spawn(process.execPath, ["--import", "tsx", "server/index.ts"], { env: process.env, stdio: ["ignore", "ignore", "inherit"] });
  for (let i = 0; ; i++) {
    if (await fetch(`${base}/api/health`).then((r) => r.ok, () => false)) break;
    if (i > 300) throw new Error("the server did not start");
    await sleep(100);
  }
  const cookie = await signIn(base, "coach@ravens.example", DEMO_PASSWORD);
  const playerId = ids.users["player@ravens.example"];
  const team = `${base}/api/teams/${ids.teamId}`;

  // Same page cache for both sides.
  spawnSync("ffmpeg", ["-nostdin", "-loglevel", "error", "-i", clip, "-f", "null", "-"]);

  const rows: { raw: number; ours: number; first: number; stored: number }[] = [];
  for (let round = 0; round < ROUNDS; round++) {
    const rawDir = path.join(work, `raw-${round}`);
    const raw = (await timeRawExtraction(media, clip, rawDir)).ms;
    await rm(rawDir, { recursive: true, force: true });

    // Each round's clip is deleted afterwards, so the duplicate check lets the same file in again.
    const t = await uploadAndWait(base, cookie, team, clip, ids.teamId, playerId);
    await fetch(`${team}/clips/${t.clipId}`, { method: "DELETE", headers: { cookie, origin: base } });
    rows.push({ raw, ours: t.allReadyMs, first: t.firstFrameMs, stored: t.storedMs });
    console.log(
      `round ${round + 1}: raw ffmpeg ${s(raw)} | ours (upload complete → all ${FRAMES} frames ready) ${s(t.allReadyMs)} | ` +
        `clip stored ${s(t.storedMs)} | first frame viewable ${s(t.firstFrameMs)}`,
    );
  }

  const big = path.join(work, "big.bin");
  await writeRandomFile(big, BIG_BYTES);
  const rss = await uploadBigMeasuringRss(base, cookie, big, ids.teamId, playerId, server.pid!);
  const left = existsSync(path.join(uploadDir, ".tus")) ? (await readdir(path.join(uploadDir, ".tus"))).length : 0;

  const best = (k: "raw" | "ours" | "first" | "stored") => Math.min(...rows.map((r) => r[k]));
  const ratio = best("ours") / best("raw");
  console.log(`\n== Clip ingest (${os.cpus().length} cores, load average ${os.loadavg()[0].toFixed(2)}, ${FRAMES} frames 1280x720, best of ${ROUNDS}) ==`);
  console.log(`raw ffmpeg -i clip frames/%06d.jpg:            ${s(best("raw"))}`);
  console.log(`ours, upload complete → all frames ready:      ${s(best("ours"))}`);
  console.log(`ratio ours / raw:                              ${ratio.toFixed(2)} (goal <= 1.2)`);
  console.log(`upload complete → first frame viewable:        ${s(best("first"))} (goal <= 1.5 s)`);
  console.log(`  of which upload complete → clip stored:      ${s(best("stored"))} (checksum, probe, store, queue)`);
  console.log(`server RSS during a ${(BIG_BYTES / 1024 ** 3).toFixed(1)} GB tus upload: ${mb(rss.before)} before, peak ${mb(rss.peak)}, growth ${mb(rss.peak - rss.before)} (goal < 64 MB)`);
  console.log(`  ${rss.status} ${rss.code}: ${rss.detail}; unfinished uploads left: ${left}`);
  await filterCosts();
} finally {
  await cleanup();
}

function sleep(ms: number) {
  return new Promise((r) => setTimeout(r, ms));
}
function s(ms: number) {
  return `${(ms / 1000).toFixed(2)} s`;
}
function mb(bytes: number) {
  return `${(bytes / 1024 ** 2).toFixed(1)} MB`;
}

async function signIn(url: string, email: string, password: string) {
  const r = await fetch(`${url}/api/auth/sign-in/email`, {
    method: "POST", headers: { "content-type": "application/json", origin: url }, body: JSON.stringify({ email, password }),
  });
  if (!r.ok) throw new Error(`sign-in failed: ${r.status}`);
  return r.headers.getSetCookie().map((c) => c.split(";")[0]).join("; ");
}

function meta(teamId: string, playerId: string, title: string) {
  return {
    teamId, filename: `${title}.mp4`,
    meta: JSON.stringify({ title, newSession: { date: "2026-12-01", venue: "Bench", drill: "" }, playerId, shotType: "slap", cameraView: "side" }),
  };
}

/**
 * Upload, then poll frame 1 and the progress until ready. Times run from the start of the PATCH
 * that carries the file (one chunk over loopback), so the transfer itself counts against us.
 */
async function uploadAndWait(url: string, cookie: string, team: string, file: string, teamId: string, playerId: string) {
  const data = readFileSync(file);
  let lastByteAt = 0;
  const done = new Promise<{ clipId: string; storedAt: number }>((resolve, reject) => {
    const u = new tus.Upload(data, {
      endpoint: `${url}/api/uploads`, headers: { cookie, origin: url }, chunkSize: 64 * 1024 * 1024, retryDelays: [],
      metadata: meta(teamId, playerId, `bench-${Date.now()}`),
      onBeforeRequest: (req) => {
        if (req.getMethod() === "PATCH") lastByteAt = performance.now();
      },
      onSuccess: ({ lastResponse }) => resolve({ clipId: JSON.parse(lastResponse.getBody()).clip.id, storedAt: performance.now() }),
      onError: reject,
    });
    u.start();
  });
  const { clipId, storedAt } = await done;
  // Frame 1 polled often until it is there, then the progress at 10 Hz, like a light client
  // (the page itself polls once a second); the polling costs the server CPU that ffmpeg wants.
  let first = 0;
  for (;;) {
    if (!first) {
      const r = await fetch(`${team}/clips/${clipId}/frames/1`, { headers: { cookie } });
      await r.arrayBuffer();
      if (r.ok) first = performance.now();
      else {
        await sleep(20);
        continue;
      }
    }
    const p = (await (await fetch(`${team}/clips/${clipId}/progress`, { headers: { cookie } })).json()) as { status: string; failureReason: string | null };
    if (p.status === "failed") throw new Error(`extraction failed: ${p.failureReason}`);
    if (p.status === "ready") {
      const end = performance.now();
      return { clipId, storedMs: storedAt - lastByteAt, firstFrameMs: first - lastByteAt, allReadyMs: end - lastByteAt };
    }
    await sleep(100);
  }
}

async function writeRandomFile(file: string, bytes: number) {
  await mkdir(path.dirname(file), { recursive: true });
  const out = createWriteStream(file);
  const block = randomBytes(8 * 1024 * 1024);
  for (let written = 0; written < bytes; ) {
    const n = Math.min(block.length, bytes - written);
    if (!out.write(n === block.length ? block : block.subarray(0, n))) await new Promise<void>((r) => out.once("drain", () => r()));
    written += n;
  }
  await new Promise<void>((r) => out.end(r));
}

function rssOf(pid: number) {
  return Number(/VmRSS:\s+(\d+) kB/.exec(readFileSync(`/proc/${pid}/status`, "utf8"))?.[1] ?? 0) * 1024;
}

/** Stream a big file through tus (from disk, in 64 MB chunks) while sampling the server's RSS. */
async function uploadBigMeasuringRss(url: string, cookie: string, file: string, teamId: string, playerId: string, pid: number) {
  await sleep(1000);
  const before = rssOf(pid);
  let peak = before;
  const sampler = setInterval(() => (peak = Math.max(peak, rssOf(pid))), 50);
  const size = statSync(file).size;
  const outcome = await new Promise<{ status: number; code: string; detail: string }>((resolve) => {
    const u = new tus.Upload(createReadStream(file), {
      endpoint: `${url}/api/uploads`, headers: { cookie, origin: url }, chunkSize: 64 * 1024 * 1024, uploadSize: size, retryDelays: [],
      metadata: meta(teamId, playerId, "random-bytes"),
      onSuccess: () => resolve({ status: 200, code: "accepted", detail: "unexpectedly accepted" }),
      onError: (err) => {
        const res = (err as tus.DetailedError).originalResponse;
        const body = res ? (JSON.parse(res.getBody() || "{}") as { code?: string; detail?: string }) : {};
        resolve({ status: res?.getStatus() ?? 0, code: body.code ?? "network", detail: body.detail ?? String(err) });
      },
    });
    u.start();
  });
  clearInterval(sampler);
  peak = Math.max(peak, rssOf(pid));
  return { before, peak, ...outcome };
}
