import { randomUUID } from "node:crypto";
import type { Request, Response } from "express";
import pino from "pino";

// Reads LOG_LEVEL itself (not the whole validated env) so that importing a module that logs never
// requires a database URL — tools and tests import server code without one.
const base = { svc: process.env.LF_PROCESS ?? "web" };
export const log = pino({ level: process.env.LOG_LEVEL ?? "info", base });

/**
 * The closing line of every API request goes through its own buffered destination: written to
 * stdout a few kB at a time (whole lines, at most 4 kB a write, so a pipe never splits one), at
 * least once a second and before the process exits, instead of one system call per request
 * (decision 197). The same fields as every other line; other lines are written at once, so a
 * request's line can appear up to a second after lines logged later (each has its `time`).
 */
let requestLines: pino.Logger | undefined;
function requestLineLogger(): pino.Logger {
  if (!requestLines) {
    const out = pino.destination({ dest: 1, sync: true, minLength: 2048, maxWrite: 4096, periodicFlush: 1000 });
    process.once("exit", () => out.flushSync());
    requestLines = pino({ level: "info", base }, out);
  }
  return requestLines;
}

declare global {
  namespace Express {
    interface Request {
      id: string;
      log: pino.Logger;
    }
  }
}

/**
 * `req.log`: a child logger carrying the request's id, made on first use only, since most
 * requests log nothing but their closing line (decision 177).
 */
export function lazyRequestLoggers(proto: object) {
  const made = new WeakMap<object, pino.Logger>();
  Object.defineProperty(proto, "log", {
    configurable: true,
    get(this: Express.Request) {
      let l = made.get(this);
      if (!l) made.set(this, (l = log.child({ reqId: this.id })));
      return l;
    },
  });
}

/**
 * A request id (taken from X-Request-Id when a proxy set one) on every log line and job, and the
 * request's closing log line. Called first by `everyRequest` (server/http/every-request.ts).
 */
export function startRequestLog(req: Request, res: Response) {
  const incoming = req.headers["x-request-id"];
  const kept = typeof incoming === "string" && /^[\w-]{1,64}$/.test(incoming);
  req.id = kept ? incoming : randomUUID();
  if (!kept) {
    // Handlers that rebuild headers from the raw request (the tus upload endpoint, via srvx)
    // must see the same id, so the job they queue carries it.
    req.headers["x-request-id"] = req.id;
    const raw = req.rawHeaders;
    if (incoming !== undefined) for (let i = raw.length - 2; i >= 0; i -= 2) if (raw[i].toLowerCase() === "x-request-id") raw.splice(i, 2);
    raw.push("X-Request-Id", req.id);
  }
  res.setHeader("X-Request-Id", req.id);
  if (!log.isLevelEnabled("info") || !req.originalUrl.startsWith("/api")) return;
  started.set(res, performance.now());
  res.on("finish", logRequestLine);
}

const started = new WeakMap<Response, number>();
/** One listener shared by every answer (no closure per request). */
function logRequestLine(this: Response) {
  const req = this.req;
  const ms = Math.round((performance.now() - started.get(this)!) * 10) / 10;
  requestLineLogger().info({ reqId: req.id, method: req.method, path: req.originalUrl.split("?", 1)[0], status: this.statusCode, ms }, "request");
}
