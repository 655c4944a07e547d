// Reads of pg-boss's own tables (schema pgboss): pg-boss keeps its jobs in PostgreSQL, and a few
// questions it has no call for (a clip's live jobs by payload, a job's state after a failure, the
// queues and job counts for readiness) are answered here in SQL.
import { sql } from "drizzle-orm";
import { db } from "./client";

export type LiveJobState = "created" | "retry" | "active";

/** Waiting and running jobs of `name` whose payload has `key` = `value`. */
export async function liveJobsWith(name: string, key: string, value: string) {
  const r = await db().execute<{ id: string; state: LiveJobState; started_on: Date | null; retry_count: number }>(
    sql`select id, state, started_on, retry_count from pgboss.job
        where name = ${name} and data->>${key} = ${value} and state in ('created', 'retry', 'active')`,
  );
  return r.rows.map((j) => ({ id: j.id, state: j.state, startedOn: j.started_on, retryCount: j.retry_count }));
}

/** The state pg-boss holds for a job; null when there is no such job. */
export async function jobStateOf(jobId: string): Promise<string | null> {
  const r = await db().execute<{ state: string }>(sql`select state from pgboss.job where id = ${jobId}`);
  return r.rows[0]?.state ?? null;
}

/** The names of the queues pg-boss has created (throws when its schema is not installed). */
export async function queueNames(): Promise<Set<string>> {
  const r = await db().execute<{ name: string }>(sql`select name from pgboss.queue`);
  return new Set(r.rows.map((q) => q.name));
}

/** Jobs waiting (created or to be retried) and running, over every queue. */
export async function liveJobCounts(): Promise<{ waiting: number; running: number }> {
  const r = await db().execute<{ state: string; n: number }>(
    sql`select state, count(*)::int as n from pgboss.job where state in ('created', 'retry', 'active') group by state`,
  );
  const by = Object.fromEntries(r.rows.map((x) => [x.state, x.n]));
  return { waiting: (by.created ?? 0) + (by.retry ?? 0), running: by.active ?? 0 };
}
