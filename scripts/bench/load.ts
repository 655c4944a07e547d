// npm run bench:load — loopback only, bounded in count and time, stops by itself (9 min at most).
//  1. 20 concurrent resumable uploads of different clips: every stored original and every
//     clip.sha256 must equal the SHA-256 of the file sent.
//  2. Bare Express, the app's /api/health, the clip list, one shot's results and the Shots list at
//     200 requests/s against a team of 50,000 shots (5,000 clips, 40 extra players, seeded in a
//     throwaway database), with one web process and with two (WEB_PROCESSES=2): p50/p95/p99 and
//     the web processes' CPU per request beside bare Express's (and the PostgreSQL backends' beside it); goal p95 < 50 ms.
//     Repeated reads are answered from each process's kept answers (decision 192); two rows show
//     reads no kept answer serves: the clip list with a write to the team before each request, and
//     one shot's results for a random shot (each asked for about once).
//     Then saving marks' two writes without and with the change-stamp triggers (their cost to writers).
//  3. /api/health while 10 PDF reports render (they run in worker threads): goal p99 < 100 ms.
//     Raw baseline in the same run: the same repository query straight to PostgreSQL, one at a
//     time, without HTTP or sign-in; the ratio says what the API adds.
// Needs the private cluster: without PG_ADMIN_URL it re-runs itself through scripts/with-db.
// --cpu: only bare Express, the app's health route (the path every request shares), the clip list,
// one shot's results and the Shots list at 100 requests/s
// with one web process, for their CPU per request (a short run for profiling with BENCH_CPU_PROF, when the
// whole bench is too long for a shared machine). BENCH_LOG_LEVEL=info: the web process logs a line
// per request, as at the default level of server/env.ts (error otherwise; stdout goes to /dev/null).
// --only <words>: with --cpu, only the scenarios whose name holds these words (bare Express always
// runs: it is the yardstick), e.g. `-- --cpu --only "random shot"` to profile one route.
// With BENCH_CPU_PROF the bench prints each row's time window on the monotonic clock the
// profile's sample times use, so a profile can be cut to that row (scripts/bench/profile-summary.ts).
// --warmup <n>: requests each row sends each web process before it is measured, and bare Express
// before its figure (200 by default).
// --repeat <n>: with --cpu, each scenario n times in a row in the same web process (the random
// shot's rows move on to shots not yet read), to see a figure settle or drift as the process ages.
// BENCH_TRACE_GC=1: the web process runs with V8's --trace-gc, and each scenario prints its
// collections (young-generation scavenges and full mark-compacts, their count and pause).
// BENCH_WEB_FLAGS="--flag …": extra node flags for the app's (first) web process, to try V8 settings.
// BENCH_GC_LOG=<file>: with BENCH_TRACE_GC=1, the web process's collection lines are also appended
// there (with BENCH_WEB_FLAGS=--trace-gc-nvp, each scavenge's bytes allocated, survived, promoted).
// With --cpu each row also prints the web process's minor page faults a request: each is the
// kernel handing it a fresh page, system time its socket calls do not explain.
// Each row prints its answers' mean size: the bytes a request sends cost the web process's CPU too.
import { execFileSync, spawn, spawnSync, type ChildProcess } from "node:child_process";
import { createHash, randomBytes } from "node:crypto";
import { appendFileSync, mkdtempSync, readdirSync, readFileSync, rmSync } from "node:fs";
import { createServer } from "node:net";
import os from "node:os";
import path from "node:path";
import pg from "pg";
import * as tus from "tus-js-client";
import { figures, fmt, httpClient, openLoop, sequential, type Figures } from "./load-client";
import { BENCH_SIZE, seedBenchTeam } from "./load-seed";
import { inTurn } from "../../server/db/in-turn";
import { CLIP_PAGE_SIZE } from "../../shared/schemas/clips";

if (!process.env.PG_ADMIN_URL) {
  const r = spawnSync("scripts/with-db", [process.execPath, "--import", "tsx", "scripts/bench/load.ts", ...process.argv.slice(2)], { stdio: "inherit" });
  process.exit(r.status ?? 1);
}

const CPU_ONLY = process.argv.includes("--cpu");
const TRACE_GC = process.env.BENCH_TRACE_GC === "1";
/** The word after an option on the command line, if the option is there. */
const argAfter = (option: string) => (process.argv.includes(option) ? process.argv[process.argv.indexOf(option) + 1] : undefined);
const REPEAT = Math.max(1, Number(argAfter("--repeat")) || 1);
const ONLY = argAfter("--only");
// Requests each row sends a web process before its figures, bare Express's included, the same for
// the yardstick and every row: a young process's first requests of a route also pay V8's
// compilation of its code (rows got 20 and bare Express 200 until 4 Dec, see the README).
const WARMUP = Math.max(0, Number(argAfter("--warmup") ?? 200) || 0);
const RATE = CPU_ONLY ? 100 : 200;
const SECONDS = 5;
const UPLOADS = 20;
const dbName = `loadframe_bench_${process.pid}`;
const workDir = mkdtempSync(path.join(os.tmpdir(), "lf-bench-load-"));
const uploadDir = path.join(workDir, "uploads");
let server: ChildProcess | undefined;

