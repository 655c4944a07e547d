// Named prepared statements for the queries every page load runs (docs/decisions/106-hot-path-queries.md).
// Drizzle then builds the SQL text once per process instead of on every call, and PostgreSQL
// parses and plans it once per pooled connection: about 0.2 ms of CPU saved per query, more for
// wide selects (scripts/bench/load.ts).
import { fillPlaceholders, type SQL } from "drizzle-orm";
import { PgDialect } from "drizzle-orm/pg-core";
import { db } from "./client";

/** One prepared statement per key, built on first use. Keys must be few and fixed (a filter combination, a sort). */
export function preparedBy<K extends string, P>(name: string, build: (name: string, key: K) => P): (key: K) => P {
  const made = new Map<K, P>();
  return (key) => {
    let p = made.get(key);
    if (!p) made.set(key, (p = build(`${name}:${key}`, key)));
    return p;
  };
}

/** A single prepared statement, built on first use. */
export function prepared<P>(name: string, build: (name: string) => P): () => P {
  const get = preparedBy<"", P>(name, (n) => build(n));
  return () => get("");
}

/**
 * A statement built with Drizzle's `sql` (placeholders included) and run through the pool as a
 * named prepared statement, its rows as pg parses them: no Drizzle row mapping. For hot reads whose
 * statement answers one row of a few values, JSON text built by PostgreSQL among them
 * (docs/decisions/195-hot-reads-in-one-statement.md).
 */
export function rawPrepared<R extends Record<string, unknown>>(name: string, build: () => SQL): ((values: Record<string, unknown>) => Promise<R[]>) & { text: () => string } {
  let made: { text: string; params: unknown[] } | undefined;
  const make = () => (made ??= (({ sql: text, params }) => ({ text, params }))(new PgDialect().sqlToQuery(build())));
  const run = async (values: Record<string, unknown>) => {
    const { text, params } = make();
    const r = await db().pool.query<R>({ name, text, values: fillPlaceholders(params, values) });
    return r.rows;
  };
  // The statement's SQL text (tests/api/answer-cache.test.ts reads which tables it reads).
  return Object.assign(run, { text: () => make().text });
}
