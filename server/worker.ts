// A worker process: runs queued jobs only (no HTTP). Start any number, on any machine that
// reaches the same PostgreSQL and storage.
process.env.LF_PROCESS ??= "worker";
const { tuneHeap } = await import("./heap");
tuneHeap();
const { env } = await import("./env");
const { log } = await import("./log");
const { startJobs, stopJobs } = await import("./jobs/runtime");
const { db } = await import("./db/client");
const { onShutdown } = await import("./shutdown");
const { warmUpTracker } = await import("../shared/tracking/warm-up");
try {
  env();
} catch (err) {
  console.error((err as Error).message);
  process.exit(2);
}
// Before taking jobs: OpenCV loaded and the tracker run once, so the first shot costs what any other does.
const warm = await warmUpTracker();
log.info({ seconds: Math.round(warm.seconds * 1000) / 1000, landmarkFrames: warm.landmarkFrames, error: warm.error }, "tracker warmed up");
await startJobs({ work: true, timekeeper: false });
log.info({ pid: process.pid }, "worker ready");

// Take no new jobs; a running job gets a grace period, after which pg-boss marks it failed so it
// is retried (on another worker) while attempts remain. A worker killed outright leaves its job
// to expiry and the clip sweep.
onShutdown("worker", async () => {
  await stopJobs();
  await db().pool.end();
});
export {};
