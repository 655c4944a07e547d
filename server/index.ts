import cluster from "node:cluster";
import { env } from "./env";
import { log } from "./log";
import { createApp } from "./app";
import { createWebServer } from "./http/web-server";
import { startJobs, stopJobs } from "./jobs/runtime";
import { db } from "./db/client";
import { startDraining } from "./health/draining";
import { onShutdown } from "./shutdown";
import { closeUploads } from "./clips/uploads";
import { closeCpuPool, startCpuPool } from "./cpu/pool";
import { superviseWebProcesses } from "./web-processes";
import { tuneHeap } from "./heap";

async function main() {
  let e;
  try {
    e = env();
  } catch (err) {
    console.error((err as Error).message);
    process.exit(2);
  }
  if (e.WEB_PROCESSES > 1 && cluster.isPrimary) return superviseWebProcesses(e.WEB_PROCESSES, e.EMBEDDED_WORKER);
  // Each first read of a shot's readout leaves ~300 kB of buffers to collect (decision 193).
  tuneHeap();
  const server = createWebServer(createApp());
  server.on("error", (err: NodeJS.ErrnoException) => {
    if (err.code === "EADDRINUSE") console.error(`Port ${e.PORT} on ${e.HOST} is already in use. Stop the other program or set PORT.`);
    else console.error(err);
    process.exit(1);
  });
  await startJobs({ work: e.EMBEDDED_WORKER });
  startCpuPool();
  server.listen(e.PORT, e.HOST, () => log.info({ url: `http://${e.HOST}:${e.PORT}` }, "Loadframe is listening"));

  // Graceful shutdown: /api/ready turns 503, no new connections, running requests get a grace
  // period, running jobs finish or are handed back to the queue (pg-boss retries them
  // elsewhere), then the pool closes.
  onShutdown("web server", async () => {
    startDraining();
    const closed = new Promise<void>((resolve) => server.close(() => resolve()));
    server.closeIdleConnections();
    setTimeout(() => server.closeAllConnections(), 10_000).unref();
    await Promise.all([closed, stopJobs()]);
    await Promise.all([db().pool.end(), closeUploads(), closeCpuPool()]);
  });
}

void main();
