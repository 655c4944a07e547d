// The process's pg-boss instance once runtime.ts started it. Senders import this, not runtime.ts:
// runtime.ts registers the handlers, and handlers send jobs, so the two stay one-way.
import type PgBoss from "pg-boss";
import type { JobName, JobTypes } from "./types";

let boss: PgBoss | undefined;

export function setQueue(b: PgBoss | undefined) {
  boss = b;
}

/** Sends a job; null when a singleton key's policy joined it to one already waiting. */
export async function enqueue<N extends JobName>(name: N, data: JobTypes[N], opts: { singletonKey?: string; startAfter?: number } = {}) {
  if (!boss) throw new Error("job queue not started");
  return boss.send(name, data as object, opts);
}

export function queue() {
  if (!boss) throw new Error("job queue not started");
  return boss;
}

/** The queue if this process started one (server, worker); scripts and most tests have none. */
export function startedQueue(): PgBoss | undefined {
  return boss;
}
