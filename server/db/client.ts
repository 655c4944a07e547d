import { sql } from "drizzle-orm";
import { drizzle } from "drizzle-orm/node-postgres";
import pg from "pg";
import * as schema from "./schema";
import { env } from "../env";
import { clientWithDeadline } from "./query-deadline";

export type Db = ReturnType<typeof makeDb>;

/**
 * `queryDeadline: false` for work that is not a request's: migrations, which may rewrite a large
 * table for minutes and must not be cut off at a request's 30 s.
 */
export function makeDb(url: string, o: { queryDeadline?: boolean } = {}) {
  // Bounded waits: a request must never hang forever on a dead database. A query's 30 s are kept
  // by one watchdog, not node-postgres's timer per query (decision 199).
  const Client = o.queryDeadline === false ? pg.Client : clientWithDeadline(30_000);
  const pool = new pg.Pool({ connectionString: url, max: 10, connectionTimeoutMillis: 5_000, idleTimeoutMillis: 30_000, Client });
  pool.on("error", () => {
    /* a dropped idle client is replaced on next use */
  });
  return Object.assign(drizzle(pool, { schema }), { pool });
}

let cached: Db | undefined;
export function db(): Db {
  cached ??= makeDb(env().DATABASE_URL);
  return cached;
}

/** One round trip to the database (readiness). */
export async function pingDatabase(): Promise<void> {
  await db().execute(sql`select 1`);
}
