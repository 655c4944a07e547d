import { createServer } from "node:http";
import { env } from "./env";
import { log } from "./log";
import { createApp } from "./app";
import { startJobs, stopJobs } from "./jobs/runtime";
import { db } from "./db/client";

async function main() {
  let e;
  try {
    e = env();
  } catch (err) {
    console.error((err as Error).message);
    process.exit(2);
  }
  const server = createServer(createApp());
  server.requestTimeout = 0; // large resumable uploads; each chunk is bounded by tus itself
  server.headersTimeout = 60_000;
  server.on("error", (err: NodeJS.ErrnoException) => {
    if (err.code === "EADDRINUSE") console.error(`Port ${e.PORT} on ${e.HOST} is already in use. Stop the other program or set PORT.`);
    else console.error(err);
    process.exit(1);
  });
  await startJobs({ work: e.EMBEDDED_WORKER });
  server.listen(e.PORT, e.HOST, () => log.info({ url: `http://${e.HOST}:${e.PORT}` }, "Loadframe is listening"));

  let stopping = false;
  const stop = async (signal: string) => {
    if (stopping) return;
    stopping = true;
    log.info({ signal }, "shutting down");
    server.close();
    server.closeIdleConnections();
    setTimeout(() => server.closeAllConnections(), 5_000).unref();
    await stopJobs().catch(() => {});
    await db().pool.end().catch(() => {});
    process.exit(0);
  };
  process.on("SIGINT", () => void stop("SIGINT"));
  process.on("SIGTERM", () => void stop("SIGTERM"));
}

void main();
