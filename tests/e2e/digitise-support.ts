// Helpers of the Digitise end-to-end tests: sign-in, the demo truth, finding the puck in a
// screenshot, and a second app server on the same database that a test may kill and restart.
import { spawn, type ChildProcess } from "node:child_process";
import { readFileSync } from "node:fs";
import net from "node:net";
import path from "node:path";
import sharp from "sharp";
import { expect, type Page } from "@playwright/test";
import { DEMO_PASSWORD } from "../../server/seed/demo-people";
import { DEMO_CLIPS } from "../../scripts/demo/demo-scenes";
import { clipTruth } from "../../scripts/demo/render-scene";

export const E2E_PORT = Number(process.env.E2E_PORT ?? 3100);

export async function signIn(page: Page, email: string, base = "") {
  await page.goto(`${base}/sign-in`);
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill(DEMO_PASSWORD);
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page.getByRole("button", { name: /Switch team/ })).toBeVisible();
}

export async function getJson(page: Page, url: string) {
  const r = await page.request.get(url);
  expect(r.status(), `${url}: ${await r.text()}`).toBe(200);
  return r.json();
}

/** The team, Theo's demo clip and the truth of its scenes (scripts/demo/demo-scenes.ts). */
export async function theoClip(page: Page, base = "") {
  const me = await getJson(page, `${base}/api/me`);
  const teamId: string = me.activeTeamId ?? me.teams[0].id;
  const demo = DEMO_CLIPS[0];
  const clips = await getJson(page, `${base}/api/teams/${teamId}/clips?pageSize=100`);
  const clip = clips.items.find((c: { title: string }) => c.title === demo.title);
  expect(clip, "the demo seed made Theo's clip").toBeTruthy();
  return { teamId, clipId: clip.id as string, truth: clipTruth(demo.shots.map((s) => s.scene)) };
}

/** The puck's centre on frame `frame` of Theo's clip, in frame pixels. */
export function puckAt(truth: ReturnType<typeof clipTruth>, frame: number): [number, number] {
  for (const t of truth) {
    const m = t.tracks.puck.find((p) => p[0] === frame);
    if (m) return [m[1], m[2]];
  }
  throw new Error(`no puck on frame ${frame}`);
}

/**
 * Where the puck is in a screenshot of the viewer: the centroid of the one dark blob shaped like
 * a puck seen side-on (about 3:1), weighted by darkness. Blobs touching the edge (the dark ground
 * around the frame) are not the puck.
 */
export async function findPuck(png: Buffer): Promise<[number, number]> {
  const { data, info } = await sharp(png).removeAlpha().raw().toBuffer({ resolveWithObject: true });
  const { width: W, height: H } = info;
  const lum = (i: number) => (data[i * 3] + data[i * 3 + 1] + data[i * 3 + 2]) / 3;
  const seen = new Uint8Array(W * H);
  let best: { area: number; cx: number; cy: number } | null = null;
  for (let start = 0; start < W * H; start++) {
    if (seen[start] || lum(start) >= 45) continue;
    const stack = [start];
    seen[start] = 1;
    let area = 0, sx = 0, sy = 0, sw = 0, minX = W, maxX = 0, minY = H, maxY = 0, edge = false;
    while (stack.length) {
      const p = stack.pop()!;
      const x = p % W, y = (p - x) / W;
      const w = 45 - lum(p);
      area++;
      sx += (x + 0.5) * w;
      sy += (y + 0.5) * w;
      sw += w;
      minX = Math.min(minX, x); maxX = Math.max(maxX, x); minY = Math.min(minY, y); maxY = Math.max(maxY, y);
      if (x === 0 || y === 0 || x === W - 1 || y === H - 1) edge = true;
      for (const q of [p - 1, p + 1, p - W, p + W]) {
        if (q < 0 || q >= W * H || seen[q] || Math.abs((q % W) - x) > 1) continue;
        if (lum(q) < 45) {
          seen[q] = 1;
          stack.push(q);
        }
      }
    }
    const aspect = (maxX - minX + 1) / (maxY - minY + 1);
    if (!edge && area > 30 && aspect > 2 && aspect < 4.5 && (!best || area > best.area)) best = { area, cx: sx / sw, cy: sy / sw };
  }
  if (!best) throw new Error("no puck-shaped blob in the screenshot");
  return [best.cx, best.cy];
}

async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = net.createServer();
    s.once("error", reject);
    s.listen(0, "127.0.0.1", () => {
      const { port } = s.address() as net.AddressInfo;
      s.close(() => resolve(port));
    });
  });
}

/**
 * Another app process on the e2e database and upload folder (as tests/e2e/serve.sh sets them up),
 * on a free port, so a test can kill it outright and start it again.
 */
export async function secondServer() {
  const port = await freePort();
  const root = path.resolve(".");
  const admin = process.env.PG_ADMIN_URL;
  if (!admin) throw new Error("PG_ADMIN_URL is not set: run through scripts/with-db or scripts/test");
  const dbUrl = new URL(admin);
  dbUrl.pathname = `/loadframe_e2e_${E2E_PORT}`;
  const envs = {
    ...process.env,
    NODE_ENV: "production", PORT: String(port), PUBLIC_URL: `http://127.0.0.1:${port}`, DATABASE_URL: dbUrl.toString(),
    AUTH_SECRET: readFileSync(path.join(root, ".data", "auth-secret"), "utf8").trim(), UPLOAD_DIR: path.join(root, ".data", `e2e-uploads-${E2E_PORT}`),
    RATE_LIMIT: "false", LOG_LEVEL: "warn", EMBEDDED_WORKER: "false", SMTP_PORT: process.env.TEST_SMTP_PORT ?? "1125",
  };
  let child: ChildProcess | null = null;
  const base = `http://127.0.0.1:${port}`;
  const start = async () => {
    child = spawn(process.execPath, ["--import", "tsx", "server/index.ts"], { cwd: root, env: envs, stdio: ["ignore", "ignore", "pipe"] });
    let stderr = "";
    child.stderr?.on("data", (d) => (stderr += d));
    // A deadline in time, not a count of tries: a busy shared machine starts tsx slowly.
    for (const t0 = Date.now(); Date.now() - t0 < 90_000; ) {
      const ok = await fetch(`${base}/api/health`).then((r) => r.ok, () => false);
      if (ok) return;
      if (child.exitCode !== null) throw new Error(`second server exited: ${stderr}`);
      await new Promise((r) => setTimeout(r, 100));
    }
    throw new Error(`second server did not answer on ${base} within 90 s: ${stderr}`);
  };
  const kill = async () => {
    const c = child;
    if (!c || c.exitCode !== null) return;
    const gone = new Promise((r) => c.once("exit", r));
    c.kill("SIGKILL");
    await gone;
  };
  return { base, start, kill };
}
