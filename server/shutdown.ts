// Graceful stop on SIGTERM/SIGINT for the web and worker processes: run `drain` (bounded by a
// deadline), then exit. A terminal's Ctrl-C and a supervisor's SIGTERM often arrive together, so
// only a second signal that comes a while after the first means "stop now".
import { log } from "./log";

const REPEAT_MS = 2000;

export function onShutdown(what: string, drain: () => Promise<void>, deadlineMs = 30_000) {
  let since = 0;
  const stop = async (signal: string) => {
    if (since) {
      if (Date.now() - since < REPEAT_MS) return;
      log.warn({ signal }, `second signal: ${what} exits without waiting`);
      process.exit(1);
    }
    since = Date.now();
    log.info({ signal }, `${what} stopping`);
    setTimeout(() => {
      log.error(`${what} took longer than ${deadlineMs / 1000} s to stop; exiting`);
      process.exit(1);
    }, deadlineMs).unref();
    await drain().catch((err) => log.warn({ err }, `${what} did not stop cleanly`));
    log.info(`${what} stopped`);
    process.exit(0);
  };
  process.on("SIGINT", () => void stop("SIGINT"));
  process.on("SIGTERM", () => void stop("SIGTERM"));
}
