import { randomUUID } from "node:crypto";
import type { RequestHandler } from "express";
import pino from "pino";

// Reads LOG_LEVEL itself (not the whole validated env) so that importing a module that logs never
// requires a database URL — tools and tests import server code without one.
export const log = pino({ level: process.env.LOG_LEVEL ?? "info", base: { svc: process.env.LF_PROCESS ?? "web" } });

declare global {
  namespace Express {
    interface Request {
      id: string;
      log: pino.Logger;
    }
  }
}

/** A request id (taken from X-Request-Id when a proxy set one) on every log line and job. */
export const requestLog: RequestHandler = (req, res, next) => {
  const incoming = req.get("x-request-id");
  req.id = incoming && /^[\w-]{1,64}$/.test(incoming) ? incoming : randomUUID();
  req.log = log.child({ reqId: req.id });
  if (incoming !== req.id) {
    // Handlers that rebuild headers from the raw request (the tus upload endpoint, via srvx)
    // must see the same id, so the job they queue carries it.
    req.headers["x-request-id"] = req.id;
    const raw = req.rawHeaders;
    for (let i = raw.length - 2; i >= 0; i -= 2) if (raw[i].toLowerCase() === "x-request-id") raw.splice(i, 2);
    raw.push("X-Request-Id", req.id);
  }
  res.setHeader("X-Request-Id", req.id);
  const t0 = process.hrtime.bigint();
  res.on("finish", () => {
    const ms = Number(process.hrtime.bigint() - t0) / 1e6;
    if (req.path.startsWith("/api")) req.log.info({ method: req.method, path: req.path, status: res.statusCode, ms: Math.round(ms * 10) / 10 }, "request");
  });
  next();
};