const adminUrl = process.env.PG_ADMIN_URL!;
const url = (() => {
  const u = new URL(adminUrl);
  u.pathname = `/${dbName}`;
  return u.toString();
})();
async function admin(sql: string) {
  const c = new pg.Client({ connectionString: adminUrl });
  await c.connect();
  await c.query(sql).finally(() => c.end());
}
async function cleanup() {
  if (server && server.exitCode === null) {
    server.kill("SIGTERM");
    await new Promise((r) => server!.once("exit", r));
  }
  if (process.env.BENCH_KEEP_DB === "1") console.log(`  kept database ${dbName} (BENCH_KEEP_DB=1); drop it when done`);
  else await admin(`drop database if exists ${dbName} with (force)`).catch(() => {});
  rmSync(workDir, { recursive: true, force: true });
}
const hardStop = setTimeout(async () => {
  console.error("bench:load ran past its 9-minute bound; stopping");
  await cleanup();
  process.exit(1);
}, 9 * 60_000);
const freePort = () =>
  new Promise<number>((resolve) => {
    const s = createServer().listen(0, "127.0.0.1", () => {
      const p = (s.address() as { port: number }).port;
      s.close(() => resolve(p));
    });
  });
const step = (s: string) => console.log(`\n▸ ${s}`);
const sha = (b: Buffer) => createHash("sha256").update(b).digest("hex");

Object.assign(process.env, {
  DATABASE_URL: url, UPLOAD_DIR: uploadDir, AUTH_SECRET: process.env.AUTH_SECRET ?? randomBytes(32).toString("hex"),
  RATE_LIMIT: "false", LOG_LEVEL: "silent", EMBEDDED_WORKER: "false", NODE_ENV: "production", SMTP_PORT: process.env.TEST_SMTP_PORT ?? "1125",
});

