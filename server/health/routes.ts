import type { Express, Request, RequestHandler } from "express";
import { pingDatabase } from "../db/client";
import { readinessChecks } from "./checks";
import { isDraining } from "./draining";
import { readSession } from "../auth/context";
import { isAdminAnywhere } from "../entities/member/repository";

const LOOPBACK = /^(127\.\d+\.\d+\.\d+|::1|::ffff:127\.\d+\.\d+\.\d+)$/;

async function mayReadDetails(req: Request) {
  if (LOOPBACK.test(req.ip ?? "")) return true;
  const s = await readSession(req).catch(() => null);
  return !!s && (await isAdminAnywhere(s.user.id));
}

const CHECK_TIMEOUT_MS = 3000;

/**
 * Liveness and readiness as routes of the app itself, mounted before the hot reads: a router of
 * their own would be entered and left (a turn of the event loop) by every other API request
 * (decision 196).
 */
export function mountHealthRoutes(app: Express) {
  app.get("/api/health", liveness);
  app.get("/api/ready", readiness);
}

/** Liveness: the process answers. */
const liveness: RequestHandler = (_req, res) => void res.json({ ok: true });

/** Readiness: every dependency answers (database, queue, storage, ffmpeg); 503 names the one that does not. */
const readiness: RequestHandler = async (req, res) => {
  const checks: Record<string, { ok: boolean; detail?: string }> = {};
  const run = async (name: string, fn: () => Promise<unknown>) => {
    let timer: NodeJS.Timeout | undefined;
    try {
      const detail = await Promise.race([
        fn(),
        new Promise((_, rej) => (timer = setTimeout(() => rej(new Error(`timed out after ${CHECK_TIMEOUT_MS / 1000} s`)), CHECK_TIMEOUT_MS))),
      ]);
      checks[name] = typeof detail === "string" ? { ok: true, detail } : { ok: true };
    } catch (e) {
      checks[name] = { ok: false, detail: (e as Error).message };
    } finally {
      clearTimeout(timer);
    }
  };
  await Promise.all([
    run("database", pingDatabase),
    ...Object.entries(readinessChecks).map(([name, fn]) => run(name, fn)),
  ]);
  if (isDraining()) checks.process = { ok: false, detail: "shutting down" };
  const ok = Object.values(checks).every((c) => c.ok);
  res.setHeader("Cache-Control", "no-store");
  // Versions, free disk and error text are for whoever runs the machine: asked from the machine
  // itself, or by a signed-in team admin. Everyone else (a load balancer too) gets ok per check.
  const shown = (await mayReadDetails(req)) ? checks : Object.fromEntries(Object.entries(checks).map(([k, c]) => [k, { ok: c.ok }]));
  res.status(ok ? 200 : 503).json({ ok, checks: shown });
};
