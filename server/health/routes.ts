import { Router } from "express";
import { sql } from "drizzle-orm";
import { db } from "../db/client";
import { readinessChecks } from "./checks";

export const healthRouter = Router();
/** Liveness: the process answers. */
healthRouter.get("/health", (_req, res) => void res.json({ ok: true }));
/** Readiness: every dependency answers (database, queue, storage, ffmpeg). */
healthRouter.get("/ready", async (_req, res) => {
  const checks: Record<string, { ok: boolean; detail?: string }> = {};
  const run = async (name: string, fn: () => Promise<unknown>) => {
    try {
      await Promise.race([fn(), new Promise((_, rej) => setTimeout(() => rej(new Error("timed out after 3 s")), 3000))]);
      checks[name] = { ok: true };
    } catch (e) {
      checks[name] = { ok: false, detail: (e as Error).message };
    }
  };
  await run("database", () => db().execute(sql`select 1`));
  for (const [name, fn] of Object.entries(readinessChecks)) await run(name, fn);
  const ok = Object.values(checks).every((c) => c.ok);
  res.status(ok ? 200 : 503).json({ ok, checks });
});
