// What every request passes before any route, as one middleware (decision 196). Each of these
// was its own router layer, and Express tried every layer's path against every request; a read
// of the API paid for a dozen layers that had nothing to do with it. The order and the answers
// are the ones the layers gave, and each check stays in its own module.
import type { NextFunction, Request, RequestHandler, Response } from "express";
import { startRequestLog } from "../log";
import { refuseControlCharactersInUrl } from "./request-guards";
import { SAFE_METHODS } from "./safe-methods";

/** The path Express would mount `/api` on: `/api` itself or below, letters in any case. */
const API = /^\/api(?:\/|$)/i;

export interface EveryRequestChecks {
  /** The protective headers every answer carries (server/security/headers.ts). */
  setSecurityHeaders: (res: Response) => void;
  /** Refuses a cross-site write to the API (server/security/same-origin.ts); true when it answered. */
  refuseCrossSiteWrite: (req: Request, res: Response) => boolean;
  /** The rate limiter counting this request, if any (server/security/rate-limits.ts). */
  rateLimitFor: (method: string, path: string) => RequestHandler | undefined;
  /** Refuses a write to an unpaid club's team (server/billing/read-only-guard.ts). */
  refuseWritesWhenUnpaid: (req: Request, res: Response, next: NextFunction) => Promise<void>;
}

/**
 * In order: the request id and closing log line; the security headers; for /api, a
 * percent-encoded control character (400), then a cross-site write (403); the route's rate limit
 * (429); a write to a team of a club whose payment is overdue (402). A read of the API does
 * no more than test its path once against the limits and once against `/api`.
 */
export function everyRequest(c: EveryRequestChecks): RequestHandler {
  return (req, res, next) => {
    startRequestLog(req, res);
    c.setSecurityHeaders(res);
    const path = req.path;
    const write = !SAFE_METHODS.has(req.method);
    if (API.test(path) && (refuseControlCharactersInUrl(req, res) || (write && c.refuseCrossSiteWrite(req, res)))) return;
    const afterLimit: NextFunction = write ? () => void c.refuseWritesWhenUnpaid(req, res, next).catch(next) : next;
    const limiter = c.rateLimitFor(req.method, path);
    if (!limiter) return afterLimit();
    void limiter(req, res, (err?: unknown) => (err ? next(err) : afterLimit()));
  };
}