const load = () => os.loadavg().map((l) => l.toFixed(1)).join(" ");
try {
  const t0 = Date.now();
  console.log(`Load average ${load()} on ${os.cpus().length} cores at the start: other work on this machine slows every figure below.`);
  step(`Throwaway database ${dbName}: migrations, the demo club, then ${BENCH_SIZE.clips * BENCH_SIZE.shotsPerClip} shots`);
  await admin(`drop database if exists ${dbName} with (force)`);
  await admin(`create database ${dbName}`);
  const { runMigrations } = await import("../../server/db/migrate");
  await runMigrations(url);
  const { seedDemo } = await import("../../server/seed");
  const ids = await seedDemo();
  console.log(`  demo club seeded (${((Date.now() - t0) / 1000).toFixed(0)} s)`);
  const seeded = await seedBenchTeam(url, ids.teamId);
  console.log(`  ${seeded.clips} clips, ${seeded.shots} shots with results, ${seeded.players.length} players in the team (${((Date.now() - t0) / 1000).toFixed(0)} s)`);

  const port = await freePort();
  const base = `http://127.0.0.1:${port}`;
  const { DEMO_PASSWORD } = await import("../../server/seed/demo-people");
  /** Starts the app with `procs` web processes (WEB_PROCESSES) and signs the coach in. */
  async function startWeb(procs: number) {
    if (server && server.exitCode === null) {
      server.kill("SIGTERM");
      await new Promise((r) => server!.once("exit", r));
    }
    // BENCH_CPU_PROF=<folder> writes a V8 CPU profile of the server (open it in Chromium's DevTools).
    const prof = process.env.BENCH_CPU_PROF ? ["--cpu-prof", "--cpu-prof-interval", "200", "--cpu-prof-dir", path.resolve(process.env.BENCH_CPU_PROF)] : [];
    server = spawn(process.execPath, [...prof, ...(TRACE_GC ? ["--trace-gc"] : []), ...(process.env.BENCH_WEB_FLAGS ? process.env.BENCH_WEB_FLAGS.split(" ") : []), "--import", "tsx", "server/index.ts"], { env: { ...process.env, PORT: String(port), PUBLIC_URL: base, LOG_LEVEL: process.env.BENCH_LOG_LEVEL ?? "error", WEB_PROCESSES: String(procs) }, stdio: ["ignore", TRACE_GC ? "pipe" : "ignore", "inherit"] });
    if (TRACE_GC) countCollections(server.stdout!);
    for (let i = 0; i < 300 && !(await fetch(`${base}/api/health`).then((r) => r.ok, () => false)); i++) await new Promise((r) => setTimeout(r, 200));
    // With a supervisor, wait until every web process is up (each answers on its own connection).
    for (let i = 0; i < 300 && procs > 1 && webPids().length < procs + 1; i++) await new Promise((r) => setTimeout(r, 200));
    await new Promise((r) => setTimeout(r, procs > 1 ? 3000 : 0));
    const signIn = await fetch(`${base}/api/auth/sign-in/email`, { method: "POST", headers: { "content-type": "application/json", origin: base }, body: JSON.stringify({ email: "coach@ravens.example", password: DEMO_PASSWORD }) });
    if (signIn.status !== 200) throw new Error(`sign-in failed: ${signIn.status}`);
    return signIn.headers.getSetCookie().map((c) => c.split(";")[0]).join("; ");
  }
  /** The server's pid and its children's (the web processes under a supervisor). */
  const webPids = (): number[] => {
    if (!server?.pid) return [];
    try {
      return [server.pid, ...readFileSync(`/proc/${server.pid}/task/${server.pid}/children`, "utf8").trim().split(/\s+/).filter(Boolean).map(Number)];
    } catch {
      return [server.pid];
    }
  };
  /** What --trace-gc reported since the last reset: each line is one collection and its pause. */
  const gc = { scavenges: 0, scavengeMs: 0, marks: 0, markMs: 0 };
  function countCollections(out: NodeJS.ReadableStream) {
    let rest = "";
    out.on("data", (d: Buffer) => {
      const lines = (rest + d.toString()).split("\n");
      rest = lines.pop()!;
      if (process.env.BENCH_GC_LOG) appendFileSync(process.env.BENCH_GC_LOG, lines.join("\n") + "\n");
      for (const l of lines) {
        const m = / (Scavenge|Mark-Compact|Mark-Compact \(reduce\))\b.*?, ([\d.]+) \/ [\d.]+ ms/.exec(l);
        if (!m) continue;
        const young = m[1] === "Scavenge";
        gc[young ? "scavenges" : "marks"]++;
        gc[young ? "scavengeMs" : "markMs"] += Number(m[2]);
      }
    });
  }
  const cookie = await startWeb(1);
  const team = `${base}/api/teams/${ids.teamId}`;
  const coach = { userId: ids.users["coach@ravens.example"], teamId: ids.teamId, role: "coach" as const };

  // --- 1. concurrent uploads -----------------------------------------------------------------
  let matching = 0;
  if (!CPU_ONLY) {
  step(`${UPLOADS} concurrent resumable uploads of different clips`);
  const files = Array.from({ length: UPLOADS }, (_, i) => {
    const f = path.join(workDir, `upload-${i}.mp4`);
    execFileSync("ffmpeg", ["-hide_banner", "-loglevel", "error", "-nostdin", "-y", "-f", "lavfi", "-i", `testsrc2=size=640x360:rate=30`, "-frames:v", String(90 + i * 7),
      "-vf", `hue=h=${i * 17}`, "-c:v", "libx264", "-preset", "ultrafast", "-pix_fmt", "yuv420p", f]);
    const data = readFileSync(f);
    return { name: `upload-${i}.mp4`, data, sha256: sha(data) };
  });
  const meta = JSON.stringify({ title: "", newSession: { date: "2026-03-14", venue: "Bench rink", drill: "Uploads" }, shotType: "slap", cameraView: "side", playerId: ids.users["player@ravens.example"] });
  const tu = Date.now();
  const results = await Promise.all(files.map((f) => new Promise<{ id?: string; error?: string }>((resolve) => {
    const u = new tus.Upload(f.data, {
      endpoint: `${base}/api/uploads`, headers: { cookie, origin: base }, chunkSize: 256 * 1024, retryDelays: [0, 500, 1000],
      metadata: { teamId: ids.teamId, filename: f.name, meta },
      onSuccess: (p) => resolve({ id: JSON.parse(p.lastResponse.getBody()).clip?.id }),
      onError: (e) => resolve({ error: String(e) }),
    });
    u.start();
  })));
  const uploadSeconds = (Date.now() - tu) / 1000;
  const c = new pg.Client({ connectionString: url });
  await c.connect();
  const problems: string[] = [];
  for (const [i, r] of results.entries()) {
    if (!r.id) {
      problems.push(`${files[i].name}: ${r.error}`);
      continue;
    }
    const row = (await c.query<{ sha256: string }>(`select sha256 from clip where id = $1`, [r.id])).rows[0];
    const stored = sha(readFileSync(path.join(uploadDir, "clips", r.id, "original")));
    if (row?.sha256 === files[i].sha256 && stored === files[i].sha256) matching++;
    else problems.push(`${files[i].name}: sent ${files[i].sha256.slice(0, 12)}, row ${row?.sha256?.slice(0, 12)}, stored ${stored.slice(0, 12)}`);
  }
  await c.end();
  const mb = files.reduce((s, f) => s + f.data.length, 0) / 1024 ** 2;
  console.log(`  ${matching}/${UPLOADS} uploads stored with matching SHA-256 (file sent = clip.sha256 = stored original); ${mb.toFixed(1)} MB in ${uploadSeconds.toFixed(1)} s`);
  for (const p of problems) console.log(`  ✗ ${p}`);
  }

  // --- 2. latency at 200 requests/s ----------------------------------------------------------
  const clipRepo = await import("../../server/entities/clip/repository");
  const readoutRepo = await import("../../server/entities/shot/readout");
  const { shotListPage } = await import("../../server/entities/shot/list-page");
  const picked = (await (await import("../../server/db/client")).db().execute<{ id: string }>(
    (await import("drizzle-orm")).sql`select id from shot where team_id = ${ids.teamId} order by random() limit ${2000 + Math.max(400, 2 * WARMUP)}`,
  )).rows.map((r) => r.id);
  // 2,000 shots for the measured reads, and others for the warm-up (one a warm-up request, for up to
  // two processes; at least 400), so no measured read of a random shot finds an answer the warm-up
  // left kept, and no warm-up read does.
  const shotIds = picked.slice(0, 2000);
  const warmShotIds = picked.slice(2000);
  const player = seeded.players[0];
  const sorts = ["created", "title", "player", "status"] as const;
  let client = httpClient(cookie);
  const get = (u: string) => async (signal: AbortSignal) => {
    const status = await client.get(u, signal);
    return status === 200 || `status ${status}`;
  };
  // A write to the team before each request of a scenario that says so: the team's change stamp
  // moves, so no answer a web process kept can serve the read (decision 192).
  const writer = new pg.Client({ connectionString: url });
  await writer.connect();
  const someClip = (await writer.query<{ id: string }>(`select id from clip where team_id = $1 limit 1`, [ids.teamId])).rows[0].id;
  // Sent while the last may still run (an open loop): they take their turn on the one connection.
  const touchTeam = () => inTurn(writer, `update clip set frames_done = frames_done where id = $1`, [someClip]);
  // `warm`: the warm-up's requests, where the measured ones must not find them kept (else `http`'s).
  interface Scenario { name: string; rate: number; seconds: number; http: (i: number) => string; warm?: (i: number) => string; raw?: (i: number) => Promise<unknown>; writeFirst?: boolean }
  // What people do all day, at 200 requests/s with one and with two web processes.
  const busy: Scenario[] = [
    { name: "app /api/health (no database)", rate: RATE, seconds: SECONDS, http: () => `${base}/api/health` },
    {
      // The page's own size (it asked for 20 while this bench asked for 25 until 3 Dec).
      name: `clip list as the Clips page opens it (newest first, pages 1-4 of ${CLIP_PAGE_SIZE})`, rate: RATE, seconds: SECONDS,
      http: (i) => `${team}/clips?page=${(i % 4) + 1}&pageSize=${CLIP_PAGE_SIZE}`,
      raw: (i) => clipRepo.clipPageText(coach, {}, "created", "desc", (i % 4) + 1, CLIP_PAGE_SIZE),
    },
    {
      // What a read costs when the team changed since the page was kept: the Clips page's reads,
      // each after a write (a one-row update through the bench's own connection, not the app's).
      name: `clip list as above, each request after a write to the team (no kept page can serve it)`, rate: RATE, seconds: SECONDS, writeFirst: true,
      http: (i) => `${team}/clips?page=${(i % 4) + 1}&pageSize=${CLIP_PAGE_SIZE}`,
    },
    {
      // Each of 2,000 shots is asked for about once: the first read of a shot, which no kept answer serves.
      name: "shot results (one shot's readout, random shot)", rate: RATE, seconds: SECONDS,
      http: (i) => `${team}/readout/shots/${shotIds[i % shotIds.length]}`,
      warm: (i) => `${team}/readout/shots/${warmShotIds[i % warmShotIds.length]}`,
      raw: async (i) => {
        const row = await readoutRepo.shotById(ids.teamId, shotIds[i % shotIds.length]);
        return readoutRepo.sharesOf(ids.teamId, [row!.id]);
      },
    },
    {
      // A shot's page read again (its query refetched, another tab) while nothing changed.
      name: "shot results, the same 4 shots again and again", rate: RATE, seconds: SECONDS,
      http: (i) => `${team}/readout/shots/${shotIds[i % 4]}`,
    },
    {
      name: "Shots list as the Shots page opens it (the team's newest 50, count, filter choices)", rate: RATE, seconds: SECONDS,
      http: () => `${team}/readout/shots?page=1&pageSize=50`,
      raw: () => shotListPage(coach, {}, { limit: 50, offset: 0 }),
    },
  ];
  // Deep pages and other sorts, for the record at a lower rate (one web process).
  const deep: Scenario[] = [
    {
      name: "clip list, any page of 200 and any sort", rate: 20, seconds: 5,
      http: (i) => `${team}/clips?page=${(i * 7) % 200 + 1}&pageSize=25&sort=${sorts[i % 4]}`,
      raw: (i) => clipRepo.clipPageText(coach, {}, sorts[i % 4], "desc", (i * 7) % 200 + 1, 25),
    },
    {
      name: `one player's Shots list, any page of 50 (${Math.round(seeded.shots / seeded.players.length)} shots)`, rate: 20, seconds: 5,
      http: (i) => `${team}/readout/shots?playerId=${encodeURIComponent(player)}&page=${(i % 20) + 1}&pageSize=50`,
      raw: (i) => shotListPage(coach, { playerId: player }, { limit: 50, offset: (i % 20) * 50 }),
    },
  ];
  /** CPU time used so far by these processes, from /proc (Linux); -1 where there is none. */
  const cpuMsOf = (pids: number[]) => {
    try {
      return pids.reduce((sum, pid) => {
        const f = readFileSync(`/proc/${pid}/stat`, "utf8").split(") ")[1].split(" ");
        return sum + ((Number(f[11]) + Number(f[12])) * 1000) / 100; // utime + stime in clock ticks (USER_HZ = 100)
      }, 0);
    } catch {
      return -1;
    }
  };
  /**
   * With --cpu, a web process's CPU so far by thread name and user/system time (from /proc): how
   * much of a request's CPU is the JavaScript thread's own, the kernel's for its socket calls, or
   * V8's helper threads' (garbage collection), which a profile of the JavaScript thread omits.
   */
  const threadCpuOf = (pid: number) => {
    const m = new Map<string, { user: number; system: number }>();
    try {
      for (const tid of readdirSync(`/proc/${pid}/task`)) {
        const stat = readFileSync(`/proc/${pid}/task/${tid}/stat`, "utf8");
        const name = tid === String(pid) ? "main thread" : stat.slice(stat.indexOf("(") + 1, stat.lastIndexOf(")"));
        const f = stat.slice(stat.lastIndexOf(") ") + 2).split(" ");
        const t = m.get(name) ?? { user: 0, system: 0 };
        m.set(name, { user: t.user + Number(f[11]) * 10, system: t.system + Number(f[12]) * 10 });
      }
    } catch {
      // a thread that ended meanwhile
    }
    return m;
  };
  /** Minor page faults of a process so far: each is the kernel handing it a fresh page (system time). */
  const faultsOf = (pid: number) => {
    try {
      return Number(readFileSync(`/proc/${pid}/stat`, "utf8").split(") ")[1].split(" ")[7]);
    } catch {
      return 0;
    }
  };
  const threadCpuSince = (before: Map<string, { user: number; system: number }>, after: Map<string, { user: number; system: number }>, n: number) =>
    [...after]
      .map(([name, t]) => ({ name, user: (t.user - (before.get(name)?.user ?? 0)) / n, system: (t.system - (before.get(name)?.system ?? 0)) / n }))
      .filter((t) => t.user + t.system > 0)
      .sort((a, b) => b.user + b.system - (a.user + a.system))
      .map((t) => `${t.name} ${(t.user + t.system).toFixed(2)} (user ${t.user.toFixed(2)}, system ${t.system.toFixed(2)})`)
      .join("; ");
  /**
   * The PostgreSQL backends serving this database (the web processes' pooled connections) and
   * their CPU so far: the statements' share of a request, which JSON built by PostgreSQL moves
   * there from the web process (decision 195). Backends that start meanwhile count from zero.
   */
  const dbCpu = async () => {
    const c = new pg.Client({ connectionString: adminUrl });
    await c.connect();
    const pids = (await c.query<{ pid: number }>(`select pid from pg_stat_activity where datname = $1`, [dbName]).finally(() => c.end())).rows.map((r) => r.pid);
    return new Map(pids.map((pid) => [pid, cpuMsOf([pid])] as const).filter(([, ms]) => ms >= 0));
  };
  const dbCpuSince = (before: Map<number, number>, after: Map<number, number>) => [...after].reduce((sum, [pid, ms]) => sum + ms - (before.get(pid) ?? 0), 0);
  /** Requests the client gave up on keep running on the server: wait until it is idle again. */
  const settle = async () => {
    for (let calm = 0, i = 0; calm < 3 && i < 300; i++) {
      const t = performance.now();
      await fetch(`${base}/api/health`).then((r) => r.arrayBuffer(), () => null);
      calm = performance.now() - t < 15 ? calm + 1 : 0;
      await new Promise((r) => setTimeout(r, 100));
    }
    // Start-up work (the worker threads loading their code, decision 172) is no request's CPU:
    // wait until the web processes use under a tenth of a core (at most 20 s).
    for (let i = 0; i < 40; i++) {
      const c0 = cpuMsOf(webPids());
      await new Promise((r) => setTimeout(r, 500));
      if (cpuMsOf(webPids()) - c0 < 50) break;
    }
  };
  // What this machine can carry at all: an empty answer from a bare Express process, with the
  // same client at the same rate. Its CPU per request is the yardstick for the app's.
  step(`Bare Express, empty answer: ${RATE} requests/s for ${SECONDS} s`);
  const barePort = await freePort();
  // With BENCH_CPU_PROF it is profiled too (it then ends by exit on SIGTERM, so V8 writes the profile).
  const bareProf = process.env.BENCH_CPU_PROF ? ["--cpu-prof", "--cpu-prof-interval", "200", "--cpu-prof-dir", path.resolve(process.env.BENCH_CPU_PROF), "--cpu-prof-name", "bare-express.cpuprofile"] : [];
  const bareExit = bareProf.length ? `process.on("SIGTERM", () => process.exit(0)); ` : "";
  const bare = spawn(process.execPath, [...bareProf, "-e", `${bareExit}require("express")().get("/", (q, r) => r.json({ ok: true })).listen(${barePort}, "127.0.0.1")`], { stdio: "ignore" });
  for (let i = 0; i < 50 && !(await fetch(`http://127.0.0.1:${barePort}/`).then((r) => r.ok, () => false)); i++) await new Promise((r) => setTimeout(r, 100));
  for (let i = 0; i < WARMUP; i++) await get(`http://127.0.0.1:${barePort}/`)(AbortSignal.timeout(30_000)); // warm-up, as every row gets
  /** Bare Express's CPU a request over one window at the bench's rate (printed with its figures). */
  const measureBare = async () => {
    const cpu0 = cpuMsOf([bare.pid!]);
    const threads0 = CPU_ONLY ? threadCpuOf(bare.pid!) : undefined;
    const faults0 = faultsOf(bare.pid!);
    const from = process.hrtime.bigint() / 1000n;
    const fig = await openLoop({ rate: RATE, seconds: SECONDS, timeoutMs: 30_000, request: (_i, signal) => get(`http://127.0.0.1:${barePort}/`)(signal) });
    const cpu = (cpuMsOf([bare.pid!]) - cpu0) / fig.n;
    const end = process.hrtime.bigint() / 1000n;
    console.log(`  ${fmt(fig)}; CPU ${cpu.toFixed(2)} ms a request`);
    if (threads0) console.log(`  by thread, ms a request: ${threadCpuSince(threads0, threadCpuOf(bare.pid!), fig.n)}; minor page faults ${((faultsOf(bare.pid!) - faults0) / fig.n).toFixed(1)} a request`);
    if (process.env.BENCH_CPU_PROF) console.log(`  profile window ${from}-${end} µs (monotonic clock)`);
    return { fig, cpu };
  };
  const { fig: bareFig, cpu: bareCpu } = await measureBare();

  type Row = { name: string; procs: number; api: Figures; raw?: Figures; rate: number; cpu: number; dbMs: number };
  const table: Row[] = [];
  const rawOf = new Map<string, Figures>();
  async function run(s: Scenario, procs: number, round = 0) {
    step(`${s.name}: ${s.rate} requests/s for ${s.seconds} s, ${procs} web process${procs > 1 ? "es" : ""}${round ? `, repeated (${round + 1})` : ""}`);
    // A repeat asks for the requests after the ones the earlier rounds sent.
    const at = (i: number) => s.http(i + round * s.rate * s.seconds);
    await settle();
    for (let i = 0; i < WARMUP * procs; i++) await get(s.warm?.(i) ?? at(i))(AbortSignal.timeout(30_000)); // warm-up (its pages are kept)
    if (s.raw && !rawOf.has(s.name)) rawOf.set(s.name, await sequential(Math.min(300, s.rate * s.seconds), s.raw));
    const raw = rawOf.get(s.name);
    const pids = webPids();
    const db0 = await dbCpu();
    const cpu0 = cpuMsOf(pids);
    const threads0 = CPU_ONLY ? threadCpuOf(pids[0]) : undefined;
    const faults0 = faultsOf(pids[0]);
    const from = process.hrtime.bigint() / 1000n;
    const got0 = { ...client.received };
    Object.assign(gc, { scavenges: 0, scavengeMs: 0, marks: 0, markMs: 0 });
    const api = await openLoop({ rate: s.rate, seconds: s.seconds, timeoutMs: 30_000, request: async (i, signal) => (s.writeFirst && (await touchTeam()), get(at(i))(signal)) });
    const cpu = cpu0 >= 0 ? (cpuMsOf(pids) - cpu0) / api.n : -1;
    if (process.env.BENCH_CPU_PROF) console.log(`  profile window ${from}-${process.hrtime.bigint() / 1000n} µs (monotonic clock)`);
    const dbMs = dbCpuSince(db0, await dbCpu()) / api.n;
    const answerKb = (client.received.bytes - got0.bytes) / Math.max(1, client.received.bodies - got0.bodies) / 1024;
    console.log(`  API  ${fmt(api)}; answers ${answerKb.toFixed(1)} kB on average`);
    if (cpu >= 0) console.log(`  web process${procs > 1 ? "es" : ""} CPU ${cpu.toFixed(2)} ms a request (×${(cpu / bareCpu).toFixed(1)} bare Express; ${((cpu * s.rate) / 10).toFixed(0)} % of one core at ${s.rate}/s); PostgreSQL ${dbMs.toFixed(2)} ms a request`);
    if (threads0) console.log(`  by thread, ms a request: ${threadCpuSince(threads0, threadCpuOf(pids[0]), api.n)}; minor page faults ${((faultsOf(pids[0]) - faults0) / api.n).toFixed(1)} a request`);
    if (TRACE_GC) console.log(`  collections in the web process${procs > 1 ? "es" : ""}: ${gc.scavenges} scavenges (${gc.scavengeMs.toFixed(0)} ms paused), ${gc.marks} mark-compacts (${gc.markMs.toFixed(0)} ms paused)`);
    if (raw) console.log(`  SQL alone  ${fmt(raw)}   (the same repository queries, one at a time, no HTTP)`);
    console.log(`  goal p95 < 50 ms: ${api.p95 < 50 ? "met" : "NOT met"}`);
    table.push({ name: s.name, procs, api, raw, rate: s.rate, cpu, dbMs });
  }
  for (const s of busy) if (!CPU_ONLY || !ONLY || s.name.includes(ONLY)) for (let k = 0; k < (CPU_ONLY ? REPEAT : 1); k++) await run(s, 1, k);
  // The yardstick again, after the rows: how far the machine's own cost of a request moved while
  // they ran (other work, the host's steal). The ratios above stay against the first figure.
  step(`Bare Express again, after the rows above: ${RATE} requests/s for ${SECONDS} s`);
  const bareAgain = await measureBare();
  bare.kill();
  console.log(`  ${((100 * (bareAgain.cpu - bareCpu)) / bareCpu).toFixed(0)} % against the first figure (${bareCpu.toFixed(2)} ms); the ratios use the first`);
  if (CPU_ONLY) {
    console.log(`\n  load average ${load()} at the end (${os.cpus().length} cores)`);
    client.close();
    await writer.end();
    await (await import("../../server/db/client")).db().pool.end();
    await cleanup();
    process.exit(0);
  }
  for (const s of deep) await run(s, 1);

  // What the change stamp's triggers (decision 192) cost a writer: saving marks writes the shot,
  // then its stored results (each its own transaction, as the app does). Alternated in rounds with
  // the two tables' update triggers disabled and enabled, on one connection, one write at a time.
  step("Saving marks' two writes (the shot, then its ~80 kB stored results), without and with the change-stamp triggers");
  const stampTriggers = (on: boolean) => writer.query(["shot", "shot_result"].map((t) => `alter table ${t} ${on ? "enable" : "disable"} trigger answer_change_update`).join("; "));
  const backend = (await writer.query<{ pid: number }>("select pg_backend_pid() as pid")).rows[0].pid;
  const saves = { without: [] as number[], with: [] as number[] };
  const saveCpu = { without: 0, with: 0 };
  for (let round = 0; round < 10; round++)
    for (const mode of ["without", "with"] as const) {
      await stampTriggers(mode === "with");
      const c0 = cpuMsOf([backend]);
      for (const id of shotIds.slice(0, 40)) {
        const t = performance.now();
        await writer.query(`update shot set marks = marks, updated_at = now() where id = $1`, [id]);
        await writer.query(`update shot_result set results = results, computed_at = now() where shot_id = $1`, [id]);
        saves[mode].push(performance.now() - t);
      }
      saveCpu[mode] += cpuMsOf([backend]) - c0;
    }
  await stampTriggers(true);
  const saveFigs = { without: figures(saves.without), with: figures(saves.with) };
  for (const mode of ["without", "with"] as const)
    console.log(`  ${mode} the triggers: p50 ${saveFigs[mode].p50.toFixed(2)} / p95 ${saveFigs[mode].p95.toFixed(2)} ms a save (both writes); PostgreSQL CPU ${(saveCpu[mode] / saves[mode].length).toFixed(2)} ms a save`);

  // Ten PDF reports in flight all the time (each client asks for the next when one arrives) while
  // /api/health is asked 200 times a second: the reports render in worker threads.
  step(`/api/health at ${RATE} requests/s while 10 PDF reports render, one web process`);
  await settle();
  let pdfs = 0;
  let pdfErrors = 0;
  let stopPdfs = false;
  const pdfClients = Array.from({ length: 10 }, async (_, k) => {
    for (let i = k; !stopPdfs; i += 10) {
      const r = await fetch(`${team}/readout/shots/${shotIds[i % shotIds.length]}/report.pdf?units=metric`, { headers: { cookie } }).then(async (x) => (await x.arrayBuffer(), x.status), () => 0);
      if (r === 200) pdfs++;
      else pdfErrors++;
    }
  });
  await new Promise((r) => setTimeout(r, 1000)); // the reports are under way
  const underPdf = await openLoop({ rate: RATE, seconds: SECONDS, timeoutMs: 30_000, request: (_i, signal) => get(`${base}/api/health`)(signal) });
  stopPdfs = true;
  await Promise.all(pdfClients);
  console.log(`  /api/health ${fmt(underPdf)}`);
  console.log(`  ${pdfs} reports made meanwhile${pdfErrors ? `, ${pdfErrors} failed` : ""}; goal p99 < 100 ms: ${underPdf.p99 < 100 ? "met" : "NOT met"}`);

  step("Two web processes (WEB_PROCESSES=2)");
  client.close();
  client = httpClient(await startWeb(2));
  for (const s of busy) await run(s, 2);

  step("Summary");
  console.log(`  uploads: ${matching}/${UPLOADS} checksums match`);
  console.log(`  bare Express @ ${RATE}/s: p50 ${bareFig.p50.toFixed(1)} / p95 ${bareFig.p95.toFixed(1)} / p99 ${bareFig.p99.toFixed(1)} ms, CPU ${bareCpu.toFixed(2)} ms a request (again after the one-process rows: ${bareAgain.cpu.toFixed(2)} ms)`);
  for (const t of table)
    console.log(`  ${t.name} @ ${t.rate}/s, ${t.procs} process${t.procs > 1 ? "es" : ""}: p50 ${t.api.p50.toFixed(1)} / p95 ${t.api.p95.toFixed(1)} / p99 ${t.api.p99.toFixed(1)} ms; CPU ${t.cpu.toFixed(2)} ms a request (×${(t.cpu / bareCpu).toFixed(1)} bare), PostgreSQL ${t.dbMs.toFixed(2)} ms${t.raw ? `; SQL alone p50 ${t.raw.p50.toFixed(1)} / p95 ${t.raw.p95.toFixed(1)} ms` : ""}${t.api.errors ? `; ${t.api.errors} errors (${Object.entries(t.api.errorKinds).map(([k, n]) => `${n}× ${k}`).join(", ")})` : ""}`);
  console.log(`  saving marks' two writes, without → with the change-stamp triggers: p50 ${saveFigs.without.p50.toFixed(2)} → ${saveFigs.with.p50.toFixed(2)} ms, PostgreSQL CPU ${(saveCpu.without / saves.without.length).toFixed(2)} → ${(saveCpu.with / saves.with.length).toFixed(2)} ms a save`);
  console.log(`  /api/health while 10 PDFs render: p50 ${underPdf.p50.toFixed(1)} / p95 ${underPdf.p95.toFixed(1)} / p99 ${underPdf.p99.toFixed(1)} ms (${pdfs} reports)`);
  console.log(`  total ${((Date.now() - t0) / 1000).toFixed(0)} s; load average ${load()} at the end (${os.cpus().length} cores)`);
  client.close();
  await writer.end();
  await (await import("../../server/db/client")).db().pool.end();
  await cleanup();
  clearTimeout(hardStop);
  process.exit(matching === UPLOADS ? 0 : 1);
} catch (err) {
  console.error(err);
  await cleanup();
  process.exit(1);
}
