// PostgreSQL restarted under load (a throwaway cluster on its own port, never the shared one):
// while it is down every request gets an answer within the pool's bounded waits — none hangs —
// and once it is back the app serves again on its own, without a restart of the app.
import { spawn, spawnSync, type ChildProcess } from "node:child_process";
import pg from "pg";
import { mkdtempSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { EMAILS } from "../api/helpers";
import { DEMO_PASSWORD } from "../../server/seed/demo-people";
import { runMigrations } from "../../server/db/migrate";
import { freePort, startCluster, type Cluster } from "./lib/pg-cluster";

let cluster: Cluster;
let app: ChildProcess;
let base = "";
let cookie = "";
let teamId = "";
let appErr = "";
const ids = { clip: "", shot: "", stick: "" };
const HANG_MS = 60_000;

beforeAll(async () => {
  cluster = await startCluster("restart");
  cluster.createDatabase("loadframe");
  const url = cluster.url("loadframe");
  await runMigrations(url);
  const env = { ...process.env, DATABASE_URL: url, LOG_LEVEL: "error", UPLOAD_DIR: mkdtempSync(path.join(os.tmpdir(), "lf-restart-")) };
  const seeded = spawnSync(process.execPath, ["--import", "tsx", "-e", 'const m = await import("./server/seed/demo-people.ts"); await m.seedPeople(); process.exit(0)'], { env, encoding: "utf8" });
  expect(seeded.status, seeded.stderr).toBe(0);
  const port = await freePort();
  base = `http://127.0.0.1:${port}`;
  app = spawn(process.execPath, ["--import", "tsx", "server/index.ts"], { env: { ...env, PORT: String(port), EMBEDDED_WORKER: "true" }, stdio: ["ignore", "ignore", "pipe"] });
  // better-auth logs every failed session query during the outage; keep only the end.
  app.stderr!.on("data", (d: Buffer) => (appErr = (appErr + d.toString()).slice(-4000)));
  for (let i = 0; i < 150 && !(await fetch(`${base}/api/health`).then((r) => r.ok, () => false)); i++) await new Promise((r) => setTimeout(r, 200));
  const r = await fetch(`${base}/api/auth/sign-in/email`, { method: "POST", headers: { "content-type": "application/json", origin: "http://127.0.0.1:3000" }, body: JSON.stringify({ email: EMAILS.admin, password: DEMO_PASSWORD }) });
  expect(r.status).toBe(200);
  cookie = r.headers.getSetCookie().map((c) => c.split(";")[0]).join("; ");
  teamId = (await (await fetch(`${base}/api/me`, { headers: { cookie } })).json()).activeTeamId;
  // One row of each kind, so every route family has something to look up during the outage.
  const c = new pg.Client({ connectionString: url });
  await c.connect();
  const one = async (q: string, v: unknown[]) => (await c.query<{ id: string }>(q, v)).rows[0].id;
  ids.stick = await one("insert into stick (team_id, label, rated_flex) values ($1, 'Restart stick', 85) returning id", [teamId]);
  ids.clip = await one("insert into clip (team_id, capture_fps, status, stick_id) values ($1, 240, 'ready', $2) returning id", [teamId, ids.stick]);
  ids.shot = await one("insert into shot (team_id, clip_id, stick_id) values ($1, $2, $3) returning id", [teamId, ids.clip, ids.stick]);
  await c.end();
}, 120_000);
afterAll(() => {
  if (app?.exitCode === null) app.kill("SIGKILL");
  cluster?.destroy();
});

interface Sample { at: number; ms: number; path: string; status: number | "hung" | "network"; body?: string }

describe("PostgreSQL restarts under load", () => {
  it("answers every request in bounded time and recovers by itself", async () => {
    // Every route family: session, clips, shots, readout, sticks, roster, audit, readiness.
    const T = `/api/teams/${teamId}`;
    const paths = () => [
      `/api/me`, `${T}/clips`, `${T}/clips/${ids.clip}`, `${T}/clips/${ids.clip}/shots`, `${T}/shots/${ids.shot}`, `${T}/readout/shots`,
      `${T}/readout/shots/${ids.shot}`, `${T}/sticks`, `${T}/sticks/${ids.stick}`, `${T}/members`, `${T}/audit`, `/api/ready`,
    ];
    const samples: Sample[] = [];
    let running = true;
    const t0 = Date.now();
    const loop = async (k: number) => {
      for (let i = k; running; i++) {
        const p = paths()[i % paths().length];
        const at = Date.now();
        let status: Sample["status"];
        let body: string | undefined;
        try {
          const r = await fetch(base + p, { headers: { cookie }, signal: AbortSignal.timeout(HANG_MS) });
          const text = await r.text();
          status = r.status;
          if (status !== 200) body = text.slice(0, 300);
        } catch (err) {
          status = (err as Error).name === "TimeoutError" ? "hung" : "network";
        }
        samples.push({ at: at - t0, ms: Date.now() - at, path: p, status, body });
        await new Promise((r) => setTimeout(r, 20));
      }
    };
    const loops = Array.from({ length: 12 }, (_, k) => loop(k));
    const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

    await sleep(3000);
    const downAt = Date.now() - t0;
    cluster.stop();
    await sleep(4000);
    cluster.start();
    const upAt = Date.now() - t0;
    await sleep(8000);
    running = false;
    await Promise.all(loops);

    const ok = (s: Sample) => s.status === 200;
    const before = samples.filter((s) => s.at + s.ms < downAt); // finished before the stop
    const outage = samples.filter((s) => s.at > downAt + 500 && s.at < upAt - 500);
    const lastBad = Math.max(...samples.filter((s) => !ok(s)).map((s) => s.at + s.ms));
    const after = samples.filter((s) => s.at > upAt + 5000);
    const maxMs = Math.max(...samples.map((s) => s.ms));
    console.info(
      `restart under load: ${samples.length} requests; before ${before.length} (${before.filter(ok).length} ok), ` +
        `outage ${outage.length} (statuses ${[...new Set(outage.map((s) => s.status))].join("/")}), ` +
        `slowest ${maxMs} ms, last error answer ${((lastBad - upAt) / 1000).toFixed(1)} s after PostgreSQL was back, ` +
        `last 3 s: ${after.filter(ok).length}/${after.length} ok`,
    );

    expect(app.exitCode, appErr).toBeNull(); // the app survived the outage (and says why if not)
    expect(before.length).toBeGreaterThan(10);
    expect(before.filter((s) => !ok(s))).toEqual([]);
    expect(samples.filter((s) => s.status === "hung" || s.status === "network")).toEqual([]); // nothing hangs, nothing drops
    expect(maxMs).toBeLessThan(35_000); // pool connect (5 s) + query (30 s) limits, server/db/client.ts
    expect(outage.length).toBeGreaterThan(0);
    // The database being away is said as such: 503 with its own code (readiness: 503 with the check).
    expect(outage.filter((s) => s.status !== 503).map((s) => `${s.path} ${s.status} ${s.body}`)).toEqual([]);
    expect(outage.filter((s) => s.path !== "/api/ready").every((s) => s.body?.includes('"code":"database_unavailable"'))).toBe(true);
    expect(after.length).toBeGreaterThan(10);
    expect(after.every(ok)).toBe(true);
    const ready = await (await fetch(`${base}/api/ready`)).json();
    expect(ready).toMatchObject({ ok: true, checks: { database: { ok: true }, queue: { ok: true } } });
  });

  it("then stops gracefully on SIGTERM", async () => {
    const t = Date.now();
    app.kill("SIGTERM");
    const code = await new Promise((r) => app.once("exit", r));
    expect(code).toBe(0);
    console.info(`app stopped ${Date.now() - t} ms after SIGTERM`);
  });
});
