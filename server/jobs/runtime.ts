import PgBoss from "pg-boss";
import { env } from "../env";
import { log } from "../log";
import { isDatabaseDown } from "../http/database-down";
import { jobPolicies, type JobName } from "./types";
import { handlers } from "./handlers";
import { setQueue, startedQueue } from "./queue";
import { withNamedLock } from "../db/named-lock";

export { enqueue, queue } from "./queue";

/**
 * pg-boss 10 marks a finished job complete (or failed) without awaiting it (src/manager.js,
 * `onFetch`): when PostgreSQL is away at that moment the rejection has no handler, and Node would
 * stop the whole process — web requests included. Such a rejection is logged instead: the job
 * stays active until it expires and is retried by its policy. Anything else still stops the
 * process, as Node does by default.
 */
function keepRunningWhenTheDatabaseDropsACompletion() {
  if (process.listenerCount("unhandledRejection") > 0) return;
  process.on("unhandledRejection", (err) => {
    if (isDatabaseDown(err)) return log.warn({ err }, "job queue: could not record a job's end while the database was away; it will expire and be retried");
    log.fatal({ err }, "unhandled rejection");
    process.exit(1);
  });
}

/**
 * Start the queue (pg-boss on our PostgreSQL); with work=true this process also runs jobs.
 * `timekeeper: false` (worker processes): pg-boss's cron check (every 30 s in every process that
 * has it, the first to claim the tick evaluating each schedule with cron-parser) and the queue
 * that turns schedules into jobs are left to the web processes, so a worker's CPU goes to its
 * jobs; it still runs the jobs those schedules create.
 */
export async function startJobs({ work, timekeeper = true }: { work: boolean; timekeeper?: boolean }) {
  if (work) keepRunningWhenTheDatabaseDropsACompletion();
  const boss = new PgBoss({ connectionString: env().DATABASE_URL, schema: "pgboss", max: 5, schedule: timekeeper });
  setQueue(boss);
  boss.on("error", (err) => log.error({ err }, "queue error"));
  // Processes starting at once on a fresh database (WEB_PROCESSES, workers) would race pg-boss's
  // schema set-up and its check-then-insert of each queue: one lock across processes around both.
  await withNamedLock("pgboss.setup", async () => {
    await boss.start();
    for (const name of Object.keys(jobPolicies) as JobName[]) {
      // pg-boss 10: a queue must exist before send(), or send silently returns null.
      const p = jobPolicies[name];
      await boss.createQueue(name, { name, policy: p.policy ?? "standard", retryLimit: p.retryLimit, retryDelay: p.retryDelaySeconds, retryBackoff: p.retryBackoff, expireInSeconds: p.expireInSeconds });
    }
  });
  if (work) {
    for (const name of Object.keys(handlers) as JobName[]) {
      const handler = handlers[name];
      if (!handler) continue;
      const p = jobPolicies[name];
      // pg-boss 10 has no per-call concurrency: one work() subscription per slot.
      for (let slot = 0; slot < p.concurrency; slot++) {
        await boss.work(name, { batchSize: 1, includeMetadata: true, pollingIntervalSeconds: 0.5 }, async ([job]) => {
          const jl = log.child({ job: name, jobId: job.id, reqId: (job.data as { reqId?: string }).reqId });
          jl.info("job started");
          // eslint-disable-next-line @typescript-eslint/no-explicit-any
          await (handler as any)(job.data, { jobId: job.id, log: jl, retryCount: job.retryCount });
          jl.info("job done");
        });
      }
    }
  }
  return boss;
}

/** Stop taking jobs; running ones get a grace period, then pg-boss hands them back. */
export async function stopJobs() {
  const boss = startedQueue();
  if (!boss) return;
  await boss.stop({ graceful: true, timeout: 20_000, wait: true });
  setQueue(undefined);
}
