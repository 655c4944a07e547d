// The pool's deadline on a query (decision 199): one watchdog instead of node-postgres's timer per
// query. A database that stops answering (the connection stays open, nothing comes back) must
// fail the query within its deadline as "database down", leave the process standing and the pool
// usable once the database answers again; a query that merely takes a while, or a client that sat
// idle past the deadline, must not be cut.
import net from "node:net";
import pg from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { clientWithDeadline, QUERY_TIMEOUT_MESSAGE } from "../../server/db/query-deadline";
import { isDatabaseDown } from "../../server/http/database-down";

const target = new URL(process.env.DATABASE_URL!);
let silent = false;
// A loopback proxy to the test database that can go silent: it keeps every connection open but
// forwards nothing, as a database host that vanished from the network would look.
const proxy = net.createServer((client) => {
  const upstream = net.connect(Number(target.port), target.hostname);
  for (const s of [client, upstream]) s.on("error", () => s.destroy());
  client.on("data", (d) => void (silent || upstream.write(d)));
  upstream.on("data", (d) => void (silent || client.write(d)));
  client.on("close", () => upstream.destroy());
  upstream.on("close", () => client.destroy());
});
let pool: pg.Pool;

beforeAll(async () => {
  await new Promise<void>((r) => proxy.listen(0, "127.0.0.1", () => r()));
  const via = new URL(process.env.DATABASE_URL!);
  via.port = String((proxy.address() as net.AddressInfo).port);
  pool = new pg.Pool({ connectionString: via.toString(), max: 2, Client: clientWithDeadline(600, 50) });
  pool.on("error", () => {});
});
afterAll(async () => {
  await pool.end();
  proxy.close();
});

describe("a query's deadline", () => {
  it("lets a slow query finish, and an idle client past the deadline keeps working", async () => {
    const r = await pool.query("select pg_sleep(0.3), 1 as one");
    expect(r.rows[0].one).toBe(1);
    await new Promise((res) => setTimeout(res, 900)); // idle longer than the deadline
    expect((await pool.query("select 2 as two")).rows[0].two).toBe(2);
  });

  it("fails a query the database never answers, as 'database down', within the deadline", async () => {
    silent = true;
    const t0 = performance.now();
    const err = await pool.query("select 3").then(() => null, (e: unknown) => e as Error);
    const waited = performance.now() - t0;
    silent = false;
    expect(err?.message).toBe(QUERY_TIMEOUT_MESSAGE);
    expect(isDatabaseDown(err)).toBe(true);
    expect(waited).toBeGreaterThanOrEqual(550);
    expect(waited).toBeLessThan(5_000);
  });

  it("leaves the pool usable once the database answers again", async () => {
    const rows = await Promise.all([1, 2, 3].map(async (n) => (await pool.query("select $1::int as n", [n])).rows[0].n));
    expect(rows).toEqual([1, 2, 3]);
  });

  it("is the web process pool's client", async () => {
    const { db } = await import("../../server/db/client");
    const c = await db().pool.connect();
    try {
      expect(c.constructor.name).toBe("DeadlineClient");
      expect((c as unknown as { connectionParameters: { query_timeout?: number } }).connectionParameters.query_timeout, "no timer per query").toBeFalsy();
    } finally {
      c.release();
    }
  });
});
