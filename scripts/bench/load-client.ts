// An open-loop load generator: request i is sent at start + i/rate whatever happened to the
// earlier ones, and its latency is counted from that planned moment, so a slow server cannot hide
// its queue by slowing the client down (no coordinated omission). Bounded by count and time.
import http from "node:http";
import { quantileSorted } from "simple-statistics";

/**
 * A light GET client for the generator: node:http over keep-alive sockets, with a cookie jar that
 * takes Set-Cookie like a browser (the session cookie cache is refreshed that way). The generator
 * shares the machine with the server, so it should cost as little CPU as it can: fetch() took
 * about 1.3 ms of CPU a request here, this about 0.7 ms (measured in one run, same server).
 */
export function httpClient(cookie = "") {
  const agent = new http.Agent({ keepAlive: true, maxSockets: 512 });
  // Bytes of the answers' bodies, so each row can say how much it sends a request.
  const received = { bodies: 0, bytes: 0 };
  const jar = new Map(cookie.split("; ").filter(Boolean).map((c) => [c.slice(0, c.indexOf("=")), c.slice(c.indexOf("=") + 1)] as const));
  const take = (setCookie: string[] | undefined) => {
    for (const c of setCookie ?? []) {
      const [pair] = c.split(";");
      const k = pair.slice(0, pair.indexOf("="));
      if (/max-age=0/i.test(c)) jar.delete(k);
      else jar.set(k, pair.slice(pair.indexOf("=") + 1));
    }
  };
  const get = (url: string, signal: AbortSignal) =>
    new Promise<number>((resolve, reject) => {
      const headers = jar.size ? { cookie: [...jar].map(([k, v]) => `${k}=${v}`).join("; ") } : {};
      const q = http.get(url, { agent, headers, signal }, (res) => {
        take(res.headers["set-cookie"]);
        res.on("data", (chunk: Buffer) => (received.bytes += chunk.length));
        res.on("end", () => (received.bodies++, resolve(res.statusCode ?? 0)));
        res.on("error", reject);
      });
      // Say whether a failed request went out on a kept-alive socket (the race with the server
      // closing an idle one) or a new one.
      q.on("error", (err: NodeJS.ErrnoException) => reject(Object.assign(new Error(`${err.code ?? err.message}${q.reusedSocket ? " on a reused socket" : ""}`), { cause: err })));
    });
  return { get, received, close: () => agent.destroy() };
}

export interface Figures { n: number; errors: number; errorKinds: Record<string, number>; p50: number; p95: number; p99: number; max: number; achievedRps: number }

export function figures(ms: number[], errorKinds: Record<string, number> = {}, seconds = 0): Figures {
  const s = [...ms].sort((a, b) => a - b);
  const q = (p: number) => (s.length ? quantileSorted(s, p) : NaN);
  const errors = Object.values(errorKinds).reduce((a, b) => a + b, 0);
  return { n: ms.length, errors, errorKinds, p50: q(0.5), p95: q(0.95), p99: q(0.99), max: s.at(-1) ?? NaN, achievedRps: seconds ? ms.length / seconds : NaN };
}

/** `request` answers true for a good answer, or false or a short reason ("status 503") for a bad one. */
export async function openLoop(o: { rate: number; seconds: number; timeoutMs: number; request: (i: number, signal: AbortSignal) => Promise<boolean | string> }): Promise<Figures> {
  const total = Math.round(o.rate * o.seconds);
  const ms: number[] = [];
  const errorKinds: Record<string, number> = {};
  const failed = (kind: string) => (errorKinds[kind] = (errorKinds[kind] ?? 0) + 1);
  const t0 = performance.now() + 50;
  const inflight: Promise<void>[] = [];
  for (let i = 0; i < total; i++) {
    const planned = t0 + (i * 1000) / o.rate;
    const wait = planned - performance.now();
    if (wait > 1) await new Promise((r) => setTimeout(r, wait));
    inflight.push(
      o.request(i, AbortSignal.timeout(o.timeoutMs)).then(
        (ok) => {
          ms.push(performance.now() - planned);
          if (ok !== true) failed(ok === false ? "not 200" : ok);
        },
        (err: Error) => {
          ms.push(performance.now() - planned);
          failed(err.name === "TimeoutError" || err.name === "AbortError" ? "timed out" : err.message);
        },
      ),
    );
  }
  await Promise.all(inflight);
  return figures(ms, errorKinds, (performance.now() - t0) / 1000);
}

/** The same work one at a time, for the raw baseline. */
export async function sequential(n: number, fn: (i: number) => Promise<unknown>): Promise<Figures> {
  const ms: number[] = [];
  for (let i = 0; i < n; i++) {
    const t = performance.now();
    await fn(i);
    ms.push(performance.now() - t);
  }
  return figures(ms);
}

export const fmt = (f: Figures) =>
  `n=${f.n}${f.errors ? ` errors=${f.errors} (${Object.entries(f.errorKinds).map(([k, n]) => `${n}× ${k}`).join(", ")})` : ""} p50 ${f.p50.toFixed(1)} ms  p95 ${f.p95.toFixed(1)} ms  p99 ${f.p99.toFixed(1)} ms  max ${f.max.toFixed(1)} ms${Number.isNaN(f.achievedRps) ? "" : `  (${f.achievedRps.toFixed(0)} req/s)`}`;
