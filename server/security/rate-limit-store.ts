// express-rate-limit's Store interface over our PostgreSQL (decision 183): every web process
// counts against the same row, so N processes no longer allow N × the limit. One fixed window per
// key, reset in the same statement that counts, so two requests at once cannot both start it.
// Raw SQL on the shared pool, like the named locks: one upsert per counted request.
import type { ClientRateLimitInfo, Options, Store } from "express-rate-limit";
import { db } from "../db/client";

export class PostgresRateLimitStore implements Store {
  /** Keys of one limiter never meet another's. */
  readonly prefix: string;
  readonly localKeys = false;
  private windowMs = 60_000;

  constructor(name: string) {
    this.prefix = `${name}:`;
  }

  init(options: Options) {
    this.windowMs = options.windowMs;
  }

  async increment(key: string): Promise<ClientRateLimitInfo> {
    const r = await db().pool.query<{ hits: number; reset_at: Date }>(
      `insert into rate_limit_hit as h (key, hits, reset_at) values ($1, 1, now() + $2 * interval '1 millisecond')
       on conflict (key) do update set
         hits = case when h.reset_at <= now() then 1 else h.hits + 1 end,
         reset_at = case when h.reset_at <= now() then excluded.reset_at else h.reset_at end
       returning hits, reset_at`,
      [this.prefix + key, this.windowMs],
    );
    return { totalHits: r.rows[0]!.hits, resetTime: r.rows[0]!.reset_at };
  }

  async get(key: string): Promise<ClientRateLimitInfo | undefined> {
    const r = await db().pool.query<{ hits: number; reset_at: Date }>(
      "select hits, reset_at from rate_limit_hit where key = $1 and reset_at > now()", [this.prefix + key]);
    return r.rows[0] ? { totalHits: r.rows[0].hits, resetTime: r.rows[0].reset_at } : undefined;
  }

  async decrement(key: string) {
    await db().pool.query("update rate_limit_hit set hits = greatest(hits - 1, 0) where key = $1 and reset_at > now()", [this.prefix + key]);
  }

  async resetKey(key: string) {
    await db().pool.query("delete from rate_limit_hit where key = $1", [this.prefix + key]);
  }
}

/** Windows that ended: removed by the periodic sweep (a row per address would otherwise stay). */
export async function removeEndedWindows(): Promise<number> {
  const r = await db().pool.query("delete from rate_limit_hit where reset_at < now() - interval '1 minute'");
  return r.rowCount ?? 0;
}
