// WEB_PROCESSES > 1: this process becomes the supervisor of N web processes that share one
// listening port through Node's cluster module (on Linux the supervisor hands each new connection
// to the next process in turn). Nothing in a web process is kept in memory that another needs:
// sessions are signed cookies, everything else, the upload lock included, is in PostgreSQL
// (decisions 105, 170). The supervisor opens no database connection; it restarts a process that
// dies and passes a stop signal on to all of them.
import cluster, { type Worker } from "node:cluster";
import { log } from "./log";

/** Starts `count` web processes. Only the first runs jobs when EMBEDDED_WORKER is on, so N web
 * processes do not mean N frame extractions at once on a small machine. */
export function superviseWebProcesses(count: number, embeddedWorker: boolean) {
  let stopping = false;
  const fork = (n: number): Worker => {
    let listened = false;
    const w = cluster.fork({ LF_PROCESS: `web-${n}`, EMBEDDED_WORKER: String(embeddedWorker && n === 1) });
    w.once("listening", () => (listened = true));
    w.on("exit", (code, signal) => {
      if (stopping) return;
      if (!listened) {
        // It could not start (a bad setting, the port taken): starting it again would loop.
        log.error({ process: `web-${n}`, code, signal }, "a web process stopped while starting; stopping them all");
        stop("SIGTERM", 1);
        return;
      }
      log.error({ process: `web-${n}`, code, signal }, "a web process stopped unexpectedly; starting it again");
      setTimeout(() => fork(n), 1000);
    });
    return w;
  };
  for (let n = 1; n <= count; n++) fork(n);
  log.info({ count }, "web processes started");

  function stop(signal: NodeJS.Signals, exitCode = 0) {
    if (stopping) return;
    stopping = true;
    // Each process drains on its own (server/index.ts); the supervisor waits for all of them.
    for (const w of Object.values(cluster.workers ?? {})) w?.process.kill(signal);
    const left = () => Object.values(cluster.workers ?? {}).filter((w) => w && !w.isDead()).length;
    const check = setInterval(() => {
      if (left() === 0) {
        clearInterval(check);
        process.exit(exitCode);
      }
    }, 100);
  }
  process.on("SIGINT", () => stop("SIGTERM"));
  process.on("SIGTERM", () => stop("SIGTERM"));
}
