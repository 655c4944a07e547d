// Recompute jobs on the queue. One waiting job per clip, stick or shot (pg-boss's "stately"
// policy on the singleton key): triggers while it waits join it, since the job reads the inputs
// when it runs. It waits until the triggers have paused for a moment, so a burst (a scale bar
// being dragged writes the calibration every few hundred milliseconds) becomes one run, or two
// when a run had already started.
import { env } from "../env";
import { log } from "../log";
import { enqueue, startedQueue } from "./queue";
import type { RecomputeTarget } from "./types";

export type { RecomputeTarget };

/** Seconds a recompute waits for more triggers before it may start. */
const recomputeDelaySeconds = () => env().RECOMPUTE_DELAY_SECONDS;

export const recomputeKey = (t: RecomputeTarget) => `${t.scope}:${t.id}`;

/** Whether this process can queue recomputes (servers and workers can; scripts and most tests cannot). */
export const canQueueRecompute = () => !!startedQueue();

/** Longest a waiting recompute is put off by a burst that goes on (seconds after it was queued). */
const MAX_POSTPONE_SECONDS = 10;

/**
 * Queue the target's recompute; null when it joined the one already waiting. Joining also moves
 * that job's start to a delay from now (never past MAX_POSTPONE_SECONDS after it was queued), so
 * a burst of triggers runs once, when it stops.
 */
export async function sendRecompute(t: RecomputeTarget, reqId?: string): Promise<string | null> {
  const key = recomputeKey(t);
  const delay = recomputeDelaySeconds();
  const id = await enqueue("shot.recompute", { scope: t.scope, id: t.id, reqId }, { singletonKey: key, startAfter: delay });
  if (id) return id;
  // pg-boss 10 has no "debounce": its own job table is updated, as clip-queue.ts reads it.
  await startedQueue()!.getDb().executeSql(
    `update pgboss.job set start_after = least(now() + make_interval(secs => $2), created_on + make_interval(secs => $3))
     where name = 'shot.recompute' and singleton_key = $1 and state = 'created'`,
    [key, delay, MAX_POSTPONE_SECONDS],
  );
  log.debug({ target: key }, "recompute joined the one already waiting");
  return null;
}
