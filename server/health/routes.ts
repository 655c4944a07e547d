import { Router } from "express";
import { sql } from "drizzle-orm";
import { db } from "../db/client";
import { readinessChecks } from "./checks";
import { isDraining } from "./draining";

const CHECK_TIMEOUT_MS = 3000;

export const healthRouter = Router();
/** Liveness: the process answers. */
healthRouter.get("/health", (_req, res) => void res.json({ ok: true }));
/** Readiness: every dependency answers (database, queue, storage, ffmpeg); 503 names the one that does not. */
healthRouter.get("/ready", async (_req, res) => {
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
    run("database", () => db().execute(sql`select 1`)),
    ...Object.entries(readinessChecks).map(([name, fn]) => run(name, fn)),
  ]);
  if (isDraining()) checks.process = { ok: false, detail: "shutting down" };
  const ok = Object.values(checks).every((c) => c.ok);
  res.setHeader("Cache-Control", "no-store");
  res.status(ok ? 200 : 503).json({ ok, checks });
});
