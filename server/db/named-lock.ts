// One named lock across every process: a session-level advisory lock (PostgreSQL manual §13.3.5)
// held on its own pooled connection while `fn` runs, so a check and the write it allows cannot
// interleave with another request's, even when the write goes through a library's own connection.
import { db } from "./client";

export async function withNamedLock<T>(name: string, fn: () => Promise<T>): Promise<T> {
  const client = await db().pool.connect();
  try {
    await client.query("select pg_advisory_lock(hashtext($1))", [name]);
    return await fn();
  } finally {
    await client.query("select pg_advisory_unlock(hashtext($1))", [name]).catch(() => undefined);
    client.release();
  }
}
