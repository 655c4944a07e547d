// Queries that share one pg.Client take their turn. node-postgres queues a query sent while another
// runs on the same client, but deprecates that (pg 9 drops it); code that keeps one connection on
// purpose (a session's advisory locks, LISTEN, a bench's own writer) sends through here instead,
// and the queries run in the order they were sent, as pg's queue ran them.
import pg from "pg";

const turns = new WeakMap<pg.Client, Promise<unknown>>();

export function inTurn<R extends pg.QueryResultRow>(c: pg.Client, text: string, values?: unknown[]): Promise<pg.QueryResult<R>> {
  const run = (turns.get(c) ?? Promise.resolve()).then(() => c.query<R>(text, values));
  turns.set(c, run.catch(() => undefined));
  return run;
}
