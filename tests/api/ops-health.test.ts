// Liveness and readiness: /api/ready names each dependency and answers 503 with the reason when
// one is missing (queue not installed, ffmpeg not found, process shutting down).
import { mkdtemp, rm } from "node:fs/promises";
import os from "node:os";
import path from "node:path";
process.env.UPLOAD_DIR = await mkdtemp(path.join(os.tmpdir(), "lf-health-"));
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { startServer, type TestServer } from "./helpers";
import { env } from "../../server/env";
import { startJobs, stopJobs } from "../../server/jobs/runtime";
import { forgetFfmpegCheck } from "../../server/health/readiness";

let srv: TestServer;
beforeAll(async () => {
  srv = await startServer();
});
afterAll(async () => {
  await stopJobs();
  await srv.close();
  await rm(process.env.UPLOAD_DIR!, { recursive: true, force: true });
});

const ready = async () => {
  const r = await fetch(`${srv.url}/api/ready`);
  return { status: r.status, body: (await r.json()) as { ok: boolean; checks: Record<string, { ok: boolean; detail?: string }> } };
};

describe("health", () => {
  it("answers liveness without touching any dependency", async () => {
    const r = await fetch(`${srv.url}/api/health`);
    expect(r.status).toBe(200);
    expect(await r.json()).toEqual({ ok: true });
  });

  it("is not ready before the queue exists, and says so", async () => {
    const r = await ready();
    expect(r.status).toBe(503);
    expect(r.body.checks.database.ok).toBe(true);
    expect(r.body.checks.queue).toMatchObject({ ok: false });
    expect(r.body.checks.queue.detail).toMatch(/queue/);
  });

  it("is ready once the queue runs, with a detail per dependency", async () => {
    await startJobs({ work: false });
    const r = await ready();
    expect(r.status).toBe(200);
    expect(Object.keys(r.body.checks).sort()).toEqual(["database", "ffmpeg", "queue", "storage"]);
    expect(r.body.checks.queue.detail).toMatch(/^0 waiting, 0 running$/);
    expect(r.body.checks.storage.detail).toMatch(/^local disk, [\d.]+ GiB free$/);
    expect(r.body.checks.ffmpeg.detail).toMatch(/^ffmpeg version \S+; ffprobe version \S+$/);
  });

  it("counts waiting jobs", async () => {
    const { enqueue } = await import("../../server/jobs/runtime");
    await enqueue("clip.extract", { clipId: crypto.randomUUID() });
    expect((await ready()).body.checks.queue.detail).toMatch(/^1 waiting, 0 running$/);
  });

  it("is not ready when ffmpeg cannot be started", async () => {
    const real = env().FFMPEG_PATH;
    env().FFMPEG_PATH = "/nonexistent/ffmpeg";
    forgetFfmpegCheck();
    try {
      const r = await ready();
      expect(r.status).toBe(503);
      expect(r.body.checks.ffmpeg.ok).toBe(false);
      expect(r.body.checks.ffmpeg.detail).toMatch(/ffmpeg could not be started/);
      expect(r.body.checks.storage.ok).toBe(true);
    } finally {
      env().FFMPEG_PATH = real;
      forgetFfmpegCheck();
    }
    expect((await ready()).status).toBe(200);
  });

  it("turns not ready while shutting down, so a load balancer drains it", async () => {
    const { startDraining } = await import("../../server/health/draining");
    startDraining();
    const r = await ready();
    expect(r.status).toBe(503);
    expect(r.body.checks.process).toEqual({ ok: false, detail: "shutting down" });
  });
});
