// A deadline on every query of the pool, kept by one watchdog per process instead of a timer per
// query (docs/decisions/199-first-read-bytes-and-one-query-watchdog.md). node-postgres's own
// `query_timeout` arms a setTimeout for each query whose callback holds the query; measured in a
// web process, that kept about half of what each query allocated (its rows, a readout's ~80 kB of
// results text among them) alive through young-generation collections, which then copied and
// promoted it: a shot's first read paid for it in collections and fresh pages.
import pg from "pg";

/** What a query that ran out of time fails with (server/http/database-down.ts knows the words). */
export const QUERY_TIMEOUT_MESSAGE = "Query read timeout";

// Each client with a query in flight, and when its time runs out (counted from the first query of
// a busy stretch: a pool client runs its queries one after another, and `drain` ends the stretch).
const busy = new Map<pg.Client, number>();
let watchdog: NodeJS.Timeout | undefined;
let watchEveryMs = Infinity;

/**
 * A pg.Client class for pg.Pool's `Client` option: a query still unanswered `ms` after it was
 * sent fails with "Query read timeout" and its connection is dropped (the pool replaces it), so a
 * request never waits forever on a database that stopped answering. Checked every `everyMs` (the
 * shortest any such class asked for).
 */
export function clientWithDeadline(ms: number, everyMs = 1_000): typeof pg.Client {
  class DeadlineClient extends pg.Client {
    constructor(config?: string | pg.ClientConfig) {
      super(config);
      const done = () => void busy.delete(this);
      this.on("drain", done);
      this.on("end", done);
      this.on("error", done);
    }
  }
  // pg's query() has many overloads: wrap the method as it is rather than declare them again.
  const send = pg.Client.prototype.query as (...args: unknown[]) => unknown;
  DeadlineClient.prototype.query = function (this: pg.Client, ...args: unknown[]) {
    if (!busy.has(this)) busy.set(this, performance.now() + ms);
    if (everyMs < watchEveryMs) {
      clearInterval(watchdog);
      watchdog = setInterval(expire, (watchEveryMs = everyMs)).unref();
    }
    return send.apply(this, args);
  } as typeof pg.Client.prototype.query;
  return DeadlineClient;
}

function expire() {
  const now = performance.now();
  for (const [client, until] of busy) {
    if (now <= until) continue;
    busy.delete(client);
    // Dropping the socket fails the query in flight with this error, whether or not the server
    // still answers (ending it politely would wait for a server that may never reply).
    (client as unknown as { connection: { stream: { destroy(err: Error): void } } }).connection.stream.destroy(new Error(QUERY_TIMEOUT_MESSAGE));
  }
}
