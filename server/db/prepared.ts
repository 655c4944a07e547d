// Named prepared statements for the queries every page load runs (docs/decisions/106-hot-path-queries.md).
// Drizzle then builds the SQL text once per process instead of on every call, and PostgreSQL
// parses and plans it once per pooled connection: about 0.2 ms of CPU saved per query, more for
// wide selects (scripts/bench/load.ts).

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
