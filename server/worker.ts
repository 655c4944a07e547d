// A worker process: runs queued jobs only (no HTTP). Start any number, on any machine that
// reaches the same PostgreSQL and storage.
process.env.LF_PROCESS ??= "worker";
const { env } = await import("./env");
const { log } = await import("./log");
const { startJobs, stopJobs } = await import("./jobs/runtime");
try {
  env();
} catch (err) {
  console.error((err as Error).message);
  process.exit(2);
}
await startJobs({ work: true });
log.info({ pid: process.pid }, "worker ready");
const stop = async () => {
  await stopJobs().catch(() => {});
  process.exit(0);
};
process.on("SIGINT", () => void stop());
process.on("SIGTERM", () => void stop());
export {};
